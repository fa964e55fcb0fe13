import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import proj4 from 'proj4';
import { fromArrayBuffer } from 'geotiff';
import type { Browser, Page } from 'playwright-core';
import { ARTIFACTS, launchBrowser, watchForeignRequests } from './browser.js';
import { finishedSweep, insideRings, openSweep, settle, upload, viewMapping, type StoredDataset, type SweepRecord } from './map-helpers.js';
import { getJson, startPageServer, type PageServer } from './page-server.js';

interface GridFile { features: { properties: { i: number; j: number; count: number; coverage: number; expected: number; kept: boolean }; geometry: { coordinates: number[][][] } }[] }

// The stability surface and the placement-stable areas on the page's map (issue 17): for data in planar metres, an
// EPSG code and longitude/latitude, the drawn excess share agrees pixel by pixel with stability-<side>m.tif read by
// the registry library geotiff (an independent reader); the areas' readout; toggles, pan, zoom, hover and the PNG
// export with the surface's legend.
const PLAN = { placements: 6, rotation: false, design: 'halton', minCoverage: 0.5, alpha: 0.05, sims: 39, seed: 7, cells: [200] };

/** 360 points spread over a 2 km square and 160 in a 120 m cluster near (1400, 1300), seeded. */
function clusteredPattern(): [number, number][] {
  let seed = 2024;
  const random = () => {
    seed = (seed * 1103515245 + 12345) % 2147483648;
    return seed / 2147483648;
  };
  const points: [number, number][] = [];
  for (let k = 0; k < 360; k += 1) points.push([random() * 2000, random() * 2000]);
  for (let k = 0; k < 160; k += 1) points.push([1400 + (random() - 0.5) * 120, 1300 + (random() - 0.5) * 120]);
  return points;
}

const UTM33 = '+proj=utm +zone=33 +datum=WGS84 +units=m +no_defs';

interface Surface { x0: number; y0: number; side: number; width: number; height: number; excess: Float32Array }

async function readTif(server: PageServer, sweepId: string, name: string): Promise<Surface> {
  const response = await fetch(`${server.origin}/api/sweeps/${sweepId}/${name}`);
  expect(response.status).toBe(200);
  const image = await (await fromArrayBuffer(await response.arrayBuffer())).getImage();
  const [x0, y0] = image.getOrigin();
  const [side] = image.getResolution();
  const [excess] = (await image.readRasters()) as unknown as Float32Array[];
  return { x0, y0, side, width: image.getWidth(), height: image.getHeight(), excess };
}

/** Alpha of the excess-surface canvas at CSS pixels (px, py) of the map, for many pixels at once. */
async function surfaceAlpha(page: Page, pixels: [number, number][]): Promise<number[]> {
  return page.$eval('#map', (element, list) => {
    const canvas = element.querySelector<HTMLCanvasElement>('canvas[data-layer="surface-excess"]');
    if (!canvas) return list.map(() => -1);
    const ratio = canvas.width / canvas.getBoundingClientRect().width;
    const { data, width } = canvas.getContext('2d')!.getImageData(0, 0, canvas.width, canvas.height);
    return list.map(([px, py]) => data[4 * (Math.floor(py * ratio) * width + Math.floor(px * ratio)) + 3]);
  }, pixels);
}

