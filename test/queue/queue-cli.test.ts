import { spawn } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CLI, startWorker, type WorkerProcess } from './queue-helpers.js';
import { redisKeys, startRedis, type TestRedis } from '../bench/redis-server.js';
import { AREA_RING, RESERVOIR_RING, pointsCsv, polygonGeoJson } from '../sweeps/sweep-fixtures.js';

// `gridshake sweep --queue URL` (and GRIDSHAKE_QUEUE) as a user runs it, against the same command without a queue:
// the same placements.csv byte for byte and the same summary.json apart from `timings` and `versions`, the same
// progress line, and the waiting message while no worker is connected. Squares and hexagons (`--shape hex`).

let redis: TestRedis;
let folder: string;
const workers: WorkerProcess[] = [];

interface Outcome {
  code: number | null;
  stderr: string;
  csv: string;
  summary: string;
}

/** Runs `gridshake sweep` and, when `whenWaiting` is given, calls it once the command says it waits for a worker. */
async function sweep(args: string[], out: string, env: Record<string, string> = {}, whenWaiting?: () => Promise<void>): Promise<Outcome> {
  const child = spawn(process.execPath, [CLI, 'sweep', ...args, '--out', out], { env: { ...process.env, GRIDSHAKE_QUEUE: '', ...env }, stdio: ['ignore', 'ignore', 'pipe'] });
  let stderr = '';
  let told = false;
  child.stderr?.on('data', (data: Buffer) => {
    stderr += data.toString('utf8');
    if (!told && whenWaiting !== undefined && /waiting for a worker to connect/.test(stderr)) {
      told = true;
      void whenWaiting();
    }
  });
  const code = await new Promise<number | null>((resolve) => child.once('exit', resolve));
  if (code !== 0) return { code, stderr, csv: '', summary: '' };
  const { timings: _timings, versions, ...numbers } = JSON.parse(readFileSync(join(out, 'summary.json'), 'utf8')) as Record<string, unknown> & { timings: unknown; versions: { executor: string } };
  expect(versions.executor).toBe(env.GRIDSHAKE_QUEUE || args.includes('--queue') ? 'redis queue' : 'local pool');
  return { code, stderr, csv: readFileSync(join(out, 'placements.csv'), 'utf8'), summary: JSON.stringify(numbers) };
}

/** The last state of the progress bar ("[###] 100 % 80/80 placements"), without the time left. */
function lastProgress(stderr: string): string | undefined {
  return stderr.match(/\[[#.]+\] \d+ % \d+\/\d+ placements/g)?.at(-1);
}

beforeAll(async () => {
  redis = await startRedis();
  folder = mkdtempSync(join(tmpdir(), 'gridshake-queue-cli-'));
  writeFileSync(join(folder, 'incidents.csv'), pointsCsv(1500, true, 5));
  writeFileSync(join(folder, 'district.geojson'), polygonGeoJson(AREA_RING));
  writeFileSync(join(folder, 'reservoir.geojson'), polygonGeoJson(RESERVOIR_RING));
}, 60_000);

afterAll(async () => {
  await Promise.all(workers.map((worker) => worker.stop()));
  await redis?.stop();
});

describe('gridshake sweep --queue (compiled command)', () => {
  const inputs = (): string[] => [
    '--points', join(folder, 'incidents.csv'), '--area', join(folder, 'district.geojson'), '--no-data', join(folder, 'reservoir.geojson'),
    '--crs', 'planar', '--placements', '40', '--sims', '19', '--seed', '4',
  ];

  it('waits with a message until a worker connects, then writes the local files (GRIDSHAKE_QUEUE, squares)', async () => {
    const args = [...inputs(), '--cells', '80,140'];
    const local = await sweep([...args, '--threads', '2'], join(folder, 'local-square'));
    expect(local.code, local.stderr).toBe(0);
    const queued = await sweep(args, join(folder, 'queue-square'), { GRIDSHAKE_QUEUE: redis.url }, async () => {
      workers.push(await startWorker(redis.url, 1));
    });
    expect(queued.code, queued.stderr).toBe(0);
    expect(queued.stderr).toMatch(new RegExp(`gridshake sweep: waiting for a worker to connect to redis://127.0.0.1:${redis.port}/0`));
    expect(queued.stderr).toMatch(/gridshake sweep: a worker connected/);
    expect(queued.csv).toBe(local.csv);
    expect(queued.summary).toBe(local.summary);
    expect(lastProgress(queued.stderr)).toBe('[##############################] 100 % 80/80 placements');
    expect(lastProgress(queued.stderr)).toBe(lastProgress(local.stderr));
  }, 180_000);

  it('--queue with --shape hex writes the local files', async () => {
    if (workers.length === 0) workers.push(await startWorker(redis.url, 1));
    const args = [...inputs(), '--cells', '90', '--shape', 'hex'];
    const local = await sweep([...args, '--threads', '2'], join(folder, 'local-hex'));
    expect(local.code, local.stderr).toBe(0);
    const queued = await sweep([...args, '--queue', redis.url], join(folder, 'queue-hex'));
    expect(queued.code, queued.stderr).toBe(0);
    expect(queued.csv).toBe(local.csv);
    expect(queued.csv).toMatch(/hex cells/);
    expect(queued.summary).toBe(local.summary);
    expect(lastProgress(queued.stderr)).toBe(lastProgress(local.stderr));
    // no task or result left behind in Redis
    const keys = await redisKeys(redis.port);
    expect(keys.filter((key) => /^gridshake:tasks:(wait|active|prioritized|delayed|failed|completed)$/.test(key) || key.includes(':result:'))).toEqual([]);
  }, 180_000);
});
