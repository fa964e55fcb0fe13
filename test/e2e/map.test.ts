import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import proj4 from 'proj4';
import type { Browser, Page } from 'playwright-core';
import { formatNumber } from '../../shared/format.js';
import { downloadName } from '../../shared/messages/download-names.js';
import { ARTIFACTS, canvasShares, launchBrowser, watchForeignRequests } from './browser.js';
import { getJson, startPageServer, type PageServer } from './page-server.js';

// The map (issue 17, "The map"; hexagons from issue 16) in headless Chromium against the real server: pan, zoom,
// layer switches, the cell under the pointer against the grid GeoJSON, the PNG export of the view, a hexagon grid,
// data in planar metres, an EPSG code and longitude/latitude drawn where they belong, 1e5 points and 1e5 cells, and
// no request outside the local server.
interface StoredDataset { id: string; name: string; n: number; sample?: string | null }
interface SweepRecord { id: string; status: string; summary: { sizes: { sizeIndex: number; cellSize: number; shape?: string; reference: { placementIndex: number } }[] } | null }
interface GridFile { features: { properties: { i: number; j: number; count: number; coverage: number; expected: number; kept: boolean }; geometry: { coordinates: number[][][] } }[] }

const PLAN = { placements: 4, rotation: false, design: 'halton', minCoverage: 0.5, alpha: 0.05, sims: 0, seed: 1 };

async function postJson<T>(server: PageServer, path: string, body: unknown): Promise<T> {
  const response = await fetch(`${server.origin}${path}`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify(body) });
  if (!response.ok) throw new Error(`POST ${path}: ${response.status} ${await response.text()}`);
  return (await response.json()) as T;
}

async function upload(server: PageServer, name: string, csv: string, crs: string): Promise<StoredDataset> {
  const form = new FormData();
  form.append('points', new Blob([csv], { type: 'text/csv' }), `${name}.csv`);
  form.append('crs', crs);
  form.append('name', name);
  const response = await fetch(`${server.origin}/api/datasets`, { method: 'POST', body: form });
  if (!response.ok) throw new Error(`upload ${name}: ${response.status} ${await response.text()}`);
  return (await response.json()) as StoredDataset;
}

async function finishedSweep(server: PageServer, datasetId: string, plan: Record<string, unknown>): Promise<SweepRecord> {
  const { id } = await postJson<{ id: string }>(server, '/api/sweeps', { datasetId, plan });
  for (let attempt = 0; attempt < 600; attempt += 1) {
    const record = await getJson<SweepRecord>(server, `/api/sweeps/${id}`);
    if (record.status === 'done') return record;
    if (record.status === 'failed' || record.status === 'cancelled') throw new Error(`sweep ${id} ${record.status}`);
    await new Promise((resolve) => setTimeout(resolve, 200));
  }
  throw new Error(`sweep ${id} did not finish`);
}

interface Probe { x: number; y: number; lon: number | null; lat: number | null }

/** Moves the mouse to (px, py) inside the map and reads the coordinates the page reports there. */
async function probe(page: Page, px: number, py: number): Promise<Probe> {
  const box = (await page.locator('#map').boundingBox())!;
  await page.mouse.move(box.x + px, box.y + py);
  const text = await page.innerText('#map-pointer');
  const match = /x (-?[\d.]+) m, y (-?[\d.]+) m(?: \(longitude (-?[\d.]+), latitude (-?[\d.]+)\))?/.exec(text);
  if (!match) throw new Error(`no coordinates under the pointer: ${JSON.stringify(text)}`);
  return { x: Number(match[1]), y: Number(match[2]), lon: match[3] ? Number(match[3]) : null, lat: match[4] ? Number(match[4]) : null };
}

/** The view's mapping from map pixels to working coordinates, read from two probes: metres per pixel and the origin. */
async function viewMapping(page: Page): Promise<{ resolution: number; x0: number; y0: number }> {
  const a = await probe(page, 100, 100);
  const b = await probe(page, 300, 300);
  const resolution = (b.x - a.x) / 200;
  // north up, square pixels: y falls as the pixel row grows, at the same rate
  expect((a.y - b.y) / 200).toBeCloseTo(resolution, 2);
  return { resolution, x0: a.x - 100 * resolution, y0: a.y + 100 * resolution };
}

