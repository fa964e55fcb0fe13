import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import type { FastifyInstance } from 'fastify';
import * as turf from '@turf/turf';
import type { Feature, MultiPolygon, Polygon } from 'geojson';
import { parseEvents, sampleFile, testApp, uploadScenario, waitForSweep } from './server-helpers.js';

let app: FastifyInstance;
let close: () => Promise<void>;
let heath: { id: string; nInside?: unknown; [key: string]: unknown };
let doneSweep: Record<string, unknown>;

const SMALL_PLAN = { cells: [80, 120], placements: 16, rotation: true, sims: 9, alpha: 0.1, seed: 7 };
/** Large enough to be caught running: 360 points x 8192 placements x 2 sizes x 100 patterns. */
const LONG_PLAN = { cells: [60, 90], placements: 8192, rotation: true, sims: 99, seed: 3 };

async function startSweep(plan: unknown, datasetId = heath.id): Promise<Record<string, unknown>> {
  const response = await app.inject({ method: 'POST', url: '/api/sweeps', payload: { datasetId, plan } });
  expect(response.statusCode, response.body).toBe(202);
  return response.json();
}

async function waitForStatus(id: string, status: string): Promise<void> {
  for (let attempt = 0; attempt < 600; attempt++) {
    const record = (await app.inject({ method: 'GET', url: `/api/sweeps/${id}` })).json();
    if (record.status === status) return;
    await new Promise((resolve) => setTimeout(resolve, 20));
  }
  throw new Error(`sweep ${id} never became ${status}`);
}

beforeAll(async () => {
  ({ app, close } = await testApp());
  heath = await uploadScenario(app, 'brannock-heath');
  const started = await startSweep(SMALL_PLAN);
  doneSweep = await waitForSweep(app, started.id as string);
});
afterAll(async () => close());

