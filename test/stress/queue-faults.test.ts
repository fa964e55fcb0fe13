import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import type { FastifyInstance } from 'fastify';
import { buildApp } from '../../server/app.js';
import { parseQueueUrl } from '../../server/queue/queue-url.js';
import { normalizePlan } from '../../server/sweeps/plan.js';
import { SweepPool } from '../../server/sweeps/sweep-pool.js';
import { startRedis, type TestRedis } from '../bench/redis-server.js';
import { keptFiles, queueRunner, startWorker, type WorkerProcess } from '../queue/queue-helpers.js';
import { multipartBody, smallDatasetParts } from '../reliability/http-helpers.js';
import { fixtureDataset } from '../sweeps/sweep-fixtures.js';

// Faults of the Redis queue with real `gridshake worker` processes and a redis-server started here: a worker
// SIGKILLed in the middle of a sweep (its task is taken again after the stall check, results identical to the local
// pool), and Redis stopped in the middle of a server's sweep (the sweep fails in bounded time naming the URL, the
// server keeps answering, and after Redis is back the workers reconnect and the next sweep finishes).

const started: { redis: TestRedis[]; workers: WorkerProcess[]; apps: FastifyInstance[] } = { redis: [], workers: [], apps: [] };

afterAll(async () => {
  for (const app of started.apps) await app.close();
  await Promise.all(started.workers.map((worker) => worker.stop('SIGKILL')));
  await Promise.all(started.redis.map((redis) => redis.stop()));
});

describe('queue faults with worker processes', () => {
  it('finishes with the local results when a worker is SIGKILLed mid-sweep', async () => {
    const redis = await startRedis();
    started.redis.push(redis);
    const dataset = fixtureDataset(4000, true, 31);
    const plan = normalizePlan({ cells: [40, 60, 90], placements: 512, sims: 19, seed: 8 });
    const local = new SweepPool({ threads: 2 });
    const expected = keptFiles(await local.runSweep(dataset, plan));
    await local.destroy();
    // a 2 s lock: a silent worker's task is taken again after 2 to 4 s
    const env = { GRIDSHAKE_WORKER_LOCK_SECONDS: '2' };
    const victim = await startWorker(redis.url, 1, env);
    const survivor = await startWorker(redis.url, 1, env);
    started.workers.push(victim, survivor);
    const runner = queueRunner(redis.url, 'killed');
    try {
      let killedAt = 0;
      const result = await runner.runSweep(dataset, plan, {
        onProgress: (progress) => {
          if (killedAt === 0 && progress.done >= 64) {
            killedAt = progress.done;
            victim.child.kill('SIGKILL');
          }
        },
      });
      expect(killedAt).toBeGreaterThan(0);
      expect(victim.child.signalCode ?? 'SIGKILL').toBe('SIGKILL');
      const files = keptFiles(result);
      expect(files.csv).toBe(expected.csv);
      expect(files.summary).toBe(expected.summary);
    } finally {
      await runner.destroy();
      await survivor.stop();
    }
  });

  it('fails a server sweep in bounded time naming the URL when Redis stops, keeps serving, and recovers', async () => {
    const redis = await startRedis();
    started.redis.push(redis);
    const worker = await startWorker(redis.url, 1);
    started.workers.push(worker);
    process.env.GRIDSHAKE_QUEUE_TIMEOUT = '3';
    const app = await buildApp({ dataDir: join(mkdtempSync(join(tmpdir(), 'gridshake-queue-server-')), 'data'), queue: parseQueueUrl(redis.url) });
    delete process.env.GRIDSHAKE_QUEUE_TIMEOUT;
    started.apps.push(app);
    const upload = await multipartBody(smallDatasetParts(7));
    const created = await app.inject({ method: 'POST', url: '/api/datasets', payload: Buffer.from(upload.payload), headers: { 'content-type': upload.contentType } });
    expect(created.statusCode).toBe(201);
    const datasetId = created.json().id as string;
    const startSweep = async (placements: number): Promise<string> => {
      const response = await app.inject({ method: 'POST', url: '/api/sweeps', payload: { datasetId, plan: { cells: [50, 70], placements, sims: 9, alpha: 0.5 } } });
      expect(response.statusCode).toBe(202);
      return response.json().id as string;
    };
    const record = async (id: string): Promise<{ status: string; error: string | null; progress: { done: number } }> =>
      (await app.inject({ method: 'GET', url: `/api/sweeps/${id}` })).json();

    const id = await startSweep(16384);
    for (let k = 0; k < 600 && (await record(id)).progress.done === 0; k++) await new Promise((resolve) => setTimeout(resolve, 50));
    expect((await record(id)).status).toBe('running');
    const stoppedAt = Date.now();
    await redis.stop();
    let final = await record(id);
    while (['queued', 'running'].includes(final.status) && Date.now() - stoppedAt < 30_000) {
      await new Promise((resolve) => setTimeout(resolve, 100));
      final = await record(id);
    }
    expect(final.status).toBe('failed');
    expect(final.error).toMatch(new RegExp(`the Redis queue at redis://127.0.0.1:${redis.port}/0 did not answer for 3 s`));
    expect(Date.now() - stoppedAt).toBeLessThan(15_000);
    expect((await app.inject({ method: 'GET', url: '/api/health' })).statusCode).toBe(200);

    // Redis back on the same port: the worker reconnects by itself (backoff) and the next sweep finishes
    started.redis.push(await startRedis(redis.port));
    const next = await startSweep(64);
    let after = await record(next);
    for (let k = 0; k < 600 && ['queued', 'running'].includes(after.status); k++) {
      await new Promise((resolve) => setTimeout(resolve, 100));
      after = await record(next);
    }
    expect(after.status, after.error ?? '').toBe('done');
    expect(worker.output()).toMatch(/cannot reach the Redis queue at .*retrying in/);
  });
});
