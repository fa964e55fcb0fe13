import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import type { FastifyInstance } from 'fastify';
import type { AddressInfo } from 'node:net';
import { parseEvents, sampleFile, testApp } from './server-helpers.js';

let app: FastifyInstance;
let close: () => Promise<void>;
let base: string;

beforeAll(async () => {
  ({ app, close } = await testApp());
  await app.listen({ host: '127.0.0.1', port: 0 });
  base = `http://127.0.0.1:${(app.server.address() as AddressInfo).port}`;
});
afterAll(async () => {
  const before = Date.now();
  await close();
  console.log(`close took ${Date.now() - before} ms`);
});

async function uploadOverHttp(scenario: string): Promise<{ id: string }> {
  const form = new FormData();
  form.append('points', new Blob([sampleFile(scenario, 'points.csv')]), 'points.csv');
  form.append('area', new Blob([sampleFile(scenario, 'area.geojson')]), 'area.geojson');
  form.append('noData', new Blob([sampleFile(scenario, 'no-data.geojson')]), 'no-data.geojson');
  form.append('crs', 'planar');
  form.append('name', scenario);
  const response = await fetch(`${base}/api/datasets`, { method: 'POST', body: form });
  expect(response.status).toBe(201);
  return (await response.json()) as { id: string };
}

async function startOverHttp(datasetId: string, plan: object): Promise<{ id: string }> {
  const response = await fetch(`${base}/api/sweeps`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ datasetId, plan }),
  });
  expect(response.status).toBe(202);
  return (await response.json()) as { id: string };
}

describe('a real server on a loopback port', () => {
  it('runs a sweep followed over server-sent events to its end, answering status requests meanwhile', async () => {
    const dataset = await uploadOverHttp('brannock-heath');
    const sweep = await startOverHttp(dataset.id, { cells: [70, 100, 140], placements: 768, rotation: true, sims: 29, seed: 11 });
    const started = Date.now();
    const events = await fetch(`${base}/api/sweeps/${sweep.id}/events`);
    expect(events.headers.get('content-type')).toContain('text/event-stream');
    const latencies: number[] = [];
    let streamDone = false;
    const probe = (async () => {
      while (!streamDone) {
        const before = performance.now();
        const status = await fetch(`${base}/api/sweeps/${sweep.id}`);
        await status.json();
        latencies.push(performance.now() - before);
        await new Promise((resolve) => setTimeout(resolve, 25));
      }
    })();
    const text = await events.text();
    streamDone = true;
    await probe;
    const seconds = (Date.now() - started) / 1000;
    const parsed = parseEvents(text);
    const progress = parsed.filter((event) => event.event === 'progress');
    const end = parsed.at(-1)!;
    expect(end.event).toBe('end');
    expect(end.data).toMatchObject({ id: sweep.id, status: 'done', error: null });
    expect(parsed.filter((event) => event.event === 'end')).toHaveLength(1);
    expect(progress.length).toBeGreaterThanOrEqual(1);
    const done = progress.map((event) => (event.data.progress as { done: number }).done);
    expect([...done].sort((a, b) => a - b)).toEqual(done);
    expect((end.data.progress as { done: number; total: number }).done).toBe(3 * 768);
    // heartbeat: a progress event at least once a second while running (1.5 s allowed for timer slack)
    expect(progress.length).toBeGreaterThanOrEqual(Math.floor(seconds / 1.5));
    latencies.sort((a, b) => a - b);
    const p50 = latencies[Math.floor(latencies.length / 2)] ?? Number.NaN;
    const p99 = latencies[Math.floor(latencies.length * 0.99)] ?? Number.NaN;
    console.log(
      `sweep of ${seconds.toFixed(1)} s: ${progress.length} progress events; ${latencies.length} status requests during it, ` +
        `p50 ${p50.toFixed(1)} ms, p99 ${p99.toFixed(1)} ms`,
    );
    const record = (await (await fetch(`${base}/api/sweeps/${sweep.id}`)).json()) as { status: string };
    expect(record.status).toBe('done');
  });

  it('a client that disconnects mid-stream is unsubscribed', async () => {
    const dataset = await uploadOverHttp('brannock-heath');
    const listenersBefore = app.gridshake.queue.listenerCount('progress');
    const sweep = await startOverHttp(dataset.id, { cells: [60, 90], placements: 4096, rotation: true, sims: 99, seed: 2 });
    const controller = new AbortController();
    const response = await fetch(`${base}/api/sweeps/${sweep.id}/events`, { signal: controller.signal });
    const reader = response.body!.getReader();
    const first = new TextDecoder().decode((await reader.read()).value);
    expect(first).toContain('event: progress');
    expect(app.gridshake.queue.listenerCount('progress')).toBe(listenersBefore + 1);
    controller.abort();
    for (let attempt = 0; attempt < 100 && app.gridshake.queue.listenerCount('progress') > listenersBefore; attempt++) {
      await new Promise((resolve) => setTimeout(resolve, 20));
    }
    expect(app.gridshake.queue.listenerCount('progress')).toBe(listenersBefore);
    const cancel = await fetch(`${base}/api/sweeps/${sweep.id}/cancel`, { method: 'POST' });
    expect(cancel.status).toBe(200);
  });
});
