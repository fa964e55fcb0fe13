import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { writeFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import type { Browser } from 'playwright-core';
import { renderReport } from '../../server/report/render-report.js';
import { makeMonteCarlo, makeRow, makeSize, makeSummary } from '../client/summary-fixture.js';
import { ARTIFACTS, canvasInk, launchBrowser, watchForeignRequests } from './browser.js';

// The report opened from disk in real Chromium: every chart draws, nothing is fetched, no script error.
describe('the HTML report in Chromium', () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
  });

  it('draws every chart offline from the embedded chart.js', async () => {
    const sizes = [0, 1].map((sizeIndex) => makeSize({ sizeIndex, cellSize: 200 * (sizeIndex + 1), monteCarlo: makeMonteCarlo({ sims: 19 }) }));
    const rows = [0, 1].flatMap((sizeIndex) =>
      Array.from({ length: 16 }, (_, placementIndex) => makeRow({ sizeIndex, placementIndex, u: (placementIndex % 4) / 4 + 0.1, v: Math.floor(placementIndex / 4) / 4 + 0.1, angle: placementIndex * 5, vmr: 1 + ((placementIndex * 7) % 16) / 10 })),
    );
    const file = resolve(join(ARTIFACTS, 'fixture-report.html'));
    writeFileSync(file, renderReport(makeSummary(sizes), rows));
    const page = await browser.newPage({ viewport: { width: 1100, height: 900 } });
    const errors: string[] = [];
    page.on('pageerror', (error) => errors.push(error.message));
    page.on('console', (message) => { if (message.type() === 'error') errors.push(message.text()); });
    const foreign = watchForeignRequests(page, `file://${file}`);
    await page.goto(`file://${file}`);
    const ids = await page.$$eval('canvas', (canvases) => canvases.map((canvas) => canvas.id));
    expect(ids).toHaveLength(8);
    for (const id of ids) expect(await canvasInk(page, `#${id}`), id).toBeGreaterThan(0.01);
    await page.screenshot({ path: join(ARTIFACTS, 'fixture-report.png'), fullPage: true });
    await page.pdf({ path: join(ARTIFACTS, 'fixture-report.pdf'), format: 'A4' });
    expect(errors).toEqual([]);
    expect(foreign).toEqual([]);
    await page.close();
  });
});
