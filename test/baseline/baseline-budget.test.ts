import type { FastifyInstance } from 'fastify';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { loadDataset } from '../../server/inputs/index.js';
import { assertWithinBudget, estimateSweep } from '../../server/sweeps/sweep-budget.js';
import { planCost } from '../../client/src/plan/plan-estimate.js';
import { BASELINE_PIECE_WORK, BASELINE_VERTEX_WORK, baselineSizeOf, baselineWork, planWork } from '../../shared/plan-rules.js';
import { baselineSize } from '../../workers/baseline/baseline.js';
import type { GridshakeError } from '../../server/errors.js';
import { multipartBody, testApp } from '../server/server-helpers.js';
import { SweepPool } from '../../server/sweeps/sweep-pool.js';
import { polygonFile } from './baseline-fixtures.js';
import { blocksGeoJson, csv, populationPoints, TOWN } from './population-fixtures.js';

/**
 * The sweep work budget counts the population at risk (issue 15): the areal weighting of every polygon piece onto
 * every placement's grid, the polygon-intensity simulation, and the controls counted per placement
 * (shared/plan-rules.ts baselineWork). A plan that fits the old measure (points x placements x sizes x (1 + sims))
 * but not the new one is refused with GS_ERR_BUDGET, by the API, the runner and the page's estimate alike.
 * The expected numbers are worked by hand from the formula in shared/plan-rules.ts.
 */
const N = 400;
const town = () =>
  loadDataset(
    {
      points: { name: 'points.csv', content: csv(populationPoints(N, 3)) },
      area: { name: 'area.geojson', content: polygonFile([TOWN]) },
      baseline: { name: 'blocks.geojson', content: blocksGeoJson() },
    },
    { crs: 'planar', baselineField: 'residents' },
  );

function refusal(run: () => void): GridshakeError {
  try {
    run();
  } catch (error) {
    return error as GridshakeError;
  }
  throw new Error('expected a refusal');
}

describe('baselineWork', () => {
  it('polygons: sizes x placements x (64 pieces + 8 vertices) plus sims x points x ceil(log2(pieces + 1))', () => {
    const size = { kind: 'polygons' as const, pieces: 16, vertices: 64, controls: 0 };
    // 2 sizes x 10 placements x (64·16 + 8·64 = 1536) = 30720; 9 sims x 400 points x ceil(log2 17) = 5 -> 18000
    expect(BASELINE_PIECE_WORK).toBe(64);
    expect(BASELINE_VERTEX_WORK).toBe(8);
    expect(baselineWork(size, N, 10, 2, 9)).toBe(30720 + 18000);
    // the total adds the old measure: 400 x 10 x 2 x 10 = 80000
    expect(planWork(N, 10, 2, 9, size)).toMatchObject({ work: 80000 + 48720, baselineWork: 48720, evaluations: 200 });
  });
  it('controls: sizes x placements x controls; area: nothing', () => {
    expect(baselineWork({ kind: 'controls', pieces: 0, vertices: 0, controls: 300 }, N, 10, 2, 9)).toBe(6000);
    expect(baselineWork(undefined, N, 10, 2, 9)).toBe(0);
    expect(planWork(N, 10, 2, 9)).toMatchObject({ work: 80000, baselineWork: 0 });
  });
  it('the dataset records its pieces and vertices, the same as the engine data', () => {
    const dataset = town();
    // 16 blocks, each a rectangle of 4 vertices inside the town
    expect(baselineSize(dataset.baseline!.engine)).toEqual({ kind: 'polygons', pieces: 16, vertices: 64, controls: 0 });
    expect(dataset.baseline!.info).toMatchObject({ pieces: 16, vertices: 64 });
    expect(baselineSizeOf(dataset.baseline!.info)).toEqual(baselineSize(dataset.baseline!.engine));
  });
});