describe('POST /api/sweeps', () => {
  it('answers 202 with id, status and the estimate points x placements x sizes x (1 + sims)', async () => {
    const started = await startSweep(SMALL_PLAN);
    expect(started.status).toBe('queued');
    expect((started.estimate as { work: number }).work).toBe((heath.nInside as number) * 16 * 2 * 10);
    const finished = await waitForSweep(app, started.id as string);
    expect(finished.status).toBe('done');
  });

  it('a finished sweep has its summary and full progress', () => {
    expect(doneSweep.status).toBe('done');
    expect(doneSweep.progress).toMatchObject({ done: 32, total: 32 });
    const summary = doneSweep.summary as { sizes: { cellSize: number; placements: number }[]; plan: { seed: number } };
    expect(summary.sizes.map((size) => size.cellSize)).toEqual([80, 120]);
    expect(summary.sizes.every((size) => size.placements === 16)).toBe(true);
    expect(summary.plan.seed).toBe(7);
    expect(typeof doneSweep.conclusion).toBe('string');
  });

  it('rejects schema violations with GS_ERR_VALIDATION naming the field', async () => {
    const cases: [unknown, string][] = [
      [{ datasetId: heath.id, plan: { ...SMALL_PLAN, placements: 0 } }, 'body/plan/placements must be >= 1'],
      [{ datasetId: heath.id, plan: { ...SMALL_PLAN, cell: [5] } }, "body/plan has an unknown field 'cell'"],
      [{ datasetId: heath.id, plan: { ...SMALL_PLAN, design: 'spiral' } }, 'body/plan/design must be one of "halton", "lattice"'],
      [{ plan: SMALL_PLAN }, "body needs the field 'datasetId'"],
      [{ datasetId: heath.id, plan: { ...SMALL_PLAN, alpha: 0.9 } }, 'body/plan/alpha must be <= 0.5'],
    ];
    for (const [payload, message] of cases) {
      const response = await app.inject({ method: 'POST', url: '/api/sweeps', payload: payload as object });
      expect(response.statusCode).toBe(400);
      expect(response.json().code).toBe('GS_ERR_VALIDATION');
      expect(response.json().message).toContain(message);
    }
  });

  it('rejects plans the sweeps module refuses with GS_ERR_PARAMETER, before storing anything', async () => {
    const before = (await app.inject({ method: 'GET', url: '/api/sweeps' })).json().length;
    const both = await app.inject({ method: 'POST', url: '/api/sweeps', payload: { datasetId: heath.id, plan: { ...SMALL_PLAN, perCell: [2] } } });
    expect(both.statusCode).toBe(400);
    expect(both.json().code).toBe('GS_ERR_PARAMETER');
    const huge = await app.inject({ method: 'POST', url: '/api/sweeps', payload: { datasetId: heath.id, plan: { ...SMALL_PLAN, cells: [5000] } } });
    expect(huge.statusCode).toBe(400);
    expect(huge.json().message).toMatch(/^cell side 1 gives cells of 5000 m/);
    expect((await app.inject({ method: 'GET', url: '/api/sweeps' })).json().length).toBe(before);
  });

  // With R simulations no Monte Carlo p is below 1/(R+1) (Besag & Diggle 1977): R = 9 cannot reject at alpha 0.05
  it('refuses a plan whose Monte Carlo test could never reject with GS_ERR_TOO_FEW_SIMS (400), naming the least R', async () => {
    const response = await app.inject({ method: 'POST', url: '/api/sweeps', payload: { datasetId: heath.id, plan: { ...SMALL_PLAN, alpha: 0.05, sims: 9 } } });
    expect(response.statusCode).toBe(400);
    expect(response.json().code).toBe('GS_ERR_TOO_FEW_SIMS');
    expect(response.json().message).toContain('at least 19');
  });

  it('refuses a body that is not JSON, or empty, with GS_ERR_VALIDATION', async () => {
    for (const payload of ['{"datasetId": ', '']) {
      const response = await app.inject({ method: 'POST', url: '/api/sweeps', headers: { 'content-type': 'application/json' }, payload });
      expect(response.statusCode).toBe(400);
      expect(response.json().code).toBe('GS_ERR_VALIDATION');
    }
  });

  it('answers 404 for an unknown dataset', async () => {
    const response = await app.inject({
      method: 'POST',
      url: '/api/sweeps',
      payload: { datasetId: '00000000-0000-4000-8000-000000000000', plan: SMALL_PLAN },
    });
    expect(response.statusCode).toBe(404);
    expect(response.json().code).toBe('GS_ERR_NOT_FOUND');
  });

  it('refuses a plan over the work budget with GS_ERR_BUDGET before queuing', async () => {
    const small = await testApp({ workBudget: 1000 });
    try {
      const dataset = await uploadScenario(small.app, 'brannock-heath');
      const response = await small.app.inject({ method: 'POST', url: '/api/sweeps', payload: { datasetId: dataset.id, plan: SMALL_PLAN } });
      expect(response.statusCode).toBe(400);
      expect(response.json().code).toBe('GS_ERR_BUDGET');
      expect(response.json().message).toContain('budget');
      expect((await small.app.inject({ method: 'GET', url: '/api/sweeps' })).json()).toEqual([]);
    } finally {
      await small.close();
    }
  });

  it('counts the stability surface every sweep computes: counts within the budget, surface over it, refused before queuing', async () => {
    // the estimate's work (points x placements x sizes x (1 + sims)) is the budget itself; the surface's pixels push it over
    const small = await testApp({ workBudget: (heath.nInside as number) * 16 * 2 * 10 });
    try {
      const dataset = await uploadScenario(small.app, 'brannock-heath');
      const response = await small.app.inject({ method: 'POST', url: '/api/sweeps', payload: { datasetId: dataset.id, plan: SMALL_PLAN } });
      expect(response.statusCode).toBe(400);
      expect(response.json().code).toBe('GS_ERR_BUDGET');
      expect(response.json().message).toMatch(/for the stability surface .*or larger cells/);
      expect((await small.app.inject({ method: 'GET', url: '/api/sweeps' })).json()).toEqual([]);
    } finally {
      await small.close();
    }
  });
});

