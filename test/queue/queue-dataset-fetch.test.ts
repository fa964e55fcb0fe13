import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Redis } from 'ioredis';
import type { Dataset } from '../../shared/contracts.js';
import { normalizePlan } from '../../server/sweeps/plan.js';
import { estimateSweep } from '../../server/sweeps/sweep-budget.js';
import { fixtureDataset } from '../sweeps/sweep-fixtures.js';
import { queueRunner, startWorker, type WorkerProcess } from './queue-helpers.js';
import { startRedis, type TestRedis } from '../bench/redis-server.js';

// "The dataset's points travel once per dataset": Redis's own MONITOR stream (every command any client sends, seen
// from the Redis side, not from a counter in the code under test) counts the reads of each dataset key while one
// `gridshake worker` process with two threads runs several sweeps of many tasks. Each dataset is read exactly once,
// however many sweeps and tasks use it; the positive control shows the count is live: once a third dataset pushed
// the first out of the worker's cache (it keeps the last two), the first is read a second time.

let redis: TestRedis;
let monitor: Redis;
let worker: WorkerProcess;
const reads = new Map<string, number>();
const writes = new Map<string, number>();

const plan = (seed: number) => normalizePlan({ cells: [100, 150], placements: 256, sims: 4, seed, alpha: 0.5 });

beforeAll(async () => {
  redis = await startRedis();
  monitor = await new Redis({ host: '127.0.0.1', port: redis.port, lazyConnect: true }).monitor();
  monitor.on('monitor', (_time: string, args: string[]) => {
    const [command, key] = [String(args[0]).toLowerCase(), String(args[1])];
    if (!/^gridshake:[^:]+:dataset:/.test(key)) return;
    if (command === 'get') reads.set(key, (reads.get(key) ?? 0) + 1);
    if (command === 'set') writes.set(key, (writes.get(key) ?? 0) + 1);
  });
  worker = await startWorker(redis.url, 2);
}, 60_000);

afterAll(async () => {
  await worker?.stop();
  monitor?.disconnect();
  await redis?.stop();
});

describe("a worker's dataset cache", () => {
  it('reads each dataset from Redis once across several sweeps and many tasks', async () => {
    const a = fixtureDataset(1500, false, 11);
    const b = fixtureDataset(1600, true, 12);
    const c = fixtureDataset(1700, false, 13);
    const runner = queueRunner(redis.url, 'fetch');
    let tasks = 0;
    const sweep = async (dataset: Dataset, seed: number): Promise<void> => {
      const result = await runner.runSweep(dataset, plan(seed));
      expect(result.rows).toHaveLength(2 * 256);
      tasks += estimateSweep(plan(seed), dataset.inside.length).tasks;
    };
    try {
      await sweep(a, 1);
      await sweep(a, 2);
      await sweep(b, 3);
      await sweep(a, 4);
      await sweep(b, 5);
      // every sweep was many tasks, all taken by the one worker process (two threads at once)
      expect(tasks).toBeGreaterThanOrEqual(5 * 8);
      const [keyA, keyB] = [...writes.keys()];
      // MONITOR delivers asynchronously: wait until the stream has caught up with the last sweep's dataset refresh
      await expect.poll(() => reads.size).toBe(2);
      // the server uploaded each dataset once (later sweeps only refresh its expiry), the worker read each once
      expect(writes.get(keyA)).toBe(1);
      expect(writes.get(keyB)).toBe(1);
      expect(reads.get(keyA)).toBe(1);
      expect(reads.get(keyB)).toBe(1);

      // positive control: a third dataset evicts the oldest (a) from the worker's two, so a is read again
      await sweep(c, 6);
      await sweep(a, 7);
      await expect.poll(() => reads.get(keyA)).toBe(2);
      expect(reads.get(keyB)).toBe(1);
      expect(reads.get([...writes.keys()][2])).toBe(1);
    } finally {
      await runner.destroy();
    }
  }, 180_000);
});
