/**
 * The largest allowed grid export: the GeoPackage of 0.5 m cells over 1 km^2 (about 4 million cells, written in
 * transactions of 2,000 rows) while /api/health keeps answering, with the server's memory bounded.
 */
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import type { FastifyInstance } from 'fastify';
import type { AddressInfo } from 'node:net';
import { multipartBody, testApp, waitForSweep } from '../server/server-helpers.js';

let app: FastifyInstance;
let close: () => Promise<void>;
let base: string;
let sweepId: string;

/** 2,000 points in a 1 km square (a seeded linear congruential sequence, Numerical Recipes constants). */
function squarePoints(): string {
  let state = 12345;
  const next = (): number => {
    state = (Math.imul(state, 1664525) + 1013904223) >>> 0;
    return state / 2 ** 32;
  };
  const lines = ['id,x,y'];
  for (let k = 0; k < 2000; k++) lines.push(`p${k},${(next() * 1000).toFixed(2)},${(next() * 1000).toFixed(2)}`);
  return lines.join('\n');
}

const SQUARE = JSON.stringify({
  type: 'Feature',
  properties: {},
  geometry: { type: 'Polygon', coordinates: [[[0, 0], [1000, 0], [1000, 1000], [0, 1000], [0, 0]]] },
});

beforeAll(async () => {
  ({ app, close } = await testApp());
  const body = await multipartBody([
    { field: 'points', value: squarePoints(), filename: 'points.csv' },
    { field: 'area', value: SQUARE, filename: 'area.geojson' },
    { field: 'crs', value: 'planar' },
  ]);
  const dataset = await app.inject({ method: 'POST', url: '/api/datasets', ...body });
  expect(dataset.statusCode, dataset.body).toBe(201);
  const plan = { cells: [0.5, 2.1], placements: 1, rotation: false, sims: 0, seed: 1 };
  const started = await app.inject({ method: 'POST', url: '/api/sweeps', payload: { datasetId: dataset.json().id, plan } });
  expect(started.statusCode, started.body).toBe(202);
  const done = await waitForSweep(app, started.json().id as string, 120_000);
  expect(done.status).toBe('done');
  sweepId = done.id as string;
  await app.listen({ host: '127.0.0.1', port: 0 });
  base = `http://127.0.0.1:${(app.server.address() as AddressInfo).port}`;
}, 180_000);
afterAll(async () => close());

describe('grid.gpkg at the finest allowed cell size', () => {
  it('0.5 m cells over 1 km^2: about 4 million cells written while health answers', async () => {
    const latencies: number[] = [];
    let downloading = true;
    const poll = (async () => {
      while (downloading) {
        const started = performance.now();
        await (await fetch(`${base}/api/health`)).arrayBuffer();
        latencies.push(performance.now() - started);
        await new Promise((resolve) => setTimeout(resolve, 100));
      }
    })();
    const started = performance.now();
    let peakRss = process.memoryUsage().rss;
    const sampler = setInterval(() => (peakRss = Math.max(peakRss, process.memoryUsage().rss)), 200);
    const response = await fetch(`${base}/api/sweeps/${sweepId}/grid.gpkg?size=0&placement=0`);
    let bytes = 0;
    for await (const chunk of response.body as unknown as AsyncIterable<Uint8Array>) bytes += chunk.length;
    clearInterval(sampler);
    downloading = false;
    await poll;
    expect(response.status).toBe(200);
    latencies.sort((a, b) => a - b);
    const p99 = latencies[Math.floor(0.99 * (latencies.length - 1))]!;
    console.log(
      `grid.gpkg 0.5 m: ${(bytes / 1e6).toFixed(0)} MB in ${((performance.now() - started) / 1000).toFixed(1)} s, ` +
        `peak rss ${(peakRss / 1e6).toFixed(0)} MB, health ${latencies.length} requests, p99 ${p99.toFixed(0)} ms`,
    );
    expect(bytes).toBeGreaterThan(4e6 * 100);
    expect(p99).toBeLessThan(1000);
    expect(peakRss).toBeLessThan(1.5e9);
  });
});