describe('GET /api/sweeps', () => {
  it('lists sweeps without their summaries, filtered by dataset', async () => {
    const list = (await app.inject({ method: 'GET', url: `/api/sweeps?datasetId=${heath.id}` })).json() as Record<string, unknown>[];
    const entry = list.find((sweep) => sweep.id === doneSweep.id)!;
    expect(entry.status).toBe('done');
    expect(entry.summary).toBeUndefined();
    expect(entry.conclusion).toBe(doneSweep.conclusion);
    expect(entry.datasetName).toBe('brannock-heath');
    const other = (await app.inject({ method: 'GET', url: '/api/sweeps?datasetId=00000000-0000-4000-8000-000000000000' })).json();
    expect(other).toEqual([]);
  });
});

describe('cancel, rerun, delete', () => {
  it('cancelling a finished sweep is 409 GS_ERR_CONFLICT', async () => {
    const response = await app.inject({ method: 'POST', url: `/api/sweeps/${doneSweep.id}/cancel` });
    expect(response.statusCode).toBe(409);
    expect(response.json().code).toBe('GS_ERR_CONFLICT');
  });

  it('cancels a running sweep and a queued one; their exports are 409', async () => {
    const running = await startSweep(LONG_PLAN);
    const queued = await startSweep(LONG_PLAN);
    await waitForStatus(running.id as string, 'running');
    const waiting = (await app.inject({ method: 'GET', url: `/api/sweeps/${queued.id}` })).json();
    expect(waiting).toMatchObject({ status: 'queued', queuePosition: 0 });
    const cancelQueued = await app.inject({ method: 'POST', url: `/api/sweeps/${queued.id}/cancel` });
    expect(cancelQueued.statusCode).toBe(200);
    expect(cancelQueued.json().status).toBe('cancelled');
    const cancelRunning = await app.inject({ method: 'POST', url: `/api/sweeps/${running.id}/cancel` });
    expect(cancelRunning.statusCode).toBe(200);
    const final = await waitForSweep(app, running.id as string);
    expect(final.status).toBe('cancelled');
    const csv = await app.inject({ method: 'GET', url: `/api/sweeps/${running.id}/placements.csv` });
    expect(csv.statusCode).toBe(409);
    expect(csv.json().message).toContain('cancelled');
  });

  it('rerun makes a new sweep from the stored plan with identical rows (same seed)', async () => {
    const rerun = await app.inject({ method: 'POST', url: `/api/sweeps/${doneSweep.id}/rerun` });
    expect(rerun.statusCode).toBe(202);
    expect(rerun.json().rerunOf).toBe(doneSweep.id);
    const finished = await waitForSweep(app, rerun.json().id);
    expect(finished.plan).toEqual(doneSweep.plan);
    const first = (await app.inject({ method: 'GET', url: `/api/sweeps/${doneSweep.id}/placements.json` })).json();
    const second = (await app.inject({ method: 'GET', url: `/api/sweeps/${finished.id}/placements.json` })).json();
    expect(second).toEqual(first);
  });

  it('DELETE removes a sweep (204, then 404); deleting a dataset removes its sweeps', async () => {
    const started = await startSweep(SMALL_PLAN);
    await waitForSweep(app, started.id as string);
    expect((await app.inject({ method: 'DELETE', url: `/api/sweeps/${started.id}` })).statusCode).toBe(204);
    expect((await app.inject({ method: 'GET', url: `/api/sweeps/${started.id}` })).statusCode).toBe(404);
    const other = await uploadScenario(app, 'brannock-heath');
    const sweep = await startSweep(LONG_PLAN, other.id);
    expect((await app.inject({ method: 'DELETE', url: `/api/datasets/${other.id}` })).statusCode).toBe(204);
    expect((await app.inject({ method: 'GET', url: `/api/sweeps/${sweep.id}` })).statusCode).toBe(404);
    // the queue goes on with other work after the deletion
    const after = await startSweep(SMALL_PLAN);
    expect((await waitForSweep(app, after.id as string)).status).toBe('done');
  });
});

