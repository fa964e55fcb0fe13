import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { setTimeout as sleep } from 'node:timers/promises';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { FastifyInstance } from 'fastify';
import { buildApp } from '../../server/app.js';
import { QueueWorker } from '../../server/queue/queue-worker.js';
import { parseQueueUrl } from '../../server/queue/queue-url.js';
import { multipartBody, smallDatasetParts } from '../reliability/http-helpers.js';
import { startRedis, type TestRedis } from '../bench/redis-server.js';

// `serve --queue` with Redis lost in the middle of a sweep: that sweep fails within a bounded time
// (GRIDSHAKE_QUEUE_TIMEOUT, 2 s here) with a message naming the URL and what to check; the server stays up, and a sweep started with
// `executor: "local"` runs on the server's own pool and gives the same placements.csv rows and summary.json numbers
// as a server started without a queue. A server without a queue refuses `executor: "queue"` with a coded 400.
// The executor a sweep ran on is stored with it (store migration 5): its record shows it, a rerun goes there again,
// and a server without a queue refuses to rerun a queue sweep rather than moving it to its own pool unasked.

const TIMEOUT_SECONDS = 2;
const plan = { cells: [60, 90], placements: 64, sims: 19, seed: 3, alpha: 0.05 };

interface SweepRecord {
  status: string;
  executor: string | null;
  error: string | null;
  progress: { done: number; total: number };
  summary?: Record<string, unknown> & { versions: Record<string, string> };
}

let redis: TestRedis;
let worker: QueueWorker;
let queued: FastifyInstance;
let plain: FastifyInstance;
let queuedDir: string;
/** the sweeps of the first test: one on the queue (default), one on the server's pool while Redis is down */
let queueSweepId = '';
let localSweepId = '';
const datasets = new Map<FastifyInstance, string>();

async function upload(app: FastifyInstance): Promise<void> {
  const body = await multipartBody(smallDatasetParts(9));
  const created = await app.inject({ method: 'POST', url: '/api/datasets', payload: Buffer.from(body.payload), headers: { 'content-type': body.contentType } });
  expect(created.statusCode, created.body).toBe(201);
  datasets.set(app, created.json().id as string);
}

async function start(app: FastifyInstance, executor?: string, sweepPlan: object = plan): Promise<string> {
  const response = await app.inject({ method: 'POST', url: '/api/sweeps', payload: { datasetId: datasets.get(app), plan: sweepPlan, ...(executor === undefined ? {} : { executor }) } });
  expect(response.statusCode, response.body).toBe(202);
  return response.json().id as string;
}

async function read(app: FastifyInstance, id: string): Promise<SweepRecord> {
  return (await app.inject({ method: 'GET', url: `/api/sweeps/${id}` })).json() as SweepRecord;
}

async function settle(app: FastifyInstance, id: string): Promise<SweepRecord> {
  let record = await read(app, id);
  for (let k = 0; k < 1200 && ['queued', 'running'].includes(record.status); k++) {
    await sleep(50);
    record = await read(app, id);
  }
  return record;
}

async function sweep(app: FastifyInstance, executor?: string): Promise<{ id: string; record: SweepRecord }> {
  const id = await start(app, executor);
  return { id, record: await settle(app, id) };
}

/** What must not differ between servers: the CSV rows (its first line names the sweep id) and the summary's numbers. */
async function kept(app: FastifyInstance, id: string, record: SweepRecord): Promise<{ rows: string; summary: string }> {
  const csv = (await app.inject({ method: 'GET', url: `/api/sweeps/${id}/placements.csv` })).body;
  expect(csv.split('\n').length).toBeGreaterThan(2 * 64);
  const { timings: _t, versions: _v, dataset, ...numbers } = record.summary!;
  const { id: _id, createdAt: _c, ...datasetNumbers } = dataset as Record<string, unknown>;
  return { rows: csv.slice(csv.indexOf('\n') + 1), summary: JSON.stringify({ ...numbers, dataset: datasetNumbers }) };
}

beforeAll(async () => {
  process.env.GRIDSHAKE_QUEUE_TIMEOUT = String(TIMEOUT_SECONDS);
  redis = await startRedis();
  const connection = parseQueueUrl(redis.url);
  worker = new QueueWorker({ connection, threads: 1, log: () => undefined });
  queuedDir = join(mkdtempSync(join(tmpdir(), 'gridshake-queue-local-')), 'data');
  queued = await buildApp({ dataDir: queuedDir, queue: connection, threads: 1 });
  plain = await buildApp({ dataDir: join(mkdtempSync(join(tmpdir(), 'gridshake-plain-')), 'data'), threads: 1 });
  await upload(queued);
  await upload(plain);
}, 60_000);

afterAll(async () => {
  delete process.env.GRIDSHAKE_QUEUE_TIMEOUT;
  await queued?.close();
  await plain?.close();
  // the worker lost its Redis with the test's sweep: it retries in the background until closed
  await Promise.race([worker?.close(), sleep(5000)]);
  await redis?.stop();
});

