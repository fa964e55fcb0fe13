import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Browser, Page } from 'playwright-core';
import type { SweepSummary } from '../../shared/contracts.js';
import { formatNumber } from '../../shared/format.js';
import { ARTIFACTS, canvasColourShare, canvasInk, launchBrowser, watchForeignRequests } from './browser.js';
import { getJson, startPageServer, type PageServer } from './page-server.js';
import { SAMPLES_DIR } from '../../server/services/project-paths.js';

// The way through the page (issue 5) in real headless Chromium against the real server: demo scenario, plan,
// progress to the end, every chart drawn, numbers equal to the API's, a placement's grid on the map, the report,
// and a second sweep cancelled.
interface StoredDataset { id: string; name: string; n: number; nInside: number; sample?: string | null }
interface SweepRecord { id: string; status: string; progress: { done: number; total: number }; summary: SweepSummary | null }

describe('the analyst page in Chromium', () => {
  let server: PageServer;
  let browser: Browser;
  let page: Page;
  let foreign: string[];
  const errors: string[] = [];
  let demo: StoredDataset;
  let sweepId = '';
  let summary: SweepSummary;

  beforeAll(async () => {
    server = await startPageServer();
    browser = await launchBrowser();
    const context = await browser.newContext({ viewport: { width: 1280, height: 800 }, acceptDownloads: true });
    page = await context.newPage();
    page.on('pageerror', (error) => errors.push(error.message));
    page.on('console', (message) => { if (message.type() === 'error') errors.push(message.text()); });
    foreign = watchForeignRequests(page, server.origin);
    const datasets = await getJson<StoredDataset[]>(server, '/api/datasets');
    demo = datasets.find((dataset) => dataset.sample)!;
    expect(demo).toBeDefined();
  });

  afterAll(async () => {
    await browser?.close();
    await server?.close();
  });

  it('1 Data: picks a demo scenario and shows its summary, warnings and map', async () => {
    await page.goto(`${server.origin}/`);
    await page.waitForSelector(`#dataset-select option[value="${demo.id}"]`, { state: 'attached' });
    await page.selectOption('#dataset-select', demo.id);
    await page.click('#use-dataset');
    await page.waitForSelector('[data-testid=dataset-summary]');
    const summaryText = await page.innerText('[data-testid=dataset-summary]');
    expect(summaryText).toContain(demo.name);
    expect(summaryText).toContain(String(demo.n));
    expect(summaryText).toContain(String(demo.nInside));
    expect(await canvasInk(page, '#map')).toBeGreaterThan(0.02);
    await page.screenshot({ path: join(ARTIFACTS, 'page-1-data.png') });
  });

  it('1 Data: uploads points, a study area and a no-data zone with the CRS choice, and reports a bad file clearly', async () => {
    const folder = join(SAMPLES_DIR, 'port-calverin');
    await page.click('.upload summary');
    await page.setInputFiles('input[name=points]', join(SAMPLES_DIR, 'port-calverin', 'points.csv'));
    await page.setInputFiles('input[name=area]', join(folder, 'area.geojson'));
    await page.setInputFiles('input[name=noData]', [join(folder, 'no-data.geojson')]);
    await page.selectOption('select[name=crsChoice]', 'planar');
    await page.fill('input[name=name]', 'Uploaded <copy> of Port Calverin');
    await page.click('.upload-form button[type=submit]');
    await expect.poll(() => page.innerText('[data-testid=dataset-summary]').catch(() => '')).toContain('Uploaded <copy> of Port Calverin');
    const uploads = (await getJson<StoredDataset[]>(server, '/api/datasets')).filter((dataset) => !dataset.sample);
    expect(uploads).toHaveLength(1);
    expect(await page.innerText('[data-testid=dataset-summary]')).toContain(String(uploads[0].n));
    // the form folds away after a good upload; a points file without coordinates gets the server's message
    expect(await page.getAttribute('details.upload', 'open')).toBeNull();
    await page.click('.upload summary');
    await page.setInputFiles('input[name=points]', { name: 'broken.csv', mimeType: 'text/csv', buffer: Buffer.from('id,colour\n1,red\n') });
    await page.setInputFiles('input[name=area]', []);
    await page.setInputFiles('input[name=noData]', []);
    await page.click('.upload-form button[type=submit]');
    await page.waitForSelector('.upload-form [role=alert]');
    expect(await page.innerText('.upload-form [role=alert]')).toMatch(/broken\.csv/);
    await page.locator('#step-data').screenshot({ path: join(ARTIFACTS, 'page-1-upload-error.png') });
    // back to the demo scenario for the rest of the way
    await page.selectOption('#dataset-select', demo.id);
    await page.click('#use-dataset');
    await expect.poll(() => page.innerText('[data-testid=dataset-summary]')).toContain(demo.name);
  });

  it('2 Plan: suggests labelled cell sides, estimates the cost live and shows the budget refusal', async () => {
    expect(await page.locator('.size-row').count()).toBe(3);
    expect(await page.innerText('#step-plan')).toContain('common practice');
    await page.fill('#plan-placements', '65536');
    await page.fill('#plan-sims', '9999');
    await expect.poll(() => page.innerText('#plan-estimate')).toContain('Too large');
    expect(await page.isDisabled('#start-sweep')).toBe(true);
    await page.fill('#plan-placements', '16');
    await page.fill('#plan-sims', '19');
    // 3 sizes x 16 placements x (1 + 19) patterns, points inside the valid region
    const work = demo.nInside * 16 * 3 * 20;
    await expect.poll(() => page.innerText('#plan-estimate')).toContain(`${work.toExponential(2)} point-placements`);
    expect(await page.isDisabled('#start-sweep')).toBe(false);
    await page.locator('#step-plan').screenshot({ path: join(ARTIFACTS, 'page-2-plan.png') });
  });

  it('3 Run: the progress bar climbs to the end', async () => {
    // record every value the progress bar takes
    await page.evaluate(() => {
      const seen: number[] = [];
      (window as unknown as { progressSeen: number[] }).progressSeen = seen;
      new MutationObserver(() => {
        const bar = document.getElementById('run-progress') as HTMLProgressElement | null;
        if (bar && seen[seen.length - 1] !== bar.value / bar.max) seen.push(bar.value / bar.max);
      }).observe(document.getElementById('run-panel')!, { subtree: true, childList: true, attributes: true });
    });
    await page.click('#start-sweep');
    await page.waitForSelector('.run-box[data-sweep]');
    sweepId = (await page.getAttribute('.run-box', 'data-sweep'))!;
    await page.waitForSelector('.run-box[data-status=done]', { timeout: 90_000 });
    const bar = await page.$eval('#run-progress', (element) => ({ value: (element as HTMLProgressElement).value, max: (element as HTMLProgressElement).max }));
    const record = await getJson<SweepRecord>(server, `/api/sweeps/${sweepId}`);
    expect(record.status).toBe('done');
    expect(bar.max).toBe(record.progress.total);
    expect(bar.value).toBe(bar.max);
    const seen = await page.evaluate(() => (window as unknown as { progressSeen: number[] }).progressSeen);
    expect(seen[0]).toBe(0);
    expect(seen[seen.length - 1]).toBe(1);
    expect(seen.every((share, k) => k === 0 || share >= seen[k - 1])).toBe(true);
    expect(await page.innerText('#run-progress-label')).toContain(`${record.progress.total} of ${record.progress.total} placements done`);
    summary = record.summary!;
    expect(summary.sizes).toHaveLength(3);
  });

  it('4 Results: every chart drew and the numbers equal the API summary', async () => {
    await page.waitForSelector('[data-testid=overall-conclusion]');
    await page.waitForSelector('[data-chart^="monte-carlo-"] canvas');
    expect(await page.innerText('[data-testid=overall-conclusion]')).toBe(summary.conclusion);
    const charts = await page.$$eval('[data-chart] canvas', (canvases) => canvases.map((canvas) => canvas.id));
    const firstIndex = [...summary.sizes].sort((a, b) => a.cellSize - b.cellSize)[0].sizeIndex;
    expect(charts.sort()).toEqual(['chart-angle-', 'chart-cell-size', 'chart-monte-carlo-', 'chart-offsets-', 'chart-verdicts'].map((id) => (id.endsWith('-') ? `${id}${firstIndex}` : id)).sort());
    for (const id of charts) expect(await canvasInk(page, `#${id}`), id).toBeGreaterThan(0.01);
    // the cell-size table beside the chart: one row per size, medians of chi2/df as the API gives them
    const ordered = [...summary.sizes].sort((a, b) => a.cellSize - b.cellSize);
    const tableRows = await page.$$eval('#table-cell-size tbody tr', (rows) => rows.map((row) => Array.from(row.children, (cell) => cell.textContent ?? '')));
    expect(tableRows.map((row) => row[3])).toEqual(ordered.map((size) => formatNumber(size.chi2PerDf.p50)));
    expect(tableRows.map((row) => row[1])).toEqual(ordered.map((size) => formatNumber(size.chi2PerDf.p5)));
    const verdictRows = await page.$$eval('#table-verdicts tbody tr', (rows) => rows.map((row) => Array.from(row.children, (cell) => cell.textContent ?? '')));
    expect(verdictRows.map((row) => row[1])).toEqual(ordered.map((size) => formatNumber(100 * size.verdictShares.clustered)));
    await page.selectOption('#measure-select', 'vmr');
    await expect.poll(() => page.$$eval('#table-cell-size tbody tr td:nth-child(4)', (cells) => cells.map((cell) => cell.textContent))).toEqual(ordered.map((size) => formatNumber(size.vmr.p50)));
    expect(await canvasInk(page, '#chart-cell-size')).toBeGreaterThan(0.01);
    await page.selectOption('#measure-select', 'chi2PerDf');
    const first = ordered[0];
    expect(await page.innerText('[data-testid=size-conclusion]')).toBe(first.conclusion);
    const numbers = await page.innerText('[data-testid=size-numbers]');
    expect(numbers).toContain(`median ${formatNumber(first.chi2PerDf.p50)}`);
    expect(numbers).toContain(`${first.monteCarlo!.sims} CSR patterns`);
    await page.screenshot({ path: join(ARTIFACTS, 'page-4-results.png') });
    await page.locator('#step-results').screenshot({ path: join(ARTIFACTS, 'page-4-results-full.png') });
  });

  it('4 Results: a placement picked by keyboard or by clicking a chart shows its grid on the map', async () => {
    const first = [...summary.sizes].sort((a, b) => a.cellSize - b.cellSize)[0];
    // before: area, zones and points in greys and black; after: cells shaded on the colour ramp
    expect(await canvasColourShare(page, '#map')).toBeLessThan(0.01);
    await page.focus('#pick-highest');
    await page.keyboard.press('Enter');
    await page.waitForFunction(() => Number(document.getElementById('map')!.dataset.gridCells) > 0);
    const grid = await getJson<{ features: { properties: { kept: boolean } }[] }>(server, `/api/sweeps/${sweepId}/grid.geojson?size=${first.sizeIndex}&placement=${first.highestVmr.placementIndex}`);
    expect(Number(await page.getAttribute('#map', 'data-grid-cells'))).toBe(grid.features.length);
    const caption = await page.innerText('#map-caption');
    expect(caption).toContain(`Placement ${first.highestVmr.placementIndex} at`);
    expect(caption).toContain(`${grid.features.filter((cell) => cell.properties.kept).length} cells kept`);
    expect(await canvasColourShare(page, '#map')).toBeGreaterThan(0.1);
    await page.locator('.map-panel').screenshot({ path: join(ARTIFACTS, 'page-4-map-grid.png') });
    // click the middle of the offset heat map: the bin there shows its nearest placement
    const heatmap = page.locator('[data-chart^="offsets-"] canvas');
    await heatmap.scrollIntoViewIfNeeded();
    const box = (await heatmap.boundingBox())!;
    await heatmap.click({ position: { x: box.width * 0.55, y: box.height * 0.5 } });
    await expect.poll(() => page.innerText('#map-caption')).not.toBe(caption);
    // the caption passes through "Loading the grid of placement J..." while the grid is fetched
    await expect.poll(() => page.innerText('#map-caption')).toMatch(/^Placement \d+ at/);
    // click the bar of the largest cell side in the verdict chart: the detail charts follow
    const largest = [...summary.sizes].sort((a, b) => a.cellSize - b.cellSize)[2];
    const verdicts = page.locator('#chart-verdicts');
    await verdicts.scrollIntoViewIfNeeded();
    const verdictBox = (await verdicts.boundingBox())!;
    await verdicts.click({ position: { x: 50 + (verdictBox.width - 60) * (5 / 6), y: verdictBox.height * 0.45 } });
    await expect.poll(() => page.inputValue('#size-select')).toBe(String(largest.sizeIndex));
    await expect.poll(() => page.innerText('[data-testid=size-conclusion]')).toBe(largest.conclusion);
  });

  it('5 Report: downloads a PNG with a white background, the grid, and the HTML report with its content', async () => {
    await page.locator('#step-report').scrollIntoViewIfNeeded();
    const [png] = await Promise.all([page.waitForEvent('download'), page.click('[data-png-download="cell-size"]')]);
    // download names carry the dataset name and the cell sides
    expect(png.suggestedFilename()).toMatch(/^gridshake-[a-z0-9-]+-[\d.-]+m-chart-cell-size\.png$/);
    const pngBytes = readFileSync((await png.path())!);
    expect([...pngBytes.subarray(0, 8)]).toEqual([137, 80, 78, 71, 13, 10, 26, 10]);
    const corner = await page.evaluate(async (base64) => {
      const image = new Image();
      image.src = `data:image/png;base64,${base64}`;
      await image.decode();
      const canvas = document.createElement('canvas');
      canvas.width = image.width;
      canvas.height = image.height;
      const context = canvas.getContext('2d')!;
      context.drawImage(image, 0, 0);
      return Array.from(context.getImageData(1, 1, 1, 1).data);
    }, pngBytes.toString('base64'));
    expect(corner).toEqual([255, 255, 255, 255]);
    expect(await page.getAttribute('#download-grid', 'href')).toMatch(/grid\.geojson\?size=\d+&placement=\d+$/);
    const [report] = await Promise.all([page.waitForEvent('download'), page.click('#download-report')]);
    expect(report.suggestedFilename()).toMatch(/^gridshake-[a-z0-9-]+-[\d.-]+m-report\.html$/);
    const reportPath = join(ARTIFACTS, 'page-report.html');
    await report.saveAs(reportPath);
    const html = readFileSync(reportPath, 'utf8');
    expect(html).toContain(demo.name.replace(/&/g, '&amp;'));
    expect(html).toContain(`repeated over 16 grid placements for each of 3 cell sizes`);
    expect(html).toContain('19 patterns of complete spatial randomness');
    expect(html).toContain(`The random seed was 1`);
    expect(html).toContain('Significance is not cause');
    await page.locator('#step-report').screenshot({ path: join(ARTIFACTS, 'page-5-report.png') });
    const reportPage = await browser.newPage();
    const reportForeign = watchForeignRequests(reportPage, null);
    await reportPage.goto(`${server.origin}/api/sweeps/${sweepId}/report.html`);
    const ids = await reportPage.$$eval('canvas', (canvases) => canvases.map((canvas) => canvas.id));
    expect(ids.length).toBe(2 + 3 * 3);
    for (const id of ids) expect(await canvasInk(reportPage, `#${id}`), id).toBeGreaterThan(0.01);
    expect(reportForeign.filter((url) => !url.startsWith(server.origin))).toEqual([]);
    await reportPage.screenshot({ path: join(ARTIFACTS, 'report-top.png') });
    await reportPage.close();
  });

  it('3 Run: a second, larger sweep can be cancelled', async () => {
    await page.locator('#step-plan').scrollIntoViewIfNeeded();
    await page.fill('#plan-placements', '16384');
    await page.fill('#plan-sims', '199');
    await expect.poll(() => page.isDisabled('#start-sweep')).toBe(false);
    await page.click('#start-sweep');
    await page.waitForFunction((previous) => {
      const box = document.querySelector('.run-box');
      return box !== null && box.getAttribute('data-sweep') !== previous && !box.hasAttribute('data-status');
    }, sweepId);
    const secondId = (await page.getAttribute('.run-box', 'data-sweep'))!;
    // let it make some progress first, then cancel
    await page.waitForFunction(() => (document.getElementById('run-progress') as HTMLProgressElement).value > 0, undefined, { timeout: 30_000 });
    await page.click('#cancel-sweep');
    await page.waitForSelector('.run-box[data-status=cancelled]', { timeout: 30_000 });
    expect(await page.innerText('#run-outcome')).toContain('cancelled');
    const record = await getJson<SweepRecord>(server, `/api/sweeps/${secondId}`);
    expect(record.status).toBe('cancelled');
    expect(record.progress.done).toBeGreaterThan(0);
    expect(record.progress.done).toBeLessThan(record.progress.total);
    await page.locator('#step-run').screenshot({ path: join(ARTIFACTS, 'page-3-cancelled.png') });
    // the finished sweep stays listed with the dataset and opens again
    await page.click(`[data-open-sweep="${sweepId}"]`);
    await page.waitForSelector('.run-box[data-status=done]');
    await expect.poll(() => page.innerText('[data-testid=overall-conclusion]')).toBe(summary.conclusion);
  });

  it('made no request outside the local server and raised no script error', () => {
    expect(foreign).toEqual([]);
    // the one refused request is the deliberately broken upload
    const refused = errors.filter((text) => text.includes('status of 400'));
    expect(refused).toHaveLength(1);
    expect(errors.filter((text) => !refused.includes(text))).toEqual([]);
  });
}, 240_000);
