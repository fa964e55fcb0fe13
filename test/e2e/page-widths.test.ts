import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { join } from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { ARTIFACTS, launchBrowser } from './browser.js';
import { getJson, startPageServer, type PageServer } from './page-server.js';

// The analyst's journey (issue 12) at two phones, a small laptop and a wide screen: pick the demo scenario, a bad upload,
// a small sweep to the end, results and report. At every step the document is no wider than the window (no
// horizontal scroll) and no command-line syntax or internal name is on screen.
interface StoredDataset { id: string; name: string; sample?: string | null }

/** Command-line flags, plan paths and raw state names that belong to the programmer, not to the page. */
const PROGRAMMER_WORDS = /(^|\s)--[a-z][a-z-]*|\bplan\.[a-zA-Z]+|\bcsr\b|\b(points-outside|default-study-area|duplicate-points)\b|m\^2|"m"More/;

async function overflow(page: Page): Promise<{ scrollWidth: number; clientWidth: number; wide: string[] }> {
  return page.evaluate(() => {
    const root = document.documentElement;
    const wide: string[] = [];
    for (const element of Array.from(document.body.querySelectorAll('*'))) {
      const box = element.getBoundingClientRect();
      if (box.right > root.clientWidth + 1 && box.width > 0) {
        // the element sticks out unless an ancestor clips it (a table scrolling inside its own box)
        let clipped = false;
        for (let parent = element.parentElement; parent && parent !== document.body; parent = parent.parentElement) {
          const style = getComputedStyle(parent);
          if (style.overflowX !== 'visible') { clipped = true; break; }
        }
        if (!clipped) wide.push(`${element.tagName.toLowerCase()}${element.id ? `#${element.id}` : ''}.${element.className} ${Math.round(box.right)}`);
      }
    }
    return { scrollWidth: root.scrollWidth, clientWidth: root.clientWidth, wide: wide.slice(0, 8) };
  });
}

async function expectFits(page: Page, step: string): Promise<void> {
  const found = await overflow(page);
  expect(found.scrollWidth, `${step}: ${found.wide.join('; ')}`).toBeLessThanOrEqual(found.clientWidth);
  const text = await page.evaluate(() => document.body.innerText);
  const match = text.match(PROGRAMMER_WORDS);
  expect(match?.[0] ?? null, `${step}: programmer's words on screen`).toBeNull();
}

describe.each([360, 390, 1024, 1440])('the journey at %i px', (width) => {
  let server: PageServer;
  let browser: Browser;
  let page: Page;
  let demo: StoredDataset;

  beforeAll(async () => {
    server = await startPageServer();
    browser = await launchBrowser();
    page = await (await browser.newContext({ viewport: { width, height: 860 } })).newPage();
    demo = (await getJson<StoredDataset[]>(server, '/api/datasets')).find((dataset) => dataset.sample)!;
  });

  afterAll(async () => {
    await browser?.close();
    await server?.close();
  });

  it('fits the window and speaks the page language at every step', async () => {
    await page.goto(`${server.origin}/`);
    await page.waitForSelector(`#dataset-select option[value="${demo.id}"]`, { state: 'attached' });
    await expectFits(page, 'start');
    // the map comes after the data step on a narrow screen
    const order = await page.evaluate(() => {
      const data = document.getElementById('step-data')!.getBoundingClientRect();
      const map = document.getElementById('map')!.getBoundingClientRect();
      return { dataTop: data.top, mapTop: map.top, mapLeft: map.left, dataRight: data.right };
    });
    expect(order.mapTop > order.dataTop || order.mapLeft >= order.dataRight).toBe(true);

    // a CSV without coordinate columns: the message names the page's fields, not the command line's flags
    await page.click('.upload summary');
    await page.setInputFiles('input[name=points]', { name: 'no-columns.csv', mimeType: 'text/csv', buffer: Buffer.from('id,colour\n1,red\n') });
    await page.click('.upload-form button[type=submit]');
    await page.waitForSelector('.upload-form [role=alert]');
    const refusal = await page.innerText('.upload-form [role=alert]');
    expect(refusal).toContain('no-columns.csv');
    expect(refusal).toMatch(/x \/ longitude column/);
    await expectFits(page, 'upload refused');
    await page.click('.upload summary');

    await page.selectOption('#dataset-select', demo.id);
    await page.click('#use-dataset');
    await page.waitForSelector('[data-testid=dataset-summary]');
    await expectFits(page, 'dataset chosen');
    await page.fill('#plan-placements', '16');
    await page.fill('#plan-sims', '19');
    await expect.poll(() => page.isDisabled('#start-sweep')).toBe(false);
    await expectFits(page, 'plan');
    // a server without a Redis queue offers no choice of where the sweep runs (test/queue/queue-executor-page.test.ts)
    expect(await page.locator('input[name=executor]').count()).toBe(0);
    await page.click('#start-sweep');
    await page.waitForSelector('.run-box[data-status=done]', { timeout: 90_000 });
    await page.waitForSelector('[data-chart^="monte-carlo-"] canvas');
    await expectFits(page, 'results');
    await page.focus('#pick-highest');
    await page.keyboard.press('Enter');
    await page.waitForFunction(() => Number(document.getElementById('map')!.dataset.gridCells) > 0);
    await expectFits(page, 'placement on the map');
    // chart canvases are drawn at a readable size: never narrower than 280 px nor wider than the window
    const widths = await page.$$eval('[data-chart] canvas', (canvases) => canvases.map((canvas) => canvas.getBoundingClientRect().width));
    for (const canvasWidth of widths) {
      expect(canvasWidth).toBeGreaterThanOrEqual(Math.min(280, width - 60));
      expect(canvasWidth).toBeLessThanOrEqual(width);
    }
    await page.screenshot({ path: join(ARTIFACTS, `page-width-${width}.png`), fullPage: true });
    await page.locator('[data-chart^="angle-"]').screenshot({ path: join(ARTIFACTS, `page-width-${width}-angle-chart.png`) });
  });

  it('deletes a sweep and an uploaded dataset after asking, and reads a file with a blank row when asked to skip it', async () => {
    // the finished sweep is listed with the dataset; deleting it asks first and clears the results
    const sweepId = (await page.getAttribute('.run-box', 'data-sweep'))!;
    await page.click(`[data-delete-sweep="${sweepId}"]`);
    await expectFits(page, 'sweep delete question');
    expect(await page.isVisible('[data-confirm=yes]')).toBe(true);
    await page.click('[data-confirm=no]');
    expect((await fetch(`${server.origin}/api/sweeps/${sweepId}`)).status).toBe(200);
    await page.click(`[data-delete-sweep="${sweepId}"]`);
    await page.click('[data-confirm=yes]');
    await expect.poll(async () => (await fetch(`${server.origin}/api/sweeps/${sweepId}`)).status).toBe(404);
    await expect.poll(() => page.innerText('#results-panel')).toContain('Results appear here');

    // an upload with a blank coordinate: refused with every line named, then read with the checkbox ticked
    const csv = 'id,x,y\n1,100,100\n2,,300\n3,900,900\n4,500,n/a\n5,300,700\n6,700,300\n';
    await page.click('.upload summary');
    await page.setInputFiles('input[name=points]', { name: 'gaps.csv', mimeType: 'text/csv', buffer: Buffer.from(csv) });
    await page.selectOption('select[name=crsChoice]', 'planar');
    await page.fill('input[name=name]', 'Gaps');
    await page.click('.upload-form button[type=submit]');
    await page.waitForSelector('.upload-form [role=alert]');
    expect(await page.innerText('.upload-form [role=alert]')).toMatch(/2 rows have no coordinates .*line 3 .*line 5 .*tick "Skip rows without coordinates"/);
    await expectFits(page, 'bad rows refused');
    await page.check('#upload-skip-bad-rows');
    await page.click('.upload-form button[type=submit]');
    await expect.poll(() => page.innerText('[data-testid=dataset-summary]').catch(() => '')).toContain('Gaps');
    expect(await page.innerText('#dataset-summary')).toContain('Rows left out');
    const uploaded = (await getJson<StoredDataset[]>(server, '/api/datasets')).find((dataset) => dataset.name === 'Gaps')!;
    // delete it: the question names it; afterwards it is gone from the list and from the server
    await page.selectOption('#dataset-select', uploaded.id);
    await page.click('#delete-dataset');
    expect(await page.innerText('.confirm-question')).toContain('Gaps');
    await expectFits(page, 'dataset delete question');
    await page.click('[data-confirm=yes]');
    await expect.poll(async () => (await fetch(`${server.origin}/api/datasets/${uploaded.id}`)).status).toBe(404);
    await expect.poll(() => page.locator(`#dataset-select option[value="${uploaded.id}"]`).count()).toBe(0);
    await expect.poll(() => page.innerText('#plan-panel')).toContain('Choose a dataset first');
  });
}, 240_000);