describe('serve --queue with Redis down', () => {
  it('fails the queue sweep that lost Redis midway in bounded time naming the URL, then runs a local sweep identical to a plain server', async () => {
    // the queue works first (the server is connected when Redis goes away)
    const before = await sweep(queued);
    expect(before.record.status, before.record.error ?? '').toBe('done');
    expect(before.record.summary?.versions.executor).toBe('redis queue');

    // a long sweep on the queue: Redis stops once the worker has finished some of its tasks
    const long = await start(queued, undefined, { cells: [50, 70], placements: 16384, sims: 9, alpha: 0.5 });
    for (let k = 0; k < 1200 && (await read(queued, long)).progress.done === 0; k++) await sleep(50);
    expect((await read(queued, long)).status).toBe('running');
    const stoppedAt = Date.now();
    await redis.stop();
    const lost = await settle(queued, long);
    const seconds = (Date.now() - stoppedAt) / 1000;
    expect(lost.status).toBe('failed');
    expect(lost.progress.done).toBeLessThan(lost.progress.total);
    expect(lost.error).toContain(`the Redis queue at redis://127.0.0.1:${redis.port}/0 did not answer for ${TIMEOUT_SECONDS} s`);
    expect(lost.error).toContain('check that Redis runs there');
    // bounded: the timeout plus the watchdog's tick and the server's bookkeeping
    expect(seconds).toBeLessThan(TIMEOUT_SECONDS + 8);

    // the server is up and its own pool runs the sweep, while Redis is still down
    expect((await queued.inject({ method: 'GET', url: '/api/health' })).statusCode).toBe(200);
    const local = await sweep(queued, 'local');
    expect(local.record.status, local.record.error ?? '').toBe('done');
    expect(local.record.summary?.versions.executor).toBe('local pool');
    const reference = await sweep(plain);
    expect(reference.record.status, reference.record.error ?? '').toBe('done');
    expect(await kept(queued, local.id, local.record)).toEqual(await kept(plain, reference.id, reference.record));
    // and the queue result was the same numbers too
    expect(await kept(queued, before.id, before.record)).toEqual(await kept(plain, reference.id, reference.record));
    queueSweepId = before.id;
    localSweepId = local.id;
  }, 120_000);

  it('records the executor with each sweep and reruns a sweep on the executor it used', async () => {
    expect(queueSweepId).not.toBe('');
    // the records: the default of a --queue server is the queue, of a plain server its own pool
    expect((await read(queued, queueSweepId)).executor).toBe('queue');
    expect((await read(queued, localSweepId)).executor).toBe('local');
    const listed = (await queued.inject({ method: 'GET', url: '/api/sweeps' })).json() as { id: string; executor: string | null }[];
    expect(listed.find((sweep) => sweep.id === queueSweepId)?.executor).toBe('queue');
    expect(listed.find((sweep) => sweep.id === localSweepId)?.executor).toBe('local');
    const plainSweep = await sweep(plain);
    expect(plainSweep.record.executor).toBe('local');

    // Redis is still down: the rerun of the local sweep runs on the server's pool to the end, the same numbers
    const localRerun = await queued.inject({ method: 'POST', url: `/api/sweeps/${localSweepId}/rerun` });
    expect(localRerun.statusCode, localRerun.body).toBe(202);
    const localAgain = await settle(queued, localRerun.json().id as string);
    expect(localAgain.status, localAgain.error ?? '').toBe('done');
    expect(localAgain.executor).toBe('local');
    expect(localAgain.summary?.versions.executor).toBe('local pool');
    expect(await kept(queued, localRerun.json().id as string, localAgain)).toEqual(await kept(plain, plainSweep.id, plainSweep.record));
    // the rerun of the queue sweep goes to the queue (not to this machine): it fails naming the Redis URL
    const queueRerun = await queued.inject({ method: 'POST', url: `/api/sweeps/${queueSweepId}/rerun` });
    expect(queueRerun.statusCode, queueRerun.body).toBe(202);
    const queueAgain = await settle(queued, queueRerun.json().id as string);
    expect(queueAgain.executor).toBe('queue');
    expect(queueAgain.status).toBe('failed');
    expect(queueAgain.error).toContain(`the Redis queue at redis://127.0.0.1:${redis.port}/0`);

    // the same data folder served without a queue: the queue sweep's rerun is refused, the local one runs
    await queued.close();
    queued = await buildApp({ dataDir: queuedDir, threads: 1 });
    const refused = await queued.inject({ method: 'POST', url: `/api/sweeps/${queueSweepId}/rerun` });
    expect(refused.statusCode).toBe(400);
    expect(refused.json().code).toBe('GS_ERR_PARAMETER');
    expect(refused.json().message).toContain('ran on a Redis queue and this server sends no sweeps to one');
    const allowed = await queued.inject({ method: 'POST', url: `/api/sweeps/${localSweepId}/rerun` });
    expect(allowed.statusCode, allowed.body).toBe(202);
    expect((await settle(queued, allowed.json().id as string)).status).toBe('done');
  }, 120_000);

  it('refuses executor "queue" on a server without a queue, and an unknown executor, with coded 400s', async () => {
    const noQueue = await plain.inject({ method: 'POST', url: '/api/sweeps', payload: { datasetId: datasets.get(plain), plan, executor: 'queue' } });
    expect(noQueue.statusCode).toBe(400);
    expect(noQueue.json().code).toBe('GS_ERR_PARAMETER');
    expect(noQueue.json().message).toContain('this server sends no sweeps to a Redis queue');
    const unknown = await plain.inject({ method: 'POST', url: '/api/sweeps', payload: { datasetId: datasets.get(plain), plan, executor: 'cluster' } });
    expect(unknown.statusCode).toBe(400);
    expect(unknown.json().code).toBe('GS_ERR_VALIDATION');
  });
});
