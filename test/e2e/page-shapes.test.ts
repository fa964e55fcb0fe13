import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { join } from 'node:path';
import type { Browser, Page } from 'playwright-core';
import type { SweepSummary } from '../../shared/contracts.js';
import { shapeSentence } from '../../shared/shape-sentence.js';
import { formatMetres, formatNumber, formatP, formatPercent } from '../../shared/format.js';
import { ARTIFACTS, canvasInk, launchBrowser, watchForeignRequests } from './browser.js';
import { getJson, startPageServer, type PageServer } from './page-server.js';

// Squares and hexagons side by side from the page (issue 16) in real headless Chromium against the real server: the
// plan form's shape choice becomes the plan's `shape`, and the results show per cell side and shape the spread, the
// verdict shares and the Monte Carlo p, with the sentence on whether the conclusion depends on the shape. The numbers
// are checked against the API's summary of the same sweep.
interface StoredDataset { id: string; name: string; n: number; nInside: number; sample?: string | null }
interface SweepRecord { id: string; status: string; plan?: unknown; summary: SweepSummary | null }

const PLACEMENTS = 8;
const SIMS = 19;

describe('the page runs a sweep of squares and hexagons side by side', () => {
  let server: PageServer;
  let browser: Browser;
  let page: Page;
  let foreign: string[];
  const errors: string[] = [];
  let demo: StoredDataset;
  let summary: SweepSummary;

  beforeAll(async () => {
    server = await startPageServer();
    browser = await launchBrowser();
    const context = await browser.newContext({ viewport: { width: 1280, height: 800 } });
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

  it('the plan form offers squares, hexagons or both, and the cost counts both shapes', async () => {
    await page.goto(`${server.origin}/`);
    await page.waitForSelector(`#dataset-select option[value="${demo.id}"]`, { state: 'attached' });
    await page.selectOption('#dataset-select', demo.id);
    await page.click('#use-dataset');
    await page.waitForSelector('#plan-shape');
    const options = await page.$$eval('#plan-shape option', (elements) => elements.map((option) => (option as HTMLOptionElement).value));
    expect(options).toEqual(['square', 'hex', 'both']);
    expect(await page.inputValue('#plan-shape')).toBe('square');
    await page.fill('#plan-placements', String(PLACEMENTS));
    await page.fill('#plan-sims', String(SIMS));
    const sizes = await page.locator('.size-row').count();
    const oneShape = demo.nInside * PLACEMENTS * sizes * (1 + SIMS);
    await expect.poll(() => page.innerText('#plan-estimate')).toContain(`${oneShape.toExponential(2)} point-placements`);
    await page.selectOption('#plan-shape', 'hex');
    await expect.poll(() => page.innerText('#step-plan')).toContain('angles 0 to 60 degrees');
    await page.selectOption('#plan-shape', 'both');
    await expect.poll(() => page.innerText('#plan-estimate')).toContain(`x 2 shapes`);
    expect(await page.innerText('#plan-estimate')).toContain(`${(2 * oneShape).toExponential(2)} point-placements`);
    expect(await page.innerText('#step-plan')).toContain('0 to 90 degrees for squares, 0 to 60 for hexagons');
  });

  it('the sweep runs both shapes on the plan the form made', async () => {
    await page.click('#start-sweep');
    await page.waitForSelector('.run-box[data-sweep]');
    const sweepId = (await page.getAttribute('.run-box', 'data-sweep'))!;
    await page.waitForSelector('.run-box[data-status=done]', { timeout: 120_000 });
    const record = await getJson<SweepRecord>(server, `/api/sweeps/${sweepId}`);
    expect(record.status).toBe('done');
    summary = record.summary!;
    expect(summary.plan.shape).toEqual(['square', 'hex']);
    const sides = new Set(summary.sizes.map((size) => size.cellSize));
    expect(summary.sizes).toHaveLength(2 * sides.size);
    for (const side of sides) {
      expect(summary.sizes.filter((size) => size.cellSize === side).map((size) => size.shape ?? 'square').sort()).toEqual(['hex', 'square']);
    }
  }, 150_000);

  it('the results show each cell side and shape side by side, the Monte Carlo p and the shape sentence', async () => {
    await page.waitForSelector('[data-testid=shape-sentence]');
    expect(await page.innerText('[data-testid=overall-conclusion]')).toBe(summary.conclusion);
    const sentence = `${shapeSentence(summary.sizes)}.`;
    expect(await page.innerText('[data-testid=shape-sentence]')).toBe(sentence);
    // the server's conclusion carries the same sentence
    expect(summary.conclusion).toContain(shapeSentence(summary.sizes));
    // entries by cell side, squares then hexagons at each side
    const ordered = [...summary.sizes].sort((a, b) => a.cellSize - b.cellSize || (a.shape === 'hex' ? 1 : 0) - (b.shape === 'hex' ? 1 : 0));
    const label = (size: SweepSummary['sizes'][number]) => `${formatMetres(size.cellSize)}${size.shape === 'hex' ? ' hexagons' : ''}`;
    const cells = (selector: string) =>
      page.$$eval(`${selector} tbody tr`, (rows) => rows.map((row) => Array.from(row.children, (cell) => cell.textContent ?? '')));
    const sizeRows = await cells('[data-testid=size-table]');
    expect(sizeRows.map((row) => row[0])).toEqual(ordered.map(label));
    expect(sizeRows.map((row) => row[3])).toEqual(ordered.map((size) => formatNumber(size.chi2PerDf.p50)));
    expect(sizeRows.map((row) => row[6])).toEqual(ordered.map((size) => formatPercent(size.verdictShares.clustered)));
    expect(sizeRows.map((row) => row[11])).toEqual(ordered.map((size) => formatP(size.monteCarlo?.pMedianClustered)));
    const monteCarloRows = await cells('[data-testid=monte-carlo-table]');
    expect(monteCarloRows.map((row) => row[0])).toEqual(ordered.map(label));
    expect(monteCarloRows.map((row) => row[4])).toEqual(ordered.map((size) => formatP(size.monteCarlo!.pMedianClustered)));
    expect(monteCarloRows.map((row) => row[5])).toEqual(ordered.map((size) => formatP(size.monteCarlo!.pMedianRegular)));
    // the charts' own tables list the same entries: spread per side and shape, verdict shares per side and shape
    const spreadRows = await cells('#table-cell-size');
    expect(spreadRows.map((row) => row[0])).toEqual(ordered.map(label));
    expect(spreadRows.map((row) => row[3])).toEqual(ordered.map((size) => formatNumber(size.chi2PerDf.p50)));
    const verdictRows = await cells('#table-verdicts');
    expect(verdictRows.map((row) => row[0])).toEqual(ordered.map(label));
    expect(verdictRows.map((row) => row[1])).toEqual(ordered.map((size) => formatNumber(100 * size.verdictShares.clustered)));
    for (const id of ['chart-cell-size', 'chart-verdicts']) expect(await canvasInk(page, `#${id}`), id).toBeGreaterThan(0.01);
    // the detail view names the shape; choosing the hexagon entry of the first side shows its own conclusion
    const hexFirst = ordered.find((size) => size.shape === 'hex')!;
    await page.selectOption('#size-select', String(hexFirst.sizeIndex));
    await expect.poll(() => page.innerText('#size-detail h4')).toContain('hexagonal cells');
    expect(await page.innerText('[data-testid=size-conclusion]')).toBe(hexFirst.conclusion);
    await page.locator('#step-results').screenshot({ path: join(ARTIFACTS, 'page-shapes-results.png') });
    expect(errors).toEqual([]);
    expect(foreign).toEqual([]);
  });
});
