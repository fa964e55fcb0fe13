import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Dataset } from '../../shared/contracts.js';
import { QueueWorker } from '../../server/queue/queue-worker.js';
import { parseQueueUrl } from '../../server/queue/queue-url.js';
import { normalizePlan } from '../../server/sweeps/plan.js';
import { POOL_TASK_FILE } from '../../server/sweeps/sweep-pool.js';
import { fixtureDataset } from '../sweeps/sweep-fixtures.js';
import { queueRunner } from './queue-helpers.js';
import { freePort, redisKeys, startRedis, type TestRedis } from '../bench/redis-server.js';

// In-process workers (QueueWorker, as `gridshake worker` runs it) against a redis-server started here. The
// heavier faults (a worker process SIGKILLed, Redis stopped mid-sweep) are in test/stress/queue-faults.test.ts.

let redis: TestRedis;
let uniform: Dataset;

beforeAll(async () => {
  redis = await startRedis();
  uniform = fixtureDataset(3000, false);
});

afterAll(async () => {
  await redis?.stop();
});

/** Keys that would mean a task was left behind: job hashes, waiting/active lists, result keys. */
async function leftovers(prefix: string): Promise<string[]> {
  const keys = await redisKeys(redis.port);
  return keys.filter((key) => key.startsWith(`gridshake:tasks:${prefix}-`) || /^gridshake:tasks:(wait|active|prioritized|delayed|failed|completed)$/.test(key) || key.includes(':result:'));
}

function worker(log: string[] = [], taskFile?: string): QueueWorker {
  return new QueueWorker({ connection: parseQueueUrl(redis.url), threads: 1, log: (line) => log.push(line), taskFile, lockMs: 5000 });
}

describe('queue faults', () => {
  it('cancels mid-sweep with the AbortError of a local sweep and leaves no task behind in Redis', async () => {
    const workers = [worker(), worker()];
    const runner = queueRunner(redis.url, 'cancel');
    try {
      const controller = new AbortController();
      let progressed = 0;
      const failure = await runner
        .runSweep(uniform, normalizePlan({ cells: [40, 50, 60, 70], placements: 2048, sims: 9, alpha: 0.5 }), {
          signal: controller.signal,
          onProgress: (p) => {
            progressed = p.done;
            controller.abort();
          },
        })
        .catch((error: unknown) => error);
      expect((failure as Error).name).toBe('AbortError');
      expect((failure as Error).message).toBe('the sweep was cancelled');
      expect(progressed).toBeGreaterThan(0);
      expect(progressed).toBeLessThan(4 * 2048);
      expect(await leftovers('cancel')).toEqual([]);
      // the queue stays usable
      const after = await runner.runSweep(uniform, normalizePlan({ cells: [100], placements: 8, sims: 2, alpha: 0.5 }));
      expect(after.rows).toHaveLength(8);
    } finally {
      await runner.destroy();
      await Promise.all(workers.map((w) => w.close()));
    }
  });

  it('fails the sweep with the worker message when a task fails on three workers', async () => {
    const folder = mkdtempSync(join(tmpdir(), 'gridshake-queue-'));
    const taskFile = join(folder, 'failing-task.cjs');
    writeFileSync(
      taskFile,
      `const poolTask = require(${JSON.stringify(POOL_TASK_FILE)});\n` +
        "module.exports = function failingTask(task) {\n" +
        "  if (task.kind === 'chunk' && task.cellSize === 13) throw new Error('engine failure at 13 m cells');\n" +
        '  return poolTask(task);\n}\n',
    );
    const logs: string[][] = [[], [], []];
    const workers = logs.map((log) => worker(log, taskFile));
    const runner = queueRunner(redis.url, 'throws');
    try {
      await expect(runner.runSweep(uniform, normalizePlan({ cells: [90, 13], placements: 16, sims: 2, alpha: 0.5 }))).rejects.toThrow('engine failure at 13 m cells');
      // each worker logs each failed try with its number (job.attemptsMade); the last log line may come a moment
      // after the server heard of the failure
      const tries = (): string[] => logs.flat().filter((line) => /engine failure at 13 m cells/.test(line));
      for (let k = 0; k < 100 && !tries().some((line) => line.includes('(try 3)')); k++) await new Promise((resolve) => setTimeout(resolve, 50));
      expect(tries().some((line) => line.includes('(try 3)')), JSON.stringify(logs)).toBe(true);
      expect(tries().length).toBeLessThanOrEqual(3);
      expect(await leftovers('throws')).toEqual([]);
    } finally {
      await runner.destroy();
      await Promise.all(workers.map((w) => w.close()));
    }
  });

  it('reports a parameter error at once, without retries', async () => {
    const log: string[] = [];
    const workers = [worker(log)];
    const runner = queueRunner(redis.url, 'parameter');
    try {
      const failure = await runner.runSweep(uniform, normalizePlan({ cells: [600], placements: 8, sims: 0, minCoverage: 1 })).catch((e) => e);
      expect((failure as { code?: string }).code).toBe('GS_ERR_PARAMETER');
      expect((failure as Error).message).toMatch(/at least 2 are needed/);
    } finally {
      await runner.destroy();
      await Promise.all(workers.map((w) => w.close()));
    }
  });

  it('waits with a message while no worker is connected, then runs when one connects', async () => {
    const notices: string[] = [];
    const runner = queueRunner(redis.url, 'waiting', { notices });
    let late: QueueWorker | null = null;
    try {
      const run = runner.runSweep(uniform, normalizePlan({ cells: [100], placements: 8, sims: 2, alpha: 0.5 }));
      for (let k = 0; k < 100 && notices.length === 0; k++) await new Promise((resolve) => setTimeout(resolve, 50));
      expect(notices[0]).toMatch(new RegExp(`waiting for a worker to connect to redis://127.0.0.1:${redis.port}/0`));
      late = worker();
      expect((await run).rows).toHaveLength(8);
      expect(notices.at(-1)).toMatch(/a worker connected/);
    } finally {
      await runner.destroy();
      await late?.close();
    }
  });

  it('a worker against an unreachable Redis says so and retries with growing waits', async () => {
    const port = await freePort();
    const log: string[] = [];
    const lonely = new QueueWorker({ connection: parseQueueUrl(`redis://127.0.0.1:${port}`), threads: 1, log: (line) => log.push(line) });
    try {
      for (let k = 0; k < 60 && log.length < 3; k++) await new Promise((resolve) => setTimeout(resolve, 100));
      const retries = log.filter((line) => line.startsWith(`cannot reach the Redis queue at redis://127.0.0.1:${port}/0`));
      expect(retries.length).toBeGreaterThanOrEqual(2);
      const waits = retries.map((line) => Number(/retrying in ([\d.]+) s/.exec(line)?.[1]));
      expect(waits[1]).toBeGreaterThan(waits[0]);
    } finally {
      await Promise.race([lonely.close(), new Promise((resolve) => setTimeout(resolve, 3000))]);
    }
  });
});
