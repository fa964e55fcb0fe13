/**
 * The identity suite: local pool vs Redis queue with the given numbers of worker processes, on a clustered and a
 * CSR data set with simulations. test/queue/queue-identity.test.ts runs it with 1 worker process, the stress suite
 * with 2 and 3.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Dataset } from '../../shared/contracts.js';
import { normalizePlan } from '../../server/sweeps/plan.js';
import { SweepPool } from '../../server/sweeps/sweep-pool.js';
import { fixtureDataset } from '../sweeps/sweep-fixtures.js';
import { keptFiles, queueRunner, startWorker, type WorkerProcess } from './queue-helpers.js';
import { redisKeys, startRedis, type TestRedis } from '../bench/redis-server.js';

// Runs the built CLI (npm test builds first) against a redis-server started here (Debian's, installed by .ci/run).
// The oracle is the local pool: the queue must give the same placements.csv and summary.json numbers, byte for byte.

export function identitySuite(workerCounts: number[]): void {
  let redis: TestRedis;
  let local: SweepPool;
  let clustered: Dataset;
  let uniform: Dataset;
  const plan = normalizePlan({ cells: [60, 110], placements: 96, sims: 19, seed: 5 });
  const expected = new Map<string, ReturnType<typeof keptFiles>>();

  beforeAll(async () => {
    redis = await startRedis();
    local = new SweepPool({ threads: 2 });
    clustered = fixtureDataset(2000, true);
    uniform = fixtureDataset(3000, false);
    expected.set('clustered', keptFiles(await local.runSweep(clustered, plan)));
    expected.set('uniform', keptFiles(await local.runSweep(uniform, plan)));
  }, 60_000);

  afterAll(async () => {
    await local?.destroy();
    await redis?.stop();
  });

  describe('sweeps on the Redis queue', () => {
    for (const workerCount of workerCounts) {
      it(`give the local pool's placements.csv and summary.json with ${workerCount} worker process(es)`, async () => {
        const workers: WorkerProcess[] = [];
        const notices: string[] = [];
        const runner = queueRunner(redis.url, `identity-${workerCount}`, { notices });
        try {
          for (let k = 0; k < workerCount; k++) workers.push(await startWorker(redis.url, 1));
          for (const [name, dataset] of [['clustered', clustered], ['uniform', uniform]] as const) {
            const progress: number[] = [];
            const result = await runner.runSweep(dataset, plan, { onProgress: (p) => progress.push(p.done) });
            const files = keptFiles(result);
            expect(files.csv).toBe(expected.get(name)?.csv);
            expect(files.summary).toBe(expected.get(name)?.summary);
            expect(result.summary.versions.executor).toBe('redis queue');
            expect(progress.at(-1)).toBe(2 * 96);
          }
          expect(notices).toEqual([]);
        } finally {
          await runner.destroy();
          await Promise.all(workers.map((worker) => worker.stop()));
        }
        for (const worker of workers) expect(worker.child.exitCode).toBe(0);
        // every worker took part when there were several
        const counts = workers.map((worker) => Number(/stopped after (\d+) tasks/.exec(worker.output())?.[1] ?? -1));
        expect(counts.reduce((sum, count) => sum + count, 0)).toBeGreaterThanOrEqual(8);
        // no task left behind: no job hash, no waiting or active list (only the queue's metadata, its event stream and the dataset)
        const keys = await redisKeys(redis.port);
        expect(keys.filter((key) => /^gridshake:tasks:(wait|active|paused|prioritized|delayed|failed|completed)$|^gridshake:tasks:identity/.test(key))).toEqual([]);
        expect(keys.filter((key) => key.includes(':result:'))).toEqual([]);
        expect(keys.filter((key) => key.startsWith(`gridshake:identity-${workerCount}:dataset:`))).toHaveLength(2);
      }, 120_000);
    }
  });
}
