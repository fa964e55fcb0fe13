import { join } from 'node:path';
import { setTimeout as sleep } from 'node:timers/promises';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { QueueWorker } from '../../server/queue/queue-worker.js';
import { parseQueueUrl } from '../../server/queue/queue-url.js';
import { ARTIFACTS, launchBrowser } from '../e2e/browser.js';
import { getJson, startPageServer, type PageServer } from '../e2e/page-server.js';
import { redisKeys, startRedis, type TestRedis } from '../bench/redis-server.js';

// The page against a server started with a Redis queue (as `serve --queue` builds it), in headless Chromium: a sweep
// started from the page moves the progress bar as the queue's workers finish tasks, the cancel button ends it as
// cancelled, and no task, job or result of the server is left in Redis afterwards.

interface StoredDataset { id: string; sample?: string | null }
interface SweepRecord { status: string; progress: { done: number; total: number }; summary: { versions: Record<string, string> } | null }

let redis: TestRedis;
let workers: QueueWorker[];
let server: PageServer;
let browser: Browser;
let page: Page;
const errors: string[] = [];

/** Keys a sweep of a server (prefix `data-…`) may leave: its BullMQ jobs, the queue's lists, its results. */
function leftover(keys: string[]): string[] {
  return keys.filter((key) => /^gridshake:tasks:data-|^gridshake:tasks:(wait|active|prioritized|delayed|paused|failed|completed)$/.test(key) || key.includes(':result:'));
}

beforeAll(async () => {
  redis = await startRedis();
  const connection = parseQueueUrl(redis.url);
  workers = [0, 1].map(() => new QueueWorker({ connection, threads: 1, log: () => undefined, lockMs: 5000 }));
  server = await startPageServer({ queue: connection });
  browser = await launchBrowser();
  page = await (await browser.newContext({ viewport: { width: 1280, height: 800 } })).newPage();
  page.on('pageerror', (error) => errors.push(error.message));
  page.on('console', (message) => {
    if (message.type() === 'error') errors.push(message.text());
  });
}, 120_000);

afterAll(async () => {
  await browser?.close();
  await server?.close();
  await Promise.all((workers ?? []).map((worker) => worker.close()));
  await redis?.stop();
});

describe('the page on a server with a Redis queue', () => {
  it('moves the progress bar, cancels with the cancel button, and leaves no task in Redis', async () => {
    const demo = (await getJson<StoredDataset[]>(server, '/api/datasets')).find((dataset) => dataset.sample)!;
    expect(demo).toBeDefined();
    await page.goto(`${server.origin}/`);
    await page.waitForSelector(`#dataset-select option[value="${demo.id}"]`, { state: 'attached' });
    await page.selectOption('#dataset-select', demo.id);
    await page.click('#use-dataset');
    await page.waitForSelector('[data-testid=dataset-summary]');
    // large enough that the two one-thread workers are far from done when the cancel arrives
    await page.fill('#plan-placements', '16384');
    await page.fill('#plan-sims', '199');
    await expect.poll(() => page.isDisabled('#start-sweep')).toBe(false);
    await page.click('#start-sweep');
    await page.waitForSelector('.run-box[data-sweep]');
    const sweepId = (await page.getAttribute('.run-box', 'data-sweep'))!;
    // the bar advances while the workers (not this server's pool) take the tasks: two distinct values above 0
    await page.waitForFunction(() => (document.getElementById('run-progress') as HTMLProgressElement).value > 0, undefined, { timeout: 60_000 });
    const first = await page.$eval('#run-progress', (element) => (element as HTMLProgressElement).value);
    await page.waitForFunction((seen) => (document.getElementById('run-progress') as HTMLProgressElement).value > seen, first, { timeout: 60_000 });
    const running = await getJson<SweepRecord>(server, `/api/sweeps/${sweepId}`);
    expect(running.status).toBe('running');
    expect(workers.reduce((sum, worker) => sum + worker.completed, 0)).toBeGreaterThan(0);
    await page.screenshot({ path: join(ARTIFACTS, 'queue-page-running.png') });

    await page.click('#cancel-sweep');
    await page.waitForSelector('.run-box[data-status=cancelled]', { timeout: 60_000 });
    expect(await page.innerText('#run-outcome')).toContain('cancelled');
    const record = await getJson<SweepRecord>(server, `/api/sweeps/${sweepId}`);
    expect(record.status).toBe('cancelled');
    expect(record.progress.done).toBeGreaterThan(0);
    expect(record.progress.done).toBeLessThan(record.progress.total);

    // a task a worker held at the cancel finishes, then its result is deleted: wait for that (bounded)
    let keys = await redisKeys(redis.port);
    for (let k = 0; k < 300 && leftover(keys).length > 0; k++) {
      await sleep(50);
      keys = await redisKeys(redis.port);
    }
    expect(leftover(keys)).toEqual([]);
    // the test reads the right Redis: the sweep's dataset is there
    expect(keys.some((key) => /^gridshake:data-[0-9a-f]{12}:dataset:/.test(key))).toBe(true);
    expect(errors).toEqual([]);
  }, 240_000);
});
