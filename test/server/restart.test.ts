import { describe, it, expect, afterAll } from 'vitest';
import { spawn, type ChildProcess } from 'node:child_process';
import { join } from 'node:path';
import { sampleFile, tempFolder } from './server-helpers.js';

const BIN = join(import.meta.dirname, '..', '..', 'bin', 'gridshake.js');
const data = tempFolder('gridshake-restart-');
const children: ChildProcess[] = [];

afterAll(() => {
  for (const child of children) if (child.exitCode === null && child.signalCode === null) child.kill('SIGKILL');
  data.remove();
});

/** Start `gridshake serve` on a free loopback port; resolves with the child and its base URL once it listens. */
function startServer(extra: string[] = []): Promise<{ child: ChildProcess; base: string; stderr: () => string }> {
  const child = spawn(process.execPath, [BIN, 'serve', '--port', '0', '--data', data.path, '--threads', '1', ...extra], {
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  children.push(child);
  let stdout = '';
  let stderr = '';
  child.stderr!.on('data', (chunk: Buffer) => (stderr += chunk.toString()));
  return new Promise((resolve, reject) => {
    const timer = setTimeout(() => reject(new Error(`serve did not start: ${stderr}`)), 30_000);
    child.stdout!.on('data', (chunk: Buffer) => {
      stdout += chunk.toString();
      const match = /http:\/\/127\.0\.0\.1:(\d+)\//.exec(stdout);
      if (match) {
        clearTimeout(timer);
        resolve({ child, base: `http://127.0.0.1:${match[1]}`, stderr: () => stderr });
      }
    });
    child.on('exit', (code) => reject(new Error(`serve exited with ${code}: ${stderr}`)));
  });
}

function exited(child: ChildProcess): Promise<{ code: number | null; signal: NodeJS.Signals | null }> {
  if (child.exitCode !== null || child.signalCode !== null) return Promise.resolve({ code: child.exitCode, signal: child.signalCode });
  return new Promise((resolve) => child.on('exit', (code, signal) => resolve({ code, signal })));
}

async function json(url: string, init?: RequestInit): Promise<{ status: number; body: Record<string, unknown> }> {
  const response = await fetch(url, init);
  return { status: response.status, body: (await response.json()) as Record<string, unknown> };
}

describe('gridshake serve across a hard kill', () => {
  it('marks the sweep interrupted, keeps the dataset intact, reruns it, and stops cleanly on SIGTERM', async () => {
    const first = await startServer(['--no-demo']);
    const form = new FormData();
    form.append('points', new Blob([sampleFile('brannock-heath', 'points.csv')]), 'points.csv');
    form.append('area', new Blob([sampleFile('brannock-heath', 'area.geojson')]), 'area.geojson');
    form.append('noData', new Blob([sampleFile('brannock-heath', 'no-data.geojson')]), 'no-data.geojson');
    form.append('crs', 'planar');
    const created = await json(`${first.base}/api/datasets`, { method: 'POST', body: form });
    expect(created.status).toBe(201);
    const datasetId = created.body.id as string;
    const geometryBefore = await json(`${first.base}/api/datasets/${datasetId}/geometry`);
    const plan = { cells: [60, 90], placements: 8192, rotation: true, sims: 99, seed: 5 };
    const started = await json(`${first.base}/api/sweeps`, {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ datasetId, plan }),
    });
    expect(started.status).toBe(202);
    const sweepId = started.body.id as string;
    let status = '';
    for (let attempt = 0; attempt < 500 && status !== 'running'; attempt++) {
      status = (await json(`${first.base}/api/sweeps/${sweepId}`)).body.status as string;
      if (status !== 'running') await new Promise((resolve) => setTimeout(resolve, 20));
    }
    expect(status).toBe('running');
    first.child.kill('SIGKILL');
    expect((await exited(first.child)).signal).toBe('SIGKILL');

    const second = await startServer();
    expect(second.stderr()).toContain('1 sweep(s) stopped by the last shutdown are marked interrupted');
    const sweep = await json(`${second.base}/api/sweeps/${sweepId}`);
    expect(sweep.body.status).toBe('interrupted');
    expect(sweep.body.error).toContain('rerun');
    expect(sweep.body.plan).toMatchObject(plan);
    const dataset = await json(`${second.base}/api/datasets/${datasetId}`);
    expect(dataset.body).toEqual(created.body);
    const geometryAfter = await json(`${second.base}/api/datasets/${datasetId}/geometry`);
    expect(geometryAfter.body).toEqual(geometryBefore.body);
    // a non-empty store: the demo scenarios are not loaded again
    const datasets = await json(`${second.base}/api/datasets`);
    expect((datasets.body as unknown as unknown[]).length).toBe(1);
    const interruptedCsv = await fetch(`${second.base}/api/sweeps/${sweepId}/placements.csv`);
    expect(interruptedCsv.status).toBe(409);

    const rerun = await json(`${second.base}/api/sweeps/${sweepId}/rerun`, { method: 'POST' });
    expect(rerun.status).toBe(202);
    expect(rerun.body.rerunOf).toBe(sweepId);
    second.child.kill('SIGTERM');
    expect(await exited(second.child)).toEqual({ code: 0, signal: null });
    expect(second.stderr()).toContain('SIGTERM: stopping');

    // the rerun that was running at the clean stop is interrupted too, never left "running"
    const third = await startServer();
    const afterStop = await json(`${third.base}/api/sweeps/${rerun.body.id as string}`);
    expect(afterStop.body.status).toBe('interrupted');
    // a second server on the same data folder is refused while the first runs (it would mark its sweeps interrupted)
    const rival = spawn(process.execPath, [BIN, 'serve', '--port', '0', '--data', data.path], { stdio: ['ignore', 'pipe', 'pipe'] });
    children.push(rival);
    let rivalErr = '';
    rival.stderr!.on('data', (chunk: Buffer) => (rivalErr += chunk.toString()));
    expect((await exited(rival)).code).toBe(1);
    expect(rivalErr).toContain('another gridshake server');
    third.child.kill('SIGINT');
    expect(await exited(third.child)).toEqual({ code: 0, signal: null });
  });

  it('on first start with an empty store loads the demo scenarios and queues their sweeps', async () => {
    const fresh = tempFolder('gridshake-fresh-');
    try {
      const child = spawn(process.execPath, [BIN, 'serve', '--port', '0', '--data', fresh.path, '--threads', '1'], { stdio: ['ignore', 'pipe', 'pipe'] });
      children.push(child);
      const base = await new Promise<string>((resolve, reject) => {
        let out = '';
        child.stdout!.on('data', (chunk: Buffer) => {
          out += chunk.toString();
          const match = /http:\/\/127\.0\.0\.1:(\d+)\//.exec(out);
          if (match) resolve(`http://127.0.0.1:${match[1]}`);
        });
        child.on('exit', (code) => reject(new Error(`exited ${code}`)));
      });
      const datasets = (await (await fetch(`${base}/api/datasets`)).json()) as { sample: string; n: number }[];
      expect(datasets.map((dataset) => dataset.sample).sort()).toEqual(['brannock-heath', 'ostrevan-reservoir', 'port-calverin']);
      const sweeps = (await (await fetch(`${base}/api/sweeps`)).json()) as unknown[];
      expect(sweeps).toHaveLength(3);
      child.kill('SIGTERM');
      expect((await exited(child)).code).toBe(0);
    } finally {
      fresh.remove();
    }
  });
});
