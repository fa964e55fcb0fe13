import Database from 'better-sqlite3';
import { createHash } from 'node:crypto';
import { mkdtempSync, rmSync } from 'node:fs';
import { connect } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { multipartBody, smallDatasetParts, type UploadPart } from '../reliability/http-helpers.js';
import { startServe, type ServeProcess } from './serve-process.js';

// Hard kills of a real server process (SIGKILL) during sweeps and during dataset uploads, then a restart on the same
// data folder: the database opens and passes SQLite's integrity check, every finished dataset and sweep gives
// byte-identical exports (SHA-256 of summary JSON, geometry, placements CSV and JSON), the sweep that was running is
// `interrupted`, and an upload cut short left nothing behind. Bounded: KILLS kills or MAX_SECONDS, whichever first.
const KILLS = 20;
const MAX_SECONDS = 150;

const dataDir = mkdtempSync(join(tmpdir(), 'gridshake-faults-'));
let server: ServeProcess | null = null;

afterAll(async () => {
  if (server) await server.kill('SIGKILL');
  rmSync(dataDir, { recursive: true, force: true });
});

const sha = (text: string): string => createHash('sha256').update(text).digest('hex');
const start = (): Promise<ServeProcess> => startServe(['--data', dataDir, '--threads', '2', '--no-demo']);

async function text(path: string): Promise<string> {
  const response = await fetch(`${server!.base}${path}`);
  if (response.status !== 200) throw new Error(`${path}: ${response.status} ${await response.text()}`);
  return response.text();
}

async function post(path: string, body: unknown): Promise<{ id: string }> {
  const response = await fetch(`${server!.base}${path}`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify(body) });
  if (response.status !== 202) throw new Error(`${path}: ${response.status} ${await response.text()}`);
  return (await response.json()) as { id: string };
}

async function upload(parts: UploadPart[]): Promise<{ id: string; n: number }> {
  const body = await multipartBody(parts);
  const response = await fetch(`${server!.base}/api/datasets`, { method: 'POST', body: body.payload, headers: { 'content-type': body.contentType } });
  if (response.status !== 201) throw new Error(`upload: ${response.status} ${await response.text()}`);
  return (await response.json()) as { id: string; n: number };
}

async function sweepRecord(id: string): Promise<{ status: string; progress: { done: number }; error: string | null }> {
  return JSON.parse(await text(`/api/sweeps/${id}`)) as { status: string; progress: { done: number }; error: string | null };
}

async function waitFor(id: string, wanted: (record: Awaited<ReturnType<typeof sweepRecord>>) => boolean, timeoutMs = 60_000): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  while (!wanted(await sweepRecord(id))) {
    if (Date.now() > deadline) throw new Error(`sweep ${id} not in the wanted state after ${timeoutMs} ms`);
    await new Promise((resolve) => setTimeout(resolve, 20));
  }
}

/** Checksums of everything a finished dataset or sweep exports. */
async function datasetDigest(id: string): Promise<string> {
  return sha((await text(`/api/datasets/${id}`)) + (await text(`/api/datasets/${id}/geometry`)));
}
async function sweepDigest(id: string): Promise<string> {
  return sha((await text(`/api/sweeps/${id}`)) + (await text(`/api/sweeps/${id}/placements.csv`)) + (await text(`/api/sweeps/${id}/placements.json`)));
}

/** A 120000-record invented survey: a 3 MB upload that takes the server a while to parse and store. */
function bulkyParts(seed: number): UploadPart[] {
  let state = seed >>> 0;
  const random = (): number => {
    state = (Math.imul(state, 1664525) + 1013904223) >>> 0;
    return state / 4294967296;
  };
  const rows = Array.from({ length: 120_000 }, (_, k) => `${k},${(random() * 5000).toFixed(2)},${(random() * 5000).toFixed(2)}`);
  return [
    { field: 'points', value: `id,x,y\n${rows.join('\n')}\n`, filename: 'bulky.csv' },
    { field: 'crs', value: 'planar' },
    { field: 'name', value: `bulky ${seed}` },
  ];
}

/** Send a multipart upload over a raw socket; resolves once `share` of its bytes is written (the rest never is). */
async function partialUpload(port: number, parts: UploadPart[], share: number): Promise<void> {
  const body = await multipartBody(parts);
  const cut = Math.floor(body.payload.length * share);
  await new Promise<void>((resolve) => {
    const socket = connect({ host: '127.0.0.1', port });
    socket.on('error', () => resolve());
    socket.write(`POST /api/datasets HTTP/1.1\r\nHost: 127.0.0.1:${port}\r\nContent-Type: ${body.contentType}\r\nContent-Length: ${body.payload.length}\r\n\r\n`);
    socket.write(body.payload.subarray(0, cut), () => resolve());
  });
}

