import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { setTimeout as sleep } from 'node:timers/promises';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { FastifyInstance } from 'fastify';
import { buildApp } from '../../server/app.js';
import { DATASET_TTL_SECONDS } from '../../server/queue/queue-executor.js';
import { QueueWorker } from '../../server/queue/queue-worker.js';
import { parseQueueUrl } from '../../server/queue/queue-url.js';
import { multipartBody, smallDatasetParts } from '../reliability/http-helpers.js';
import { redisCommand, redisKeys, startRedis, type TestRedis } from '../bench/redis-server.js';

// The server with `queue` (as `serve --queue` builds it) through its HTTP API, as the page drives it: progress
// moves while a sweep runs, cancel (the page's cancel button) ends it as `cancelled` and leaves no task or result in
// Redis, the dataset waits in Redis with its expiry, and the next sweep runs to `done`.

let redis: TestRedis;
let app: FastifyInstance;
let workers: QueueWorker[];
let datasetId: string;

interface SweepRecord {
  status: string;
  error: string | null;
  progress: { done: number; total: number };
}

async function record(id: string): Promise<SweepRecord> {
  return (await app.inject({ method: 'GET', url: `/api/sweeps/${id}` })).json() as SweepRecord;
}

async function startSweep(plan: Record<string, unknown>): Promise<string> {
  const response = await app.inject({ method: 'POST', url: '/api/sweeps', payload: { datasetId, plan } });
  expect(response.statusCode, response.body).toBe(202);
  return response.json().id as string;
}

async function settled(id: string): Promise<SweepRecord> {
  let current = await record(id);
  for (let k = 0; k < 1200 && ['queued', 'running'].includes(current.status); k++) {
    await sleep(50);
    current = await record(id);
  }
  return current;
}

beforeAll(async () => {
  redis = await startRedis();
  const connection = parseQueueUrl(redis.url);
  workers = [0, 1].map(() => new QueueWorker({ connection, threads: 1, log: () => undefined, lockMs: 5000 }));
  app = await buildApp({ dataDir: join(mkdtempSync(join(tmpdir(), 'gridshake-queue-server-')), 'data'), queue: connection });
  const upload = await multipartBody(smallDatasetParts(5));
  const created = await app.inject({ method: 'POST', url: '/api/datasets', payload: Buffer.from(upload.payload), headers: { 'content-type': upload.contentType } });
  expect(created.statusCode).toBe(201);
  datasetId = created.json().id as string;
}, 60_000);

afterAll(async () => {
  await app?.close();
  await Promise.all((workers ?? []).map((worker) => worker.close()));
  await redis?.stop();
});

describe('serve with a Redis queue', () => {
  it('shows progress, cancels mid-sweep leaving nothing in Redis, then runs the next sweep', async () => {
    const id = await startSweep({ cells: [40, 50, 60, 70], placements: 2048, sims: 9, alpha: 0.5 });
    let current = await record(id);
    for (let k = 0; k < 1200 && current.progress.done === 0 && ['queued', 'running'].includes(current.status); k++) {
      await sleep(50);
      current = await record(id);
    }
    expect(current.status).toBe('running');
    expect(current.progress.done).toBeGreaterThan(0);
    const cancel = await app.inject({ method: 'POST', url: `/api/sweeps/${id}/cancel` });
    expect(cancel.statusCode).toBe(200);
    const final = await settled(id);
    expect(final.status).toBe('cancelled');
    expect(final.progress.done).toBeLessThan(final.progress.total);
    // no task, job hash or result of this server left behind (the server's tasks are named after its prefix)
    // a task a worker held at the cancel finishes first, and its result is deleted when its completion arrives: wait
    // for that (bounded) rather than read the keys in the instant the sweep is marked cancelled
    const leftover = (all: string[]): string[] =>
      all.filter((key) => /^gridshake:tasks:data-|^gridshake:tasks:(wait|active|prioritized|delayed|failed|completed)$/.test(key) || key.includes(':result:'));
    let keys = await redisKeys(redis.port);
    for (let k = 0; k < 300 && leftover(keys).length > 0; k++) {
      await sleep(50);
      keys = await redisKeys(redis.port);
    }
    expect(leftover(keys)).toEqual([]);
    // the dataset stays, with its expiry
    const datasetKeys = keys.filter((key) => /^gridshake:data-[0-9a-f]{12}:dataset:/.test(key));
    expect(datasetKeys).toHaveLength(1);
    const ttl = Number(/^:(\d+)/.exec(await redisCommand(redis.port, `TTL ${datasetKeys[0]}`))?.[1]);
    expect(ttl).toBeGreaterThan(DATASET_TTL_SECONDS - 600);
    expect(ttl).toBeLessThanOrEqual(DATASET_TTL_SECONDS);

    const next = await startSweep({ cells: [100], placements: 16, sims: 4, alpha: 0.5 });
    const done = await settled(next);
    expect(done.status, done.error ?? '').toBe('done');
    expect(done.progress.done).toBe(done.progress.total);
  }, 180_000);
});
