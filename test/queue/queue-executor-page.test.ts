import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { parseQueueUrl } from '../../server/queue/queue-url.js';
import { ARTIFACTS, launchBrowser } from '../e2e/browser.js';
import { getJson, startPageServer, type PageServer } from '../e2e/page-server.js';
import { startRedis, type TestRedis } from '../bench/redis-server.js';

// The page's choice of where a sweep runs, on a server started with a Redis queue (as `serve --queue` builds it), in
// headless Chromium: the choice is offered with the queue chosen, fits the window at 360, 390, 1024 and 1440 px; with
// Redis stopped, a sweep started on the queue fails on the page with the message naming the Redis URL, and the same
// plan on "this machine" then runs to the end on the page (the server's own pool). Each sweep's record names its
// executor. (A server without a queue shows no choice: test/e2e/page-widths.test.ts.)

const TIMEOUT_SECONDS = 2;

interface StoredDataset { id: string; sample?: string | null }
interface SweepRecord { status: string; executor: string | null; error: string | null; summary: { versions: Record<string, string> } | null }

let redis: TestRedis;
let server: PageServer;
let browser: Browser;
let page: Page;
const errors: string[] = [];

beforeAll(async () => {
  process.env.GRIDSHAKE_QUEUE_TIMEOUT = String(TIMEOUT_SECONDS);
  redis = await startRedis();
  server = await startPageServer({ queue: parseQueueUrl(redis.url) });
  browser = await launchBrowser();
  page = await (await browser.newContext({ viewport: { width: 1280, height: 800 } })).newPage();
  page.on('pageerror', (error) => errors.push(error.message));
}, 120_000);

afterAll(async () => {
  delete process.env.GRIDSHAKE_QUEUE_TIMEOUT;
  await browser?.close();
  await server?.close();
  await redis?.stop();
});

/** The document is no wider than the window, and the choice lies inside it. */
async function fits(width: number): Promise<void> {
  await page.setViewportSize({ width, height: 860 });
  const found = await page.evaluate(() => {
    const root = document.documentElement;
    const choice = document.getElementById('executor-choice')!.getBoundingClientRect();
    return { scrollWidth: root.scrollWidth, clientWidth: root.clientWidth, choiceRight: choice.right, choiceWidth: choice.width };
  });
  expect(found.scrollWidth, `${width} px`).toBeLessThanOrEqual(found.clientWidth);
  expect(found.choiceWidth, `${width} px`).toBeGreaterThan(0);
  expect(found.choiceRight, `${width} px`).toBeLessThanOrEqual(found.clientWidth + 1);
}

async function startedSweep(): Promise<string> {
  const previous = await page.getAttribute('.run-box', 'data-sweep').catch(() => null);
  await expect.poll(() => page.isDisabled('#start-sweep')).toBe(false);
  await page.click('#start-sweep');
  await page.waitForFunction((before) => {
    const id = document.querySelector('.run-box')?.getAttribute('data-sweep');
    return id !== null && id !== undefined && id !== before;
  }, previous);
  return (await page.getAttribute('.run-box', 'data-sweep'))!;
}

describe('choosing where a sweep runs on the page of a server with a Redis queue', () => {
  it('offers the queue by default, fails a queue sweep naming the URL while Redis is down, then runs it on this machine', async () => {
    const health = await getJson<{ executors: string[] }>(server, '/api/health');
    expect(health.executors).toEqual(['queue', 'local']);
    const demo = (await getJson<StoredDataset[]>(server, '/api/datasets')).find((dataset) => dataset.sample)!;
    await page.goto(`${server.origin}/`);
    await page.waitForSelector(`#dataset-select option[value="${demo.id}"]`, { state: 'attached' });
    await page.selectOption('#dataset-select', demo.id);
    await page.click('#use-dataset');
    await page.waitForSelector('[data-testid=dataset-summary]');
    await page.waitForSelector('#executor-queue');
    expect(await page.isChecked('#executor-queue')).toBe(true);
    expect(await page.isChecked('#executor-local')).toBe(false);
    expect(await page.innerText('#executor-choice')).toContain('This machine');
    await page.fill('#plan-placements', '32');
    await page.fill('#plan-sims', '19');
    for (const width of [360, 390, 1024, 1440]) {
      await fits(width);
      await page.screenshot({ path: join(ARTIFACTS, `queue-executor-choice-${width}.png`) });
    }
    await page.setViewportSize({ width: 1280, height: 800 });

    // Redis goes away: the sweep sent to the queue fails on the page with the URL and what to check
    await redis.stop();
    const queueSweep = await startedSweep();
    await page.waitForSelector(`.run-box[data-sweep="${queueSweep}"][data-status=failed]`, { timeout: 60_000 });
    const outcome = await page.innerText('#run-outcome');
    expect(outcome).toContain(`the Redis queue at redis://127.0.0.1:${redis.port}/0 did not answer for ${TIMEOUT_SECONDS} s`);
    expect(outcome).toContain('check that Redis runs there');
    const failed = await getJson<SweepRecord>(server, `/api/sweeps/${queueSweep}`);
    expect(failed.status).toBe('failed');
    expect(failed.executor).toBe('queue');

    // the same plan on this machine: the server's own pool runs it to the end, shown on the page
    await page.check('#executor-local');
    const localSweep = await startedSweep();
    await page.waitForSelector(`.run-box[data-sweep="${localSweep}"][data-status=done]`, { timeout: 90_000 });
    await page.waitForSelector('[data-chart^="monte-carlo-"] canvas');
    const done = await getJson<SweepRecord>(server, `/api/sweeps/${localSweep}`);
    expect(done.status, done.error ?? '').toBe('done');
    expect(done.executor).toBe('local');
    expect(done.summary?.versions.executor).toBe('local pool');
    // the choice is kept for the next sweep
    expect(await page.isChecked('#executor-local')).toBe(true);
    await page.screenshot({ path: join(ARTIFACTS, 'queue-executor-local-done.png'), fullPage: true });
    expect(errors).toEqual([]);
  }, 240_000);
});