describe('exports of a done sweep', () => {
  it('placements.json has one row per size and placement; placement 0 is the reference placement', async () => {
    const rows = (await app.inject({ method: 'GET', url: `/api/sweeps/${doneSweep.id}/placements.json` })).json() as Record<string, number>[];
    expect(rows).toHaveLength(32);
    const reference = rows.filter((row) => row.placementIndex === 0);
    expect(reference.map((row) => [row.u, row.v, row.angle])).toEqual([[0, 0, 0], [0, 0, 0]]);
  });

  it('placements.csv carries the same numbers as placements.json, exactly', async () => {
    const response = await app.inject({ method: 'GET', url: `/api/sweeps/${doneSweep.id}/placements.csv` });
    expect(response.statusCode).toBe(200);
    expect(response.headers['content-type']).toContain('text/csv');
    // the download name carries the dataset name and the cell sides
    expect(response.headers['content-disposition']).toMatch(/^attachment; filename="gridshake-[a-z0-9-]+-[0-9.-]+m-placements\.csv"$/);
    const rows = (await app.inject({ method: 'GET', url: `/api/sweeps/${doneSweep.id}/placements.json` })).json() as Record<string, number>[];
    expect(response.body).not.toContain('\r');
    const lines = response.body.trim().split('\n');
    expect(lines[0]).toMatch(new RegExp(`^# gridshake placements: dataset ".*", sweep ${doneSweep.id}, cell sides `));
    const header = lines[1]!.split(',');
    expect(lines).toHaveLength(34);
    // each column with the precision it merits: 6 significant digits, p-values 4, offsets 6 decimals, angles 4
    const precision: [string, string, (value: number) => number][] = [
      ['vmr', 'vmr', (value) => Number(value.toPrecision(6))],
      ['chi2', 'chi2', (value) => Number(value.toPrecision(6))],
      ['p_clustered', 'pClustered', (value) => Number(value.toPrecision(4))],
      ['offset_u_cells', 'u', (value) => Number(value.toFixed(6))],
      ['offset_v_cells', 'v', (value) => Number(value.toFixed(6))],
      ['angle_deg', 'angle', (value) => Number(value.toFixed(4))],
    ];
    for (const [column, fieldName, round] of precision) {
      const at = header.indexOf(column);
      expect(at, column).toBeGreaterThanOrEqual(0);
      lines.slice(2).forEach((line, k) => expect(Number(line.split(',')[at])).toBe(round(rows[k]![fieldName])));
    }
  });

  it('grid.geojson recounts the placement: kept cells and points equal the row, and the vmr follows from the counts', async () => {
    const rows = (await app.inject({ method: 'GET', url: `/api/sweeps/${doneSweep.id}/placements.json` })).json() as Record<string, number>[];
    const row = rows.find((candidate) => candidate.sizeIndex === 1 && candidate.placementIndex === 5)!;
    const response = await app.inject({ method: 'GET', url: `/api/sweeps/${doneSweep.id}/grid.geojson?size=1&placement=5` });
    expect(response.statusCode).toBe(200);
    expect(response.headers['content-type']).toContain('application/geo+json');
    const grid = response.json();
    expect(grid.type).toBe('FeatureCollection');
    expect(grid.gridshake).toMatchObject({ cellSize: 120, u: row.u, v: row.v, angle: row.angle });
    expect(grid.gridshake.coordinates).toContain('planar metres');
    const kept = grid.features.filter((feature: { properties: { kept: boolean } }) => feature.properties.kept);
    const counts = kept.map((feature: { properties: { count: number } }) => feature.properties.count) as number[];
    expect(kept.length).toBe(row.cells);
    expect(counts.reduce((a, b) => a + b, 0)).toBe(row.points);
    const expectedSum = kept.reduce((sum: number, feature: { properties: { expected: number } }) => sum + feature.properties.expected, 0);
    expect(expectedSum).toBeCloseTo(row.points, 9);
    // sample variance (divisor m - 1) over mean, computed here from the exported counts
    const mean = counts.reduce((a, b) => a + b, 0) / counts.length;
    const variance = counts.reduce((sum, count) => sum + (count - mean) ** 2, 0) / (counts.length - 1);
    expect(variance / mean).toBeCloseTo(row.vmr, 10);
  });

  it("grid.geojson coverage equals the cell's share of the valid region, by @turf/turf polygon clipping", async () => {
    const response = await app.inject({ method: 'GET', url: `/api/sweeps/${doneSweep.id}/grid.geojson?size=0&placement=3` });
    const grid = response.json();
    const area = JSON.parse(sampleFile('brannock-heath', 'area.geojson')).features[0].geometry.coordinates[0];
    const quarry = JSON.parse(sampleFile('brannock-heath', 'no-data.geojson')).features[0].geometry.coordinates[0];
    const valid = turf.difference(turf.featureCollection([turf.polygon([area]), turf.polygon([quarry])]))!;
    const planarArea = (feature: Feature<Polygon | MultiPolygon>): number => {
      const polygons = feature.geometry.type === 'Polygon' ? [feature.geometry.coordinates] : feature.geometry.coordinates;
      let total = 0;
      for (const polygon of polygons) {
        polygon.forEach((ring, k) => {
          let twice = 0;
          for (let p = 0; p + 1 < ring.length; p++) twice += ring[p]![0]! * ring[p + 1]![1]! - ring[p + 1]![0]! * ring[p]![1]!;
          total += (k === 0 ? 1 : -1) * Math.abs(twice / 2);
        });
      }
      return total;
    };
    const partial = grid.features.filter((feature: { properties: { coverage: number } }) => feature.properties.coverage < 1).slice(0, 25);
    expect(partial.length).toBeGreaterThan(5);
    for (const feature of partial) {
      const clipped = turf.intersect(turf.featureCollection([turf.polygon(feature.geometry.coordinates), valid]));
      const share = clipped === null ? 0 : planarArea(clipped) / 80 ** 2;
      expect(feature.properties.coverage).toBeCloseTo(share, 6);
    }
  });

  it('grid.geojson refuses a missing or out-of-range size or placement', async () => {
    const missing = await app.inject({ method: 'GET', url: `/api/sweeps/${doneSweep.id}/grid.geojson?size=0` });
    expect(missing.statusCode).toBe(400);
    expect(missing.json().message).toContain("'placement'");
    const size = await app.inject({ method: 'GET', url: `/api/sweeps/${doneSweep.id}/grid.geojson?size=2&placement=0` });
    expect(size.statusCode).toBe(404);
    expect(size.json().message).toContain('size=2');
    const placement = await app.inject({ method: 'GET', url: `/api/sweeps/${doneSweep.id}/grid.geojson?size=0&placement=16` });
    expect(placement.statusCode).toBe(404);
  });

  it('report.html is one HTML page under a no-network content security policy; ?download=1 makes it an attachment', async () => {
    const response = await app.inject({ method: 'GET', url: `/api/sweeps/${doneSweep.id}/report.html` });
    expect(response.statusCode).toBe(200);
    expect(response.headers['content-type']).toContain('text/html');
    expect(response.headers['content-security-policy']).toContain("default-src 'none'");
    expect(response.body).toMatch(/^<!doctype html>/i);
    expect(response.body).toContain('brannock-heath');
    const download = await app.inject({ method: 'GET', url: `/api/sweeps/${doneSweep.id}/report.html?download=1` });
    expect(download.headers['content-disposition']).toMatch(/^attachment; filename="gridshake-[a-z0-9-]+-[0-9.-]+m-report\.html"$/);
  });
});

describe('GET /api/sweeps/:id/events', () => {
  it('for a finished sweep: one end event with the final status, then the stream closes', async () => {
    const response = await app.inject({ method: 'GET', url: `/api/sweeps/${doneSweep.id}/events` });
    expect(response.statusCode).toBe(200);
    expect(response.headers['content-type']).toContain('text/event-stream');
    expect(response.headers['access-control-allow-origin']).toBeUndefined();
    const events = parseEvents(response.body);
    expect(events).toEqual([
      { event: 'end', data: { id: doneSweep.id, status: 'done', progress: doneSweep.progress, error: null } },
    ]);
  });

  it('answers 404 (JSON) for an unknown sweep', async () => {
    const response = await app.inject({ method: 'GET', url: '/api/sweeps/00000000-0000-4000-8000-000000000000/events' });
    expect(response.statusCode).toBe(404);
    expect(response.json().code).toBe('GS_ERR_NOT_FOUND');
  });
});
