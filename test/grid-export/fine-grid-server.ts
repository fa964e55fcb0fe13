/**
 * The fine-grid attack's setup, shared by the export-limit test and the stress test of the largest GeoPackage: a
 * server (listening on a loopback port) holding 2,000 points in a 1 km square and one finished sweep at 0.5 m and
 * 2.1 m cells (one placement, no rotation, no simulations).
 */
import type { FastifyInstance } from 'fastify';
import type { AddressInfo } from 'node:net';
import { expect } from 'vitest';
import { multipartBody, testApp, waitForSweep } from '../server/server-helpers.js';

export interface FineGridServer {
  app: FastifyInstance;
  close: () => Promise<void>;
  /** http://127.0.0.1:PORT */
  base: string;
  sweepId: string;
}

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

export async function startFineGridServer(): Promise<FineGridServer> {
  const { app, close } = await testApp();
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
  await app.listen({ host: '127.0.0.1', port: 0 });
  return { app, close, base: `http://127.0.0.1:${(app.server.address() as AddressInfo).port}`, sweepId: done.id as string };
}