describe('the stability surface and areas on the map', () => {
  let server: PageServer;
  let browser: Browser;
  let page: Page;
  let foreign: string[];
  const errors: string[] = [];
  const cases: { label: string; dataset: StoredDataset; sweep: SweepRecord }[] = [];

  beforeAll(async () => {
    server = await startPageServer();
    browser = await launchBrowser();
    const context = await browser.newContext({ viewport: { width: 1280, height: 900 }, acceptDownloads: true });
    page = await context.newPage();
    page.on('pageerror', (error) => errors.push(error.message));
    page.on('console', (message) => { if (message.type() === 'error') errors.push(message.text()); });
    foreign = watchForeignRequests(page, server.origin);
    const planar = clusteredPattern();
    // the same pattern placed near 50.1 N 14.4 E: UTM zone 33 metres and, through proj4, longitude/latitude
    const utm = planar.map(([x, y]) => [x + 458_000, y + 5_548_000]);
    const lonLat = utm.map(([x, y]) => proj4(UTM33, 'EPSG:4326', [x, y]));
    const csv = (rows: number[][]) => `id,x,y\n${rows.map(([x, y], k) => `${k + 1},${x},${y}`).join('\n')}\n`;
    for (const [label, rows, crs] of [['planar', planar, 'planar'], ['EPSG', utm, 'EPSG:32633'], ['lonlat', lonLat, 'EPSG:4326']] as const) {
      const dataset = await upload(server, `Surface check ${label}`, csv(rows as number[][]), crs);
      cases.push({ label, dataset, sweep: await finishedSweep(server, dataset.id, PLAN) });
    }
  }, 300_000);

  afterAll(async () => {
    await browser?.close();
    await server?.close();
  });

  it('draws the excess share where the GeoTIFF says, for planar, EPSG and longitude/latitude data', async () => {
    for (const { label, dataset, sweep } of cases) {
      const entry = sweep.summary!.stability![0];
      await openSweep(page, server, dataset, sweep.id);
      await page.waitForSelector('#layer-toggle-surface-excess');
      // the surfaces start off; the areas on
      expect(await page.isChecked('#layer-toggle-surface-excess')).toBe(false);
      expect(await page.isChecked('#layer-toggle-stable-areas')).toBe(true);
      expect(await page.innerText('.map-layer-group legend')).toContain('200 m');
      // the privacy caution covers the surface, beside the map and in the page's cautions
      expect(await page.innerText('#map-privacy')).toContain('A fine stability surface can single out households');
      expect(await page.innerText('#cautions-list')).toContain('A fine stability surface can single out households');
      await page.check('#layer-toggle-surface-excess');
      await settle(page);
      const legend = await page.innerText('#map-legend');
      expect(legend).toContain('excess share');
      expect(legend).toMatch(/Excess share, 0 to 1: the fraction of the 6 placements/);
      const tif = await readTif(server, sweep.id, entry.files.tif);
      const mapping = await viewMapping(page);
      const box = (await page.locator('#map').boundingBox())!;
      const pixels: [number, number][] = [];
      const expected: number[] = [];
      for (let py = 20; py < box.height - 20; py += 3) {
        for (let px = 20; px < box.width - 20; px += 3) {
          const x = mapping.x0 + (px + 0.5) * mapping.resolution;
          const y = mapping.y0 - (py + 0.5) * mapping.resolution;
          const col = (x - tif.x0) / tif.side;
          const row = (tif.y0 - y) / tif.side;
          // skip screen pixels within 1 px of a raster pixel's edge (either neighbour may be drawn there)
          const margin = mapping.resolution / tif.side;
          if (Math.abs(col - Math.round(col)) < margin || Math.abs(row - Math.round(row)) < margin) continue;
          const inside = col >= 0 && row >= 0 && col < tif.width && row < tif.height;
          const share = inside ? tif.excess[Math.floor(row) * tif.width + Math.floor(col)] : Number.NaN;
          pixels.push([px, py]);
          expected.push(share > 0 ? 1 : 0);
        }
      }
      const alpha = await surfaceAlpha(page, pixels);
      const drawn = alpha.map((value) => (value > 0 ? 1 : 0));
      const mismatches = drawn.filter((value, k) => value !== expected[k]).length;
      const positives = expected.filter((value) => value === 1).length;
      console.log(`surface check ${label}: ${pixels.length} screen pixels compared, ${positives} with an excess share > 0, ${mismatches} disagree`);
      expect(positives, label).toBeGreaterThan(20);
      expect(mismatches, label).toBe(0);

      // the planted cluster is a stable excess area; the readout names it under the pointer
      const area = entry.areas.find((candidate) => candidate.kind === 'excess');
      expect(area, label).toBeDefined();
      const xs = area!.rings[0].map(([x]) => x);
      const ys = area!.rings[0].map(([, y]) => y);
      let spot: [number, number] | null = null;
      for (let t = 1; t < 20 && spot === null; t += 1) {
        for (let s = 1; s < 20 && spot === null; s += 1) {
          const x = Math.min(...xs) + ((Math.max(...xs) - Math.min(...xs)) * s) / 20;
          const y = Math.min(...ys) + ((Math.max(...ys) - Math.min(...ys)) * t) / 20;
          if (insideRings(area!.rings, x, y)) spot = [x, y];
        }
      }
      expect(spot, label).not.toBeNull();
      await page.mouse.move(box.x + (spot![0] - mapping.x0) / mapping.resolution, box.y + (mapping.y0 - spot![1]) / mapping.resolution);
      await expect.poll(() => page.innerText('#map-cell-info')).toContain('stable area');
      const stable = await page.innerText('#map-cell-info dd[data-field="stable area"]');
      expect(stable).toContain('excess');
      expect(stable).toContain(`${area!.areaKm2.toPrecision(3).replace(/0+$/, '').replace(/\.$/, '')} km²`);
      expect(await page.innerText('#map-cell-info dd[data-field="excess share here"]')).toMatch(/^[\d.]+ of 6 placements$/);
      await page.locator('.map-panel').screenshot({ path: join(ARTIFACTS, `map-surface-${label}.png`) });
    }
  });

  it('toggles the surface and the areas, pans, zooms, and exports the view with the surface legend', async () => {
    const { sweep } = cases[2];
    const entry = sweep.summary!.stability![0];
    expect(entry.areas.length).toBeGreaterThan(0);
    // areas off: the readout no longer names one; surface off: the canvas is empty
    await page.uncheck('#layer-toggle-stable-areas');
    await expect.poll(() => page.innerText('#map-legend')).not.toContain('stable excess area');
    const box = (await page.locator('#map').boundingBox())!;
    await page.mouse.move(box.x + 10, box.y + 10);
    await page.mouse.move(box.x + box.width / 2, box.y + box.height / 2);
    expect(await page.innerText('#map-cell-info')).not.toContain('stable area');
    await page.check('#layer-toggle-stable-areas');
    await page.uncheck('#layer-toggle-surface-excess');
    await expect.poll(async () => (await surfaceAlpha(page, [[box.width / 2, box.height / 2]]))[0]).toBeLessThanOrEqual(0);
    await page.check('#layer-toggle-surface-excess');
    // pan by dragging and zoom by the button: the surface stays drawn
    const before = await viewMapping(page);
    await page.mouse.move(box.x + 200, box.y + 200);
    await page.mouse.down();
    await page.mouse.move(box.x + 203, box.y + 200);
    await page.mouse.move(box.x + 263, box.y + 230, { steps: 6 });
    await page.mouse.up();
    await settle(page);
    const dragged = await viewMapping(page);
    expect(Math.abs((before.x0 - dragged.x0) / before.resolution - 60)).toBeLessThan(1.5);
    await page.click('#map .ol-zoom-in');
    await settle(page);
    expect((await viewMapping(page)).resolution / dragged.resolution).toBeCloseTo(0.5, 2);
    await page.click('#map .ol-zoom-extent button');
    await settle(page);

    // the grid of the reference placement: the cell with the most points (the planted cluster) is an excess cell by
    // the engine's per-cell test, a cell whose count is near its expected count is neither
    const size = sweep.summary!.sizes[0];
    await page.click('#pick-reference');
    await page.waitForFunction(() => Number(document.getElementById('map')!.dataset.gridCells) > 0);
    await settle(page);
    const grid = await getJson<GridFile>(server, `/api/sweeps/${sweep.id}/grid.geojson?size=${size.sizeIndex}&placement=${size.reference.placementIndex}&coordinates=planar`);
    const kept = grid.features.filter((feature) => feature.properties.kept && feature.properties.coverage === 1);
    const busiest = kept.reduce((best, feature) => (feature.properties.count > best.properties.count ? feature : best));
    const ordinary = kept.reduce((best, feature) => (Math.abs(feature.properties.count - feature.properties.expected) < Math.abs(best.properties.count - best.properties.expected) ? feature : best));
    const mapping = await viewMapping(page);
    for (const [feature, verdict] of [[busiest, /^excess cell \(one-sided Poisson test, Benjamini-Hochberg at alpha 0.05/], [ordinary, /^neither/]] as const) {
      const ring = feature.geometry.coordinates[0].slice(0, -1);
      const cx = ring.reduce((sum, [x]) => sum + x, 0) / ring.length;
      const cy = ring.reduce((sum, [, y]) => sum + y, 0) / ring.length;
      await page.mouse.move(box.x + (cx - mapping.x0) / mapping.resolution, box.y + (mapping.y0 - cy) / mapping.resolution);
      await expect.poll(() => page.getAttribute('#map-cell-info', 'data-cell')).toBe(`${feature.properties.i},${feature.properties.j}`);
      expect(await page.innerText('#map-cell-info dd[data-field="stability verdict of the cell"]')).toMatch(verdict);
      expect(await page.innerText('#map-cell-info dd[data-field="count"]')).toBe(String(feature.properties.count));
    }

    const mapHeight = await page.$eval('#map', (element) => element.clientHeight);
    /** Exports the view; returns the PNG and the number of pixels in its band below the map on the white-to-vermillion ramp. */
    const exportView = async () => {
      const [download] = await Promise.all([page.waitForEvent('download'), page.click('#map-export')]);
      const bytes = readFileSync((await download.path())!);
      expect([...bytes.subarray(0, 8)]).toEqual([137, 80, 78, 71, 13, 10, 26, 10]);
      const rampPixels = await page.evaluate(async ({ base64, height }) => {
        const element = new Image();
        element.src = `data:image/png;base64,${base64}`;
        await element.decode();
        const canvas = document.createElement('canvas');
        canvas.width = element.width;
        canvas.height = element.height;
        const context = canvas.getContext('2d')!;
        context.drawImage(element, 0, 0);
        const top = Math.round(height * (window.devicePixelRatio || 1));
        const { data } = context.getImageData(0, top, canvas.width, canvas.height - top);
        // white + t (#D55E00 - white), t in [0.2, 0.8], every channel within 4
        let count = 0;
        for (let offset = 0; offset < data.length; offset += 4) {
          const t = (255 - data[offset + 1]) / (255 - 94);
          if (t < 0.2 || t > 0.8) continue;
          if (Math.abs(data[offset] - (255 - t * 42)) <= 4 && Math.abs(data[offset + 2] - (255 - t * 255)) <= 4) count += 1;
        }
        return count;
      }, { base64: bytes.toString('base64'), height: mapHeight });
      return { download, rampPixels };
    };
    // the band below the map carries the surface's ramp (white to vermillion, #D55E00) while the surface is on
    const withSurface = await exportView();
    await page.uncheck('#layer-toggle-surface-excess');
    const without = await exportView();
    await page.check('#layer-toggle-surface-excess');
    console.log(`ramp pixels in the PNG band: ${withSurface.rampPixels} with the surface on, ${without.rampPixels} off`);
    expect(withSurface.rampPixels - without.rampPixels).toBeGreaterThan(150);
    const download = withSurface.download;
    await download.saveAs(join(ARTIFACTS, 'map-export-surface.png'));
  });

  it('made no request outside the local server and raised no script error', () => {
    expect(foreign).toEqual([]);
    expect(errors).toEqual([]);
  });
}, 600_000);
