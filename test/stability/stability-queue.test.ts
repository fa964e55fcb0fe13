/**
 * The stability surface through the Redis queue (the tasks carry the raster, `gridshake worker` processes compute
 * the stability part): summary.stability and the share rasters equal the local pool's, value for value. Starts its
 * own redis-server on a free loopback port (test/bench/redis-server.ts). Invented fixture data.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { normalizePlan } from '../../server/sweeps/plan.js';
import { SweepPool } from '../../server/sweeps/sweep-pool.js';
import { startRedis, type TestRedis } from '../bench/redis-server.js';
import { queueRunner, startWorker } from '../queue/queue-helpers.js';
import { fixtureDataset } from '../sweeps/sweep-fixtures.js';

let redis: TestRedis;
beforeAll(async () => {
  redis = await startRedis();
}, 60_000);
afterAll(async () => redis?.stop());

describe('stability surface on the Redis queue', () => {
  it('gives the local pool\'s surfaces and areas', async () => {
    const dataset = fixtureDataset(2000, true);
    const plan = normalizePlan({ cells: [80, 140], placements: 24, sims: 39, seed: 9 });
    const local = new SweepPool({ threads: 1 });
    const expected = await local.runSweep(dataset, plan, { stability: true });
    await local.destroy();
    const worker = await startWorker(redis.url, 1);
    const runner = queueRunner(redis.url, 'stability');
    try {
      const result = await runner.runSweep(dataset, plan, { stability: true });
      expect(result.summary.versions.executor).toBe('redis queue');
      expect(JSON.stringify(result.summary.stability)).toBe(JSON.stringify(expected.summary.stability));
      expect(result.stability).toHaveLength(2);
      result.stability.forEach((surface, k) => {
        expect(Buffer.from(surface.excessShare.buffer).equals(Buffer.from(expected.stability[k]!.excessShare.buffer))).toBe(true);
        expect(Buffer.from(surface.deficitShare.buffer).equals(Buffer.from(expected.stability[k]!.deficitShare.buffer))).toBe(true);
      });
      expect(expected.summary.stability!.some((entry) => entry.areas.some((area) => area.kind === 'excess'))).toBe(true);
    } finally {
      await runner.destroy();
      await worker.stop();
    }
  }, 120_000);
});
