import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { FastifyInstance } from 'fastify';
import { buildApp } from '../../server/app.js';
import { POOL_TASK_FILE, SweepPool } from '../../server/sweeps/sweep-pool.js';
import { multipartBody, smallDatasetParts } from '../reliability/http-helpers.js';

// A worker that crashes (its thread exits) or runs out of memory (over the pool's resourceLimits) fails only the
// sweep it worked for, with a clear message; the server keeps answering and the next sweeps finish. The faults are
// provoked deterministically by a task file that wraps the real one and misbehaves for two marked cell sizes.
const CRASH_CELL = 123.25;
const MEMORY_CELL = 123.5;

let folder: string;
let app: FastifyInstance;
let datasetId: string;

const faultyTask = (realTask: string): string => `
const poolTask = require(${JSON.stringify(realTask)});
module.exports = function faultyTask(task) {
  if (task.kind === 'chunk' && task.cellSize === ${CRASH_CELL}) process.exit(3);
  if (task.kind === 'chunk' && task.cellSize === ${MEMORY_CELL}) {
    const hoard = [];
    for (;;) hoard.push(new Array(1e5).fill({ wasted: hoard.length }));
  }
  return poolTask(task);
}
`;

async function startSweep(cells: number[]): Promise<string> {
  const response = await app.inject({ method: 'POST', url: '/api/sweeps', payload: { datasetId, plan: { cells, placements: 8, sims: 4, alpha: 0.2 } } });
  expect(response.statusCode).toBe(202);
  return response.json().id as string;
}

async function finished(id: string): Promise<{ status: string; error: string | null }> {
  for (let k = 0; k < 1200; k += 1) {
    const record = (await app.inject({ method: 'GET', url: `/api/sweeps/${id}` })).json() as { status: string; error: string | null };
    if (!['queued', 'running'].includes(record.status)) return record;
    await new Promise((resolve) => setTimeout(resolve, 50));
  }
  throw new Error(`sweep ${id} did not finish`);
}

beforeAll(async () => {
  folder = mkdtempSync(join(tmpdir(), 'gridshake-worker-faults-'));
  const taskFile = join(folder, 'faulty-task.cjs');
  writeFileSync(taskFile, faultyTask(POOL_TASK_FILE));
  const runner = new SweepPool({ threads: 2, filename: taskFile, resourceLimits: { maxOldGenerationSizeMb: 48, maxYoungGenerationSizeMb: 8 } });
  app = await buildApp({ dataDir: join(folder, 'data'), runner });
  const upload = await multipartBody(smallDatasetParts(11));
  // fastify.inject sends Buffers and strings as raw bodies, not bare Uint8Arrays
  const response = await app.inject({ method: 'POST', url: '/api/datasets', payload: Buffer.from(upload.payload), headers: { 'content-type': upload.contentType } });
  expect(response.statusCode).toBe(201);
  datasetId = response.json().id as string;
});

afterAll(async () => {
  await app?.close();
  rmSync(folder, { recursive: true, force: true });
});

describe('worker faults', () => {
  it('a crashing worker and a worker out of memory fail only their sweeps; the others finish', async () => {
    const before = await startSweep([150]);
    const crash = await startSweep([150, CRASH_CELL]);
    const between = await startSweep([200]);
    const memory = await startSweep([MEMORY_CELL]);
    const after = await startSweep([150, 250]);
    const results = await Promise.all([before, crash, between, memory, after].map(finished));
    console.log(`worker faults: crash -> ${results[1]!.status} (${results[1]!.error}); out of memory -> ${results[3]!.status} (${results[3]!.error})`);
    expect(results.map((r) => r.status)).toEqual(['done', 'failed', 'done', 'failed', 'done']);
    expect(results[1]!.error).toMatch(/exit|worker/i);
    expect(results[3]!.error).toMatch(/memory|ERR_WORKER_OUT_OF_MEMORY/i);
    const health = await app.inject({ method: 'GET', url: '/api/health' });
    expect(health.statusCode).toBe(200);
    const rows = await app.inject({ method: 'GET', url: `/api/sweeps/${after}/placements.json` });
    expect(rows.statusCode).toBe(200);
    console.log('worker faults: 2 faulty sweeps failed with a message, 3 sweeps around them done, server answering');
  });
});