function integrity(): string {
  const db = new Database(join(dataDir, 'gridshake.sqlite'), { readonly: true, fileMustExist: true });
  try {
    return String(db.pragma('integrity_check', { simple: true }));
  } finally {
    db.close();
  }
}

describe('SIGKILL and restart', () => {
  it(`survives ${KILLS} hard kills during sweeps and uploads with nothing lost`, async () => {
    const began = Date.now();
    server = await start();
    const survey = await upload(smallDatasetParts(21, 'pond survey'));
    const bulky = await upload(bulkyParts(1));
    const finishedSweep = (await post('/api/sweeps', { datasetId: survey.id, plan: { cells: [120, 200], placements: 32, sims: 9, alpha: 0.1 } })).id;
    await waitFor(finishedSweep, (r) => r.status === 'done');
    const datasets = new Map<string, string>([[survey.id, await datasetDigest(survey.id)], [bulky.id, await datasetDigest(bulky.id)]]);
    const sweeps = new Map<string, string>([[finishedSweep, await sweepDigest(finishedSweep)]]);
    const interrupted: string[] = [];
    let duringSweep = 0;
    let duringUpload = 0;
    let uploadsCompletedBeforeKill = 0;

    for (let kill = 0; kill < KILLS && (Date.now() - began) / 1000 < MAX_SECONDS; kill += 1) {
      if (kill % 2 === 0) {
        const running = (await post('/api/sweeps', { datasetId: bulky.id, plan: { cells: [100, 160], placements: 2048, sims: 19, seed: kill } })).id;
        await waitFor(running, (r) => r.status === 'running' && r.progress.done > 0);
        await new Promise((resolve) => setTimeout(resolve, (kill * 37) % 300));
        interrupted.push(running);
        duringSweep += 1;
      } else {
        // alternately cut the body short, or send it all and kill while the server parses and stores it
        const share = kill % 4 === 1 ? 0.5 : 1;
        await partialUpload(server.port, bulkyParts(100 + kill), share);
        await new Promise((resolve) => setTimeout(resolve, share === 1 ? (kill * 53) % 400 : 50));
        duringUpload += 1;
      }
      await server.kill('SIGKILL');
      server = await start();
      expect(integrity()).toBe('ok');

      const listed = JSON.parse(await text('/api/datasets')) as { id: string; name: string; n: number }[];
      for (const entry of listed) {
        if (datasets.has(entry.id)) continue;
        // an upload the server finished before the kill: it must be whole (every record, readable geometry)
        expect(entry.name).toMatch(/^bulky \d+$/);
        expect(entry.n).toBe(120_000);
        datasets.set(entry.id, await datasetDigest(entry.id));
        uploadsCompletedBeforeKill += 1;
      }
      expect(listed.map((d) => d.id).sort()).toEqual([...datasets.keys()].sort());
      for (const [id, digest] of datasets) expect({ id, digest: await datasetDigest(id) }).toEqual({ id, digest });
      for (const [id, digest] of sweeps) expect({ id, digest: await sweepDigest(id) }).toEqual({ id, digest });
      for (const id of interrupted) {
        const record = await sweepRecord(id);
        expect({ id, status: record.status }).toEqual({ id, status: 'interrupted' });
        expect(record.error).toMatch(/server stopped/);
      }
    }
    const kills = duringSweep + duringUpload;
    // the interrupted sweep can be run again to completion after all this
    const rerun = (await post('/api/sweeps', { datasetId: survey.id, plan: { cells: [120, 200], placements: 32, sims: 9, alpha: 0.1 } })).id;
    await waitFor(rerun, (r) => r.status === 'done');
    // the same rows; the first line is a comment naming the run, with its own sweep id
    const rowsOf = (csv: string): string => csv.slice(csv.indexOf('\n') + 1);
    expect(rowsOf(await text(`/api/sweeps/${rerun}/placements.csv`))).toBe(rowsOf(await text(`/api/sweeps/${finishedSweep}/placements.csv`)));
    console.log(
      `faults: ${kills} SIGKILLs survived (${duringSweep} during sweeps, ${duringUpload} during uploads) in ${((Date.now() - began) / 1000).toFixed(0)} s; ` +
        `${datasets.size} datasets and ${sweeps.size} finished sweep identical after every restart, ${interrupted.length} sweeps marked interrupted, ` +
        `${uploadsCompletedBeforeKill} uploads finished before their kill (whole), 0 half-written, integrity_check ok`,
    );
    expect(kills).toBeGreaterThanOrEqual(8);
  });
});
