import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { FastifyInstance } from 'fastify';
import { booleanClockwise, lineString } from '@turf/turf';
import { parse } from 'csv-parse/sync';
import { testApp, uploadScenario, waitForSweep } from './server-helpers.js';

// The plan's `shape` over HTTP (issue 16): one shape or a list, the estimate per (shape, cell size), placements.csv
// and the summary naming each row's shape, and the grid export drawing hexagons as 7-point rings.

let app: FastifyInstance;
let close: () => Promise<void>;
let heath: { id: string; nInside?: unknown; [key: string]: unknown };

const PLAN = { cells: [90, 140], placements: 8, sims: 19, seed: 2 };

beforeAll(async () => {
  ({ app, close } = await testApp());
  heath = await uploadScenario(app, 'brannock-heath');
});
afterAll(async () => close());

async function post(plan: unknown): Promise<{ statusCode: number; body: Record<string, unknown> }> {
  const response = await app.inject({ method: 'POST', url: '/api/sweeps', payload: { datasetId: heath.id, plan } });
  return { statusCode: response.statusCode, body: response.json() };
}

describe('POST /api/sweeps with plan.shape', () => {
  it('runs square and hex side by side: estimate, summary sizes, placements.csv and a hexagon grid', async () => {
    const started = await post({ ...PLAN, shape: ['square', 'hex'] });
    expect(started.statusCode).toBe(202);
    expect((started.body.estimate as { work: number }).work).toBe((heath.nInside as number) * 8 * 2 * 2 * 20);
    const finished = await waitForSweep(app, started.body.id as string);
    expect(finished.status).toBe('done');
    const summary = finished.summary as { plan: { shape: unknown }; sizes: { sizeIndex: number; cellSize: number; shape: string }[] };
    expect(summary.plan.shape).toEqual(['square', 'hex']);
    expect(summary.sizes.map((size) => [size.sizeIndex, size.cellSize, size.shape])).toEqual([
      [0, 90, 'square'],
      [1, 140, 'square'],
      [2, 90, 'hex'],
      [3, 140, 'hex'],
    ]);

    const csv = await app.inject({ method: 'GET', url: `/api/sweeps/${started.body.id as string}/placements.csv` });
    const rows = parse(csv.body, { columns: true, comment: '#' }) as Record<string, string>[];
    expect(rows).toHaveLength(32);
    expect(rows.map((row) => row.shape)).toEqual([...Array(16).fill('square'), ...Array(16).fill('hex')]);

    const grid = await app.inject({ method: 'GET', url: `/api/sweeps/${started.body.id as string}/grid.geojson?size=2&placement=0&coordinates=planar` });
    expect(grid.statusCode, grid.body).toBe(200);
    const collection = grid.json() as { gridshake: { shape: string }; features: { geometry: { coordinates: number[][][] } }[] };
    expect(collection.gridshake.shape).toBe('hex');
    expect(collection.features.length).toBeGreaterThan(2);
    for (const feature of collection.features) {
      const ring = feature.geometry.coordinates[0];
      expect(ring).toHaveLength(7);
      expect(ring[6]).toEqual(ring[0]);
      // RFC 7946 section 3.1.6: exterior rings counter-clockwise (turf booleanClockwise as the outside check)
      expect(booleanClockwise(lineString(ring))).toBe(false);
    }
    const squareGrid = await app.inject({ method: 'GET', url: `/api/sweeps/${started.body.id as string}/grid.geojson?size=0&placement=0&coordinates=planar` });
    expect((squareGrid.json() as { features: { geometry: { coordinates: number[][][] } }[] }).features[0].geometry.coordinates[0]).toHaveLength(5);
  });

  it('refuses unknown shapes, other types and repeats with a coded 400 naming the field, before storing anything', async () => {
    const before = (await app.inject({ method: 'GET', url: '/api/sweeps' })).json().length;
    for (const shape of [6, 'triangle', ['hex', 'hex'], [], ['square', 'circle']]) {
      const refused = await post({ ...PLAN, shape });
      expect(refused.statusCode, JSON.stringify(shape)).toBe(400);
      expect(refused.body.code).toBe('GS_ERR_VALIDATION');
      expect(refused.body.message).toContain('body/plan/shape');
    }
    expect((await app.inject({ method: 'GET', url: '/api/sweeps' })).json()).toHaveLength(before);
  });
});