describe('a plan within the old budget but over the new one', () => {
  // 1 size x 100 placements x 0 sims: old 400 x 100 = 40000; baseline 100 x 1536 = 153600; total 193600
  const plan = { cells: [250], placements: 100, sims: 0, seed: 3 };
  const budget = 100_000;
  const size = { kind: 'polygons' as const, pieces: 16, vertices: 64, controls: 0 };

  it('is refused by the budget check with the coded message', () => {
    expect(planWork(N, 100, 1, 0).work).toBeLessThanOrEqual(budget);
    const estimate = estimateSweep({ ...plan, rotation: true, design: 'halton', minCoverage: 0.5, alpha: 0.05 }, N, budget, { baseline: size });
    expect(estimate).toMatchObject({ work: 193600, baselineWork: 153600 });
    const error = refusal(() => assertWithinBudget(estimate));
    expect(error.code).toBe('GS_ERR_BUDGET');
    expect(error.message).toBe(
      'the plan needs 1.94e+5 point-placements (points x placements x sizes x (1 + sims), plus 1.54e+5 for the population at risk), ' +
        '1.9 times the budget of 1.00e+5; shrink it at least 2-fold: fewer placements, fewer sims or fewer cell sizes, ' +
        'or a baseline with fewer or simpler polygons',
    );
  });

  it("is marked too large by the page's live estimate", () => {
    const info = town().baseline!.info;
    const cost = planCost({ ...plan, rotation: true, design: 'halton', minCoverage: 0.5, alpha: 0.05 }, N, budget, info);
    expect(cost.work).toBe(193600);
    expect(cost.refusal).toMatch(/^Too large: 1\.94e\+5 point-placements is 1\.9 times the budget/);
    expect(planCost({ ...plan, rotation: true, design: 'halton', minCoverage: 0.5, alpha: 0.05 }, N, budget).refusal).toBeNull();
  });

  it('the sweep runner refuses it from the engine data before any task starts', async () => {
    const pool = new SweepPool({ threads: 1, budget });
    try {
      const run = pool.runSweep(town(), { ...plan, rotation: true, design: 'halton', minCoverage: 0.5, alpha: 0.05 });
      await expect(run).rejects.toMatchObject({ code: 'GS_ERR_BUDGET' });
      await expect(run).rejects.toThrow(/plus 1\.54e\+5 for the population at risk/);
    } finally {
      await pool.destroy();
    }
  });

  describe('over HTTP', () => {
    let app: FastifyInstance;
    let close: () => Promise<void>;
    // a server sweep also computes the stability surface (its own share of the budget, the same with or without a
    // baseline: 2 km x 2 km at 250 m cells has 64 x 64 pixels of 31.25 m, x 100 placements x SURFACE_PIXEL_WEIGHT);
    // the server's budget leaves room for it, so that only the baseline's work tips the plan over
    const surfaceWork = estimateSweep({ ...plan, rotation: true, design: 'halton', minCoverage: 0.5, alpha: 0.05 }, N, budget, {
      surface: { bbox: { minX: 0, minY: 0, maxX: 2000, maxY: 2000 }, cellSizes: [250] },
    }).surfaceWork as number;
    beforeAll(async () => {
      ({ app, close } = await testApp({ workBudget: budget + surfaceWork }));
    });
    afterAll(async () => close());

    const upload = async (withBaseline: boolean) => {
      const parts = [
        { field: 'points', value: csv(populationPoints(N, 3)), filename: 'points.csv' },
        { field: 'area', value: polygonFile([TOWN]), filename: 'area.geojson' },
        { field: 'crs', value: 'planar' },
        ...(withBaseline ? [{ field: 'baseline', value: blocksGeoJson(), filename: 'blocks.geojson' }, { field: 'baselineField', value: 'residents' }] : []),
      ];
      const response = await app.inject({ method: 'POST', url: '/api/datasets', ...(await multipartBody(parts)) });
      expect(response.statusCode, response.body).toBe(201);
      return response.json().id as string;
    };

    it('POST /api/sweeps refuses it against the baseline (400 GS_ERR_BUDGET) and accepts it against area', async () => {
      const against = await app.inject({ method: 'POST', url: '/api/sweeps', payload: { datasetId: await upload(true), plan } });
      expect(against.statusCode).toBe(400);
      expect(against.json()).toMatchObject({ code: 'GS_ERR_BUDGET' });
      expect(against.json().message).toContain('plus 1.54e+5 for the population at risk');
      const area = await app.inject({ method: 'POST', url: '/api/sweeps', payload: { datasetId: await upload(false), plan } });
      expect(area.statusCode, area.body).toBe(202);
    }, 60_000);
  });
});
