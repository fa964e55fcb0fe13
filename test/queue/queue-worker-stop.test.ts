import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { normalizePlan } from '../../server/sweeps/plan.js';
import { SweepPool } from '../../server/sweeps/sweep-pool.js';
import { fixtureDataset } from '../sweeps/sweep-fixtures.js';
import { keptFiles, queueRunner, startWorker, type WorkerProcess } from './queue-helpers.js';
import { startRedis, type TestRedis } from '../bench/redis-server.js';

// `gridshake worker` stopped with SIGTERM in the middle of a sweep finishes the task in hand (its result reaches
// the server after the signal), exits with code 0, and a worker started later finishes the sweep with the local
// pool's results. The lock is the default 30 s, so a task abandoned at the signal would hold the sweep for 30 s
// or more instead of being finished.

let redis: TestRedis;
const workers: WorkerProcess[] = [];

beforeAll(async () => {
  redis = await startRedis();
}, 60_000);

afterAll(async () => {
  await Promise.all(workers.map((worker) => worker.stop('SIGKILL')));
  await redis?.stop();
});

describe('gridshake worker and SIGTERM', () => {
  it('finishes the task in hand, exits 0, and the sweep ends with the local results', async () => {
    const dataset = fixtureDataset(4000, true, 9);
    const plan = normalizePlan({ cells: [50, 70, 90], placements: 256, sims: 19, seed: 2 });
    const local = new SweepPool({ threads: 2 });
    const expected = keptFiles(await local.runSweep(dataset, plan));
    await local.destroy();
    const first = await startWorker(redis.url, 1);
    workers.push(first);
    const runner = queueRunner(redis.url, 'sigterm');
    let doneAtSignal = -1;
    let doneAtExit = -1;
    let done = 0;
    try {
      const result = runner.runSweep(dataset, plan, {
        onProgress: (progress) => {
          done = progress.done;
          if (doneAtSignal < 0 && done > 0) {
            doneAtSignal = done;
            first.child.kill('SIGTERM');
          }
        },
      });
      const exitCode = await new Promise<number | null>((resolve) => first.child.once('exit', resolve));
      doneAtExit = done;
      expect(exitCode, first.output()).toBe(0);
      expect(first.output()).toMatch(/SIGTERM: finishing the tasks in hand/);
      const taken = Number(/stopped after (\d+) tasks/.exec(first.output())?.[1]);
      const startedAt = Date.now();
      workers.push(await startWorker(redis.url, 1));
      const files = keptFiles(await result);
      expect(files.csv).toBe(expected.csv);
      expect(files.summary).toBe(expected.summary);
      // the task in hand at the signal was finished: progress moved on before the worker exited, and the sweep did
      // not wait for a 30 s lock to expire
      expect(doneAtSignal).toBeGreaterThan(0);
      expect(doneAtExit).toBeGreaterThan(doneAtSignal);
      expect(taken).toBeGreaterThanOrEqual(2);
      expect(Date.now() - startedAt).toBeLessThan(28_000);
    } finally {
      await runner.destroy();
    }
  }, 180_000);
});