/** Waits until the view stops moving (zoom and pan animations take 250 ms). */
async function settle(page: Page): Promise<void> {
  let previous = '';
  for (let attempt = 0; attempt < 40; attempt += 1) {
    await page.waitForTimeout(150);
    const now = await page.innerText('#map .ol-scale-bar').catch(() => '');
    const frame = await page.getAttribute('#map', 'data-frame-ms');
    if (`${now}|${frame}` === previous) return;
    previous = `${now}|${frame}`;
  }
}

async function openSweep(page: Page, server: PageServer, dataset: StoredDataset, sweepId: string): Promise<void> {
  await page.goto(`${server.origin}/`);
  await page.waitForSelector(`#dataset-select option[value="${dataset.id}"]`, { state: 'attached' });
  await page.selectOption('#dataset-select', dataset.id);
  await page.click('#use-dataset');
  await page.waitForSelector('[data-testid=dataset-summary]');
  await page.click(`[data-open-sweep="${sweepId}"]`);
  await page.waitForSelector('#pick-reference');
}

/** A kept cell with points whose centre lies well inside the view, and that centre's pixel. */
function cellInView(grid: GridFile, mapping: { resolution: number; x0: number; y0: number }, width: number, height: number) {
  for (const feature of grid.features) {
    if (!feature.properties.kept || feature.properties.count === 0) continue;
    const ring = feature.geometry.coordinates[0].slice(0, -1);
    const cx = ring.reduce((sum, [x]) => sum + x, 0) / ring.length;
    const cy = ring.reduce((sum, [, y]) => sum + y, 0) / ring.length;
    const px = (cx - mapping.x0) / mapping.resolution;
    const py = (mapping.y0 - cy) / mapping.resolution;
    if (px > 60 && py > 60 && px < width - 60 && py < height - 60) return { feature, px, py };
  }
  throw new Error('no kept cell with points in the view');
}

