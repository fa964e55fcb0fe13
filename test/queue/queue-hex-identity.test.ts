import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Dataset } from '../../shared/contracts.js';
import { normalizePlan } from '../../server/sweeps/plan.js';
import { SweepPool } from '../../server/sweeps/sweep-pool.js';
import { fixtureDataset } from '../sweeps/sweep-fixtures.js';
import { keptFiles, queueRunner, startWorker, type WorkerProcess } from './queue-helpers.js';
import { startRedis, type TestRedis } from '../bench/redis-server.js';

// Hexagonal cells through the Redis queue: a `shape: 'hex'` sweep, and one of both shapes side by side, give the
// local pool's placements.csv and summary.json byte for byte (timings and versions aside), as the square sweeps of
// identity-suite.ts do. The oracle is the local pool (the same engine run in-process); the tasks cross Redis as
// parameters, with the shape named only for hexagons (server/queue/task-codec.ts).

let redis: TestRedis;
let local: SweepPool;
let clustered: Dataset;
let uniform: Dataset;
const workers: WorkerProcess[] = [];

beforeAll(async () => {
  redis = await startRedis();
  local = new SweepPool({ threads: 2 });
  clustered = fixtureDataset(2000, true);
  uniform = fixtureDataset(3000, false);
  // two worker processes, so that tasks finish in an order the local pool does not follow
  workers.push(await startWorker(redis.url, 1), await startWorker(redis.url, 1));
}, 60_000);

afterAll(async () => {
  await Promise.all(workers.map((worker) => worker.stop()));
  await local?.destroy();
  await redis?.stop();
});

describe('hexagon sweeps on the Redis queue', () => {
  const plans = [
    ['hex', normalizePlan({ cells: [70, 120], placements: 64, sims: 19, seed: 11, shape: 'hex' })],
    ['square and hex', normalizePlan({ cells: [90], placements: 48, sims: 9, alpha: 0.2, seed: 4, minCoverage: 0.5, shape: ['square', 'hex'] })],
  ] as const;
  for (const [name, plan] of plans) {
    it(`give the local pool's placements.csv and summary.json (${name})`, async () => {
      const runner = queueRunner(redis.url, `hex-${name.replace(/ /g, '-')}`);
      try {
        for (const dataset of [clustered, uniform]) {
          const expected = keptFiles(await local.runSweep(dataset, plan));
          const progress: number[] = [];
          const result = await runner.runSweep(dataset, plan, { onProgress: (p) => progress.push(p.done) });
          const files = keptFiles(result);
          expect(files.csv).toBe(expected.csv);
          expect(files.summary).toBe(expected.summary);
          expect(result.summary.versions.executor).toBe('redis queue');
          // the hexagon rows are there and name their shape
          expect(result.rows.some((row) => row.shape === 'hex')).toBe(true);
          expect(progress.at(-1)).toBe(result.rows.length);
        }
      } finally {
        await runner.destroy();
      }
    }, 120_000);
  }
});