describe('the map in Chromium', () => {
  let server: PageServer;
  let browser: Browser;
  let page: Page;
  let foreign: string[];
  const errors: string[] = [];
  let demo: StoredDataset;
  let squares: SweepRecord;
  let hexagons: SweepRecord;

  beforeAll(async () => {
    server = await startPageServer();
    browser = await launchBrowser();
    const context = await browser.newContext({ viewport: { width: 1280, height: 900 }, acceptDownloads: true });
    page = await context.newPage();
    page.on('pageerror', (error) => errors.push(error.message));
    page.on('console', (message) => { if (message.type() === 'error') errors.push(message.text()); });
    foreign = watchForeignRequests(page, server.origin);
    demo = (await getJson<StoredDataset[]>(server, '/api/datasets')).find((dataset) => dataset.sample)!;
    squares = await finishedSweep(server, demo.id, { ...PLAN, perCell: [2] });
    hexagons = await finishedSweep(server, demo.id, { ...PLAN, perCell: [2], shape: 'hex' });
  }, 120_000);

  afterAll(async () => {
    await browser?.close();
    await server?.close();
  });

  it('draws the dataset with a scale bar and a switch per layer', async () => {
    await openSweep(page, server, demo, squares.id);
    const toggles = await page.$$eval('.map-layers input[type=checkbox]', (boxes) => boxes.map((box) => [box.id, (box as HTMLInputElement).checked, document.querySelector(`label[for="${box.id}"]`)?.textContent?.trim()]));
    expect(toggles).toEqual([
      ['layer-toggle-points', true, 'Points'],
      ['layer-toggle-study-area', true, 'Study area'],
      ['layer-toggle-no-data', true, 'No-data zones'],
      ['layer-toggle-grid', true, 'Grid of the chosen placement'],
    ]);
    expect(await page.innerText('#map .ol-scale-bar')).toMatch(/\d+ (m|km)/);
    expect((await canvasShares(page, '#map')).ink).toBeGreaterThan(0.02);
    // the privacy caution stays beside the map
    expect(await page.innerText('#map-privacy')).toContain('single out');
    // every map control can be reached by keyboard and has a name
    const controls = await page.$$eval('#map button', (buttons) => buttons.map((button) => button.getAttribute('aria-label') ?? button.getAttribute('title') ?? ''));
    expect(controls.length).toBeGreaterThanOrEqual(3);
    expect(controls.every((name) => name.length > 0)).toBe(true);
  });

  it('pans by dragging and by the arrow keys, and zooms by the button and the - key', async () => {
    const before = await viewMapping(page);
    const box = (await page.locator('#map').boundingBox())!;
    await page.mouse.move(box.x + 200, box.y + 200);
    await page.mouse.down();
    // the first move beyond the library's tolerance (1 px) starts the drag and does not move the view
    await page.mouse.move(box.x + 203, box.y + 200);
    await page.mouse.move(box.x + 263, box.y + 230, { steps: 6 });
    await page.mouse.up();
    await settle(page);
    const dragged = await viewMapping(page);
    // content moved right 60 px and down 30 px: the coordinate under a fixed pixel moved the other way
    // readings carry 0.01 m: resolutions agree to about 1e-4 relative
    expect(dragged.resolution / before.resolution).toBeCloseTo(1, 3);
    expect(Math.abs((before.x0 - dragged.x0) / before.resolution - 60)).toBeLessThan(1.5);
    expect(Math.abs((dragged.y0 - before.y0) / before.resolution - 30)).toBeLessThan(1.5);
    await page.focus('#map');
    await page.keyboard.press('ArrowLeft');
    await settle(page);
    const keyed = await viewMapping(page);
    expect(keyed.x0).toBeLessThan(dragged.x0);
    const scaleBefore = await page.innerText('#map .ol-scale-bar');
    await page.click('#map .ol-zoom-in');
    await settle(page);
    const zoomed = await viewMapping(page);
    expect(zoomed.resolution / keyed.resolution).toBeCloseTo(0.5, 2);
    expect(await page.innerText('#map .ol-scale-bar')).not.toBe(scaleBefore);
    await page.focus('#map');
    await page.keyboard.press('-');
    await settle(page);
    expect((await viewMapping(page)).resolution / zoomed.resolution).toBeCloseTo(2, 2);
    await page.click('#map .ol-zoom-extent button');
    await settle(page);
  });

  it('shows the chosen grid, switches layers off and on, and reads a hovered cell like the grid GeoJSON', async () => {
    const size = squares.summary!.sizes[0];
    await page.click('#pick-reference');
    await page.waitForFunction(() => Number(document.getElementById('map')!.dataset.gridCells) > 0);
    await settle(page);
    expect(await page.getAttribute('#map', 'data-grid-shape')).toBe('square');
    expect(await page.$$eval('.map-layers input', (boxes) => boxes.length)).toBe(4);
    const shaded = (await canvasShares(page, '#map')).colour;
    expect(shaded).toBeGreaterThan(0.1);
    await page.uncheck('#layer-toggle-grid');
    await expect.poll(async () => (await canvasShares(page, '#map')).colour).toBeLessThan(0.01);
    expect(await page.innerText('#map-legend')).not.toContain('cell left out');
    const withPoints = (await canvasShares(page, '#map')).dark;
    expect(withPoints).toBeGreaterThan(0.001);
    await page.uncheck('#layer-toggle-points');
    await expect.poll(async () => (await canvasShares(page, '#map')).dark).toBeLessThan(withPoints / 4);
    await page.check('#layer-toggle-points');
    await page.check('#layer-toggle-grid');
    await expect.poll(async () => (await canvasShares(page, '#map')).colour).toBeGreaterThan(0.1);
    expect(await page.innerText('#map-legend')).toContain('cell left out');

    const grid = await getJson<GridFile>(server, `/api/sweeps/${squares.id}/grid.geojson?size=${size.sizeIndex}&placement=${size.reference.placementIndex}&coordinates=planar`);
    expect(Number(await page.getAttribute('#map', 'data-grid-cells'))).toBe(grid.features.length);
    const mapBox = (await page.locator('#map').boundingBox())!;
    const { feature, px, py } = cellInView(grid, await viewMapping(page), mapBox.width, mapBox.height);
    await page.mouse.move(mapBox.x + px, mapBox.y + py);
    await expect.poll(() => page.getAttribute('#map-cell-info', 'data-cell')).toBe(`${feature.properties.i},${feature.properties.j}`);
    const read = async (name: string) => page.innerText(`#map-cell-info dd[data-field="${name}"]`);
    const { count, coverage, expected } = feature.properties;
    expect(await read('count')).toBe(String(count));
    expect(await read('coverage')).toBe(formatNumber(coverage, 4));
    expect(await read('expected count')).toBe(formatNumber(expected));
    // Pearson residual (O - E) / sqrt(E) (Agresti 2002, Categorical Data Analysis, 3.3.1)
    expect(await read('residual (O - E) / sqrt(E)')).toBe(formatNumber((count - expected) / Math.sqrt(expected)));
    expect(await read('verdict of the placement')).toMatch(/clustered|regular|no departure/);
    // by keyboard: Enter on the focused map reads the view's centre
    const mapping = await viewMapping(page);
    const size2 = await page.$eval('#map', (element) => ({ width: element.clientWidth, height: element.clientHeight }));
    await page.focus('#map');
    await page.keyboard.press('Enter');
    const centre = /x (-?[\d.]+) m, y (-?[\d.]+) m/.exec(await page.innerText('#map-pointer'))!;
    expect(Math.abs(Number(centre[1]) - (mapping.x0 + (size2.width / 2) * mapping.resolution)) / mapping.resolution).toBeLessThan(2);
    expect(Math.abs(Number(centre[2]) - (mapping.y0 - (size2.height / 2) * mapping.resolution)) / mapping.resolution).toBeLessThan(2);
    await page.locator('.map-panel').screenshot({ path: join(ARTIFACTS, 'map-hover-cell.png') });
  });

  it('exports the view as a PNG with the legend and scale bar below and beside it', async () => {
    const size = squares.summary!.sizes[0];
    const [download] = await Promise.all([page.waitForEvent('download'), page.click('#map-export')]);
    // the project's download names: dataset, cell side, what (server/messages/download-names.ts)
    expect(download.suggestedFilename()).toMatch(/^gridshake-[a-z0-9-]+-[\d.]+m-map-placement-\d+\.png$/);
    expect(download.suggestedFilename()).toBe(downloadName(demo.name, [size.cellSize], `map-placement-${size.reference.placementIndex}`, 'png'));
    const bytes = readFileSync((await download.path())!);
    // PNG signature (ISO/IEC 15948:2004, 5.2)
    expect([...bytes.subarray(0, 8)]).toEqual([137, 80, 78, 71, 13, 10, 26, 10]);
    expect(bytes.length).toBeGreaterThan(20_000);
    const inner = await page.$eval('#map', (element) => ({ width: element.clientWidth, height: element.clientHeight }));
    const image = await page.evaluate(async (base64) => {
      const element = new Image();
      element.src = `data:image/png;base64,${base64}`;
      await element.decode();
      const canvas = document.createElement('canvas');
      canvas.width = element.width;
      canvas.height = element.height;
      const context = canvas.getContext('2d')!;
      context.drawImage(element, 0, 0);
      const { data } = context.getImageData(0, 0, canvas.width, canvas.height);
      let coloured = 0;
      for (let offset = 0; offset < data.length; offset += 4) if (Math.max(data[offset], data[offset + 1], data[offset + 2]) - Math.min(data[offset], data[offset + 1], data[offset + 2]) > 60) coloured += 1;
      return { width: element.width, height: element.height, coloured: coloured / (data.length / 4), corner: Array.from(context.getImageData(1, canvas.height - 2, 1, 1).data) };
    }, bytes.toString('base64'));
    const ratio = await page.evaluate(() => window.devicePixelRatio);
    expect(image.width).toBe(Math.round(inner.width * ratio));
    // the band below the map holds the title, the legend and the privacy note
    expect(image.height).toBeGreaterThan(Math.round(inner.height * ratio) + 40);
    expect(image.coloured).toBeGreaterThan(0.05);
    expect(image.corner).toEqual([255, 255, 255, 255]);
    await download.saveAs(join(ARTIFACTS, 'map-export.png'));
  });

  it('draws hexagons when the sweep has hexagonal cells, and reads them like the grid GeoJSON', async () => {
    const size = hexagons.summary!.sizes[0];
    expect(size.shape).toBe('hex');
    await openSweep(page, server, demo, hexagons.id);
    await page.click('#pick-reference');
    await page.waitForFunction(() => document.getElementById('map')!.dataset.gridShape === 'hex');
    await settle(page);
    const grid = await getJson<GridFile>(server, `/api/sweeps/${hexagons.id}/grid.geojson?size=${size.sizeIndex}&placement=${size.reference.placementIndex}&coordinates=planar`);
    expect(grid.features.every((feature) => feature.geometry.coordinates[0].length === 7)).toBe(true);
    expect(Number(await page.getAttribute('#map', 'data-grid-cells'))).toBe(grid.features.length);
    expect(await page.innerText('#map-caption')).toContain('(hexagons)');
    expect((await canvasShares(page, '#map')).colour).toBeGreaterThan(0.1);
    const mapBox = (await page.locator('#map').boundingBox())!;
    const { feature, px, py } = cellInView(grid, await viewMapping(page), mapBox.width, mapBox.height);
    await page.mouse.move(mapBox.x + px, mapBox.y + py);
    await expect.poll(() => page.getAttribute('#map-cell-info', 'data-cell')).toBe(`${feature.properties.i},${feature.properties.j}`);
    expect(await page.innerText('#map-cell-info dd[data-field="count"]')).toBe(String(feature.properties.count));
    // a hexagon's own corner: between two cells' centres the reading changes at the hexagon's side, not a square's
    await page.locator('.map-panel').screenshot({ path: join(ARTIFACTS, 'map-hexagons.png') });
  });

  it('draws planar, EPSG and longitude/latitude data where they belong', async () => {
    // the same three places given three ways; proj4 (a general-purpose reference library) converts them
    const lonLat: [number, number][] = [[14.41, 50.07], [14.46, 50.09], [14.43, 50.12], [14.39, 50.10], [14.45, 50.06]];
    const utm = lonLat.map(([lon, lat]) => proj4('EPSG:4326', '+proj=utm +zone=33 +datum=WGS84 +units=m +no_defs', [lon, lat]));
    const csv = (rows: number[][]) => `id,x,y\n${rows.map(([x, y], k) => `${k + 1},${x},${y}`).join('\n')}\n`;
    const cases = [
      { name: 'Map check planar', csv: csv(utm.map(([x, y]) => [x - 400000, y - 5500000])), crs: 'planar', expectLonLat: false },
      { name: 'Map check EPSG', csv: csv(utm), crs: 'EPSG:32633', expectLonLat: true },
      { name: 'Map check lonlat', csv: csv(lonLat), crs: 'EPSG:4326', expectLonLat: true },
    ];
    for (const entry of cases) {
      const dataset = await upload(server, entry.name, entry.csv, entry.crs);
      await page.goto(`${server.origin}/`);
      await page.waitForSelector(`#dataset-select option[value="${dataset.id}"]`, { state: 'attached' });
      await page.selectOption('#dataset-select', dataset.id);
      await page.click('#use-dataset');
      await page.waitForSelector('[data-testid=dataset-summary]');
      await page.uncheck('#layer-toggle-study-area');
      await settle(page);
      // find the drawn points' pixels (only the points layer is on), and read the coordinates there
      const marks = await page.$$eval('#map', ([element]) => {
        const box = element.getBoundingClientRect();
        const ratio = window.devicePixelRatio || 1;
        const found: [number, number][] = [];
        for (const canvas of Array.from(element.querySelectorAll('canvas'))) {
          const context = canvas.getContext('2d');
          if (!context || canvas.width === 0) continue;
          const inner = canvas.getBoundingClientRect();
          const { data, width, height } = context.getImageData(0, 0, canvas.width, canvas.height);
          const seen = new Set<string>();
          for (let y = 0; y < height; y += 1) {
            for (let x = 0; x < width; x += 1) {
              const offset = 4 * (y * width + x);
              if (data[offset + 3] < 200 || data[offset] > 80) continue;
              const px = inner.left - box.left + x / ratio;
              const py = inner.top - box.top + y / ratio;
              const key = `${Math.round(px / 8)},${Math.round(py / 8)}`;
              if (seen.has(key)) continue;
              seen.add(key);
              found.push([px, py]);
            }
          }
        }
        return found;
      });
      expect(marks.length, entry.name).toBeGreaterThanOrEqual(5);
      const mapping = await viewMapping(page);
      for (const [px, py] of marks.slice(0, 5)) {
        const read = await probe(page, px, py);
        const tolerance = 4 * mapping.resolution;
        if (entry.expectLonLat) {
          expect(read.lon, entry.name).not.toBeNull();
          // the nearest input place is within a few pixels of where the point was drawn
          const [lonM, latM] = [read.lon!, read.lat!];
          const nearest = Math.min(...lonLat.map(([lon, lat]) => Math.hypot((lon - lonM) * 111_320 * Math.cos((lat * Math.PI) / 180), (lat - latM) * 110_574)));
          expect(nearest, entry.name).toBeLessThan(tolerance + 1);
        } else {
          expect(read.lon, entry.name).toBeNull();
          const nearest = Math.min(...utm.map(([x, y]) => Math.hypot(x - 400000 - read.x, y - 5500000 - read.y)));
          expect(nearest, entry.name).toBeLessThan(tolerance);
        }
      }
    }
  });

  it('stays responsive with 1e5 points and 1e5 cells (figures printed)', async () => {
    // a seeded pattern of 1e5 points in a 10 km square; cells of 31.6 m give about 1e5 cells
    let seed = 12345;
    const random = () => {
      seed = (seed * 1103515245 + 12345) % 2147483648;
      return seed / 2147483648;
    };
    const rows: string[] = ['id,x,y'];
    for (let k = 0; k < 100_000; k += 1) rows.push(`${k + 1},${(random() * 10_000).toFixed(2)},${(random() * 10_000).toFixed(2)}`);
    const dataset = await upload(server, 'Map load check', `${rows.join('\n')}\n`, 'planar');
    const sweep = await finishedSweep(server, dataset.id, { ...PLAN, placements: 1, cells: [31.6] });
    const loadStart = Date.now();
    await openSweep(page, server, dataset, sweep.id);
    const datasetMs = Date.now() - loadStart;
    const gridStart = Date.now();
    await page.click('#pick-reference');
    await page.waitForFunction(() => Number(document.getElementById('map')!.dataset.gridCells) > 90_000, undefined, { timeout: 60_000 });
    await settle(page);
    const gridMs = Date.now() - gridStart;
    const cells = Number(await page.getAttribute('#map', 'data-grid-cells'));
    // frames while zooming in and out and panning: the page's own measure of each frame's drawing time
    const frames: number[] = [];
    const box = (await page.locator('#map').boundingBox())!;
    for (const action of ['in', 'out', 'pan', 'pan', 'in', 'pan']) {
      if (action === 'pan') {
        await page.mouse.move(box.x + 200, box.y + 200);
        await page.mouse.down();
        await page.mouse.move(box.x + 240, box.y + 220, { steps: 4 });
        await page.mouse.up();
      } else await page.click(`#map .ol-zoom-${action}`);
      await settle(page);
      frames.push(Number(await page.getAttribute('#map', 'data-frame-ms')));
    }
    const worst = Math.max(...frames);
    console.log(`map load check: ${100_000} points, ${cells} cells; dataset shown in ${datasetMs} ms, grid fetched and drawn in ${gridMs} ms; frame times ${frames.map((ms) => ms.toFixed(0)).join(', ')} ms (worst ${worst.toFixed(0)} ms)`);
    expect(cells).toBeGreaterThan(90_000);
    expect(frames.every((ms) => Number.isFinite(ms) && ms > 0)).toBe(true);
    // the compact grid (grid-frame, the page builds the polygons): aimed at well under 2 s; bounded generously here
    // because the machine is shared (the 30 MB GeoJSON took 5 to 11 s), frames stay under a second
    expect(gridMs).toBeLessThan(5000);
    expect(worst).toBeLessThan(1000);
    // drawn: shading over most of the view
    expect((await canvasShares(page, '#map')).colour).toBeGreaterThan(0.3);
  }, 180_000);

  it('made no request outside the local server and raised no script error', () => {
    expect(foreign).toEqual([]);
    expect(errors).toEqual([]);
  });
}, 400_000);
