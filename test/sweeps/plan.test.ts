import { describe, it, expect } from 'vitest';
import { DEFAULT_PLAN, SURFACE_PIXEL_WEIGHT } from '../../shared/plan-rules.js';
import { GridshakeError } from '../../server/errors.js';
import { normalizePlan, resolveCellSizes } from '../../server/sweeps/plan.js';
import { assertWithinBudget, chunkPlacements, estimateSweep, surfacePixels, workBudgetFromEnv, DEFAULT_WORK_BUDGET } from '../../server/sweeps/sweep-budget.js';

/** The error `action` throws (undefined when it throws none). */
function thrownBy(action: () => unknown): GridshakeError | undefined {
  try {
    action();
  } catch (caught) {
    return caught as GridshakeError;
  }
  return undefined;
}

function parameterFailure(input: unknown): GridshakeError {
  try {
    normalizePlan(input);
  } catch (error) {
    expect(error).toBeInstanceOf(GridshakeError);
    expect((error as GridshakeError).code).toBe('GS_ERR_PARAMETER');
    expect((error as GridshakeError).statusCode).toBe(400);
    return error as GridshakeError;
  }
  throw new Error(`normalizePlan accepted ${JSON.stringify(input)}`);
}

describe('normalizePlan', () => {
  it('fills the defaults of DEFAULT_PLAN', () => {
    expect(normalizePlan({ cells: [100, 200] })).toEqual({ ...DEFAULT_PLAN, cells: [100, 200] });
    expect(normalizePlan({ perCell: [5], placements: 16, rotation: false, sims: 0, seed: -3 })).toEqual({
      ...DEFAULT_PLAN,
      perCell: [5],
      placements: 16,
      rotation: false,
      sims: 0,
      seed: -3,
    });
  });

  it('needs exactly one of cells or perCell', () => {
    // one message source, two phrasings: the page's field labels, the command line's flags
    expect(parameterFailure({}).message).toBe('the plan needs exactly one of the "Cell sides" field (cell sides in metres) or the "Expected points per cell" field (expected points per cell)');
    expect(parameterFailure({}).cliMessage).toBe('give exactly one of --cells (cell sides in metres) or --per-cell (expected points per cell)');
    expect(parameterFailure({ cells: [1], perCell: [5] }).message).toMatch(/exactly one of the "Cell sides" field/);
  });

  it('names the field and the allowed range of every bad value', () => {
    expect(parameterFailure({ cells: [1], placements: 0 }).message).toBe('the "Placements per cell side" field must be an integer from 1 to 65536, got 0');
    expect(parameterFailure({ cells: [1], placements: 0 }).cliMessage).toBe('--placements must be an integer from 1 to 65536, got 0');
    expect(parameterFailure({ cells: [1], placements: 65537 }).message).toContain('from 1 to 65536');
    expect(parameterFailure({ cells: [1], placements: 2.5 }).message).toContain('"Placements per cell side"');
    expect(parameterFailure({ cells: [1], sims: 10000 }).message).toBe('the "CSR simulations" field must be an integer from 0 to 9999, got 10000');
    expect(parameterFailure({ cells: [1], alpha: 0 }).message).toBe('the "alpha" field must be a number in (0, 0.5], got 0');
    expect(parameterFailure({ cells: [1], alpha: 0.6 }).message).toContain('(0, 0.5]');
    expect(parameterFailure({ cells: [1], minCoverage: 1.01 }).message).toBe('the "minCoverage" field must be a number in (0, 1], got 1.01');
    expect(parameterFailure({ cells: [1], minCoverage: 0 }).cliMessage).toContain('--min-coverage');
    expect(parameterFailure({ cells: [1], seed: 1.5 }).message).toBe('the "Seed" field must be an integer, got 1.5');
    expect(parameterFailure({ cells: [1], rotation: 'yes' }).message).toContain('the "Rotate the grids" field must be true or false');
    expect(parameterFailure({ cells: [1], design: 'random' }).message).toBe('the "Placement design" field must be one of halton, lattice, got "random"');
    expect(parameterFailure({ cells: [1], placement: 4 }).message).toContain('plan.placement is not a plan field');
    expect(parameterFailure('cells=1').message).toContain('plan must be an object');
  });

  it('accepts up to 16 positive finite cell sizes', () => {
    expect(normalizePlan({ cells: Array.from({ length: 16 }, (_, i) => i + 1) }).cells).toHaveLength(16);
    expect(parameterFailure({ cells: Array.from({ length: 17 }, (_, i) => i + 1) }).message).toContain('1 to 16 cell sides in metres');
    expect(parameterFailure({ cells: [] }).message).toContain('1 to 16');
    expect(parameterFailure({ cells: [100, -1] }).message).toBe('cell side 2 must be a positive finite number (cell sides in metres), got -1');
    expect(parameterFailure({ cells: [100, -1] }).cliMessage).toBe('--cells value 2 must be a positive finite number (cell sides in metres), got -1');
    expect(parameterFailure({ perCell: [5, null] }).cliMessage).toContain('--per-cell value 2 must be a positive finite number (expected points per cell)');
    expect(parameterFailure({ cells: [1e400] }).message).toContain('cell side 1 ');
  });
});

describe('resolveCellSizes', () => {
  it('turns expected points per cell into sides sqrt(k A / n) (shared/reference-values.md, rules of thumb)', () => {
    // A = 1e6 m^2, n = 400: k = 5 -> sqrt(12500) = 111.8034; k = 1.6 -> sqrt(4000) = 63.2456
    const sizes = resolveCellSizes(normalizePlan({ perCell: [5, 1.6] }), 1e6, 400);
    expect(sizes[0]).toBeCloseTo(111.80339887, 7);
    expect(sizes[1]).toBeCloseTo(63.24555320, 7);
  });

  it('refuses a cell size that leaves fewer than 2 cells in the valid region', () => {
    const error = thrownBy(() => resolveCellSizes(normalizePlan({ cells: [100, 800] }), 1e6, 400));
    expect(error?.code).toBe('GS_ERR_PARAMETER');
    expect(error?.message).toBe(
      'cell side 2 gives cells of 800 m, which leave fewer than 2 cells in the valid region of 1000000 m²; use cells of at most 707.107 m',
    );
    expect(error?.cliMessage).toMatch(/^--cells value 2 gives cells of 800 m/);
    expect(() => resolveCellSizes(normalizePlan({ perCell: [300] }), 1e6, 400)).toThrow(/the cell side for expected points per cell value 1 gives cells of/);
  });
});

describe('estimateSweep and assertWithinBudget', () => {
  it('counts work as points x placements x sizes x (1 + sims)', () => {
    const plan = normalizePlan({ cells: [10, 20, 30], placements: 128, sims: 19 });
    const estimate = estimateSweep(plan, 1000, 1e9);
    expect(estimate.work).toBe(1000 * 128 * 3 * 20);
    expect(estimate.budget).toBe(1e9);
    expect(estimate.evaluations).toBe(128 * 3 * 20);
    // 1e7 / (1000 * 20) = 500 placements per chunk, capped at 64: 2 chunks per size
    expect(chunkPlacements(1000, 19)).toBe(64);
    expect(estimate.tasks).toBe(6);
    expect(() => assertWithinBudget(estimate)).not.toThrow();
  });

  it('says by how much the plan is over and how to shrink it', () => {
    const estimate = estimateSweep(normalizePlan({ cells: [10, 20], placements: 1000, sims: 99 }), 1e5, 1e9);
    expect(estimate.work).toBe(2e10);
    const error = thrownBy(() => assertWithinBudget(estimate));
    expect(error?.code).toBe('GS_ERR_BUDGET');
    expect(error?.message).toBe(
      'the plan needs 2.00e+10 point-placements (points x placements x sizes x (1 + sims)), 20.0 times the budget of ' +
        '1.00e+9; shrink it at least 20-fold: fewer placements, fewer sims or fewer cell sizes',
    );
  });

  it('counts the stability surface: raster pixels (pixel side s / 8 over the box) x placements x SURFACE_PIXEL_WEIGHT, per shape', () => {
    const bbox = { minX: 0, minY: 0, maxX: 1000, maxY: 800 };
    const plan = normalizePlan({ cells: [100, 200], shape: ['square', 'hex'], placements: 64, sims: 19 });
    // cell 100 m: pixels of 12.5 m, 80 x 64; cell 200 m: 25 m, 40 x 32; once per shape
    expect(surfacePixels(plan, { bbox, cellSizes: [100, 200] })).toBe(2 * (80 * 64 + 40 * 32));
    const estimate = estimateSweep(plan, 500, 1e12, { surface: { bbox, cellSizes: [100, 200] } });
    expect(estimate.surfaceWork).toBe(2 * (80 * 64 + 40 * 32) * 64 * SURFACE_PIXEL_WEIGHT);
    // work stays the counts' (points x placements x sizes x (1 + sims)); the budget holds work + surfaceWork
    expect(estimate.work).toBe(500 * 64 * 4 * 20);
    expect(estimateSweep(plan, 500, 1e12).work).toBe(500 * 64 * 4 * 20);
    expect(() => assertWithinBudget(estimateSweep(plan, 500, 500 * 64 * 4 * 20 + (estimate.surfaceWork as number), { surface: { bbox, cellSizes: [100, 200] } }))).not.toThrow();
    expect(() => assertWithinBudget(estimateSweep(plan, 500, 500 * 64 * 4 * 20 + (estimate.surfaceWork as number) - 1, { surface: { bbox, cellSizes: [100, 200] } }))).toThrow(/stability surface/);
    expect(estimateSweep(plan, 500, 1e12).surfaceWork).toBeUndefined();
  });

  it('refuses a plan whose stability surface takes it over the budget, saying how to shrink it', () => {
    // 1000 points, 2 sizes, 256 placements, 19 sims: 1.02e7 for the counts; a 20 km x 20 km box at 25 m and 50 m
    // cells has 6400 x 6400 and 3200 x 3200 pixels, each coarsened to the 4194304-pixel limit (2048 x 2048)
    const plan = normalizePlan({ cells: [25, 50], placements: 256, sims: 19 });
    const bbox = { minX: 0, minY: 0, maxX: 20000, maxY: 20000 };
    const estimate = estimateSweep(plan, 1000, 1e9, { surface: { bbox, cellSizes: [25, 50] } });
    expect(estimateSweep(plan, 1000, 1e9).work).toBeLessThan(1e9);
    const error = thrownBy(() => assertWithinBudget(estimate));
    expect(error?.code).toBe('GS_ERR_BUDGET');
    expect(error?.statusCode).toBe(400);
    const pixels = 2 * 2048 * 2048;
    const surfaceWork = pixels * 256 * SURFACE_PIXEL_WEIGHT;
    expect(estimate.surfaceWork).toBe(surfaceWork);
    const factor = (1000 * 256 * 2 * 20 + surfaceWork) / 1e9;
    expect(error?.message).toBe(
      `the plan needs ${(1000 * 256 * 2 * 20 + surfaceWork).toExponential(2)} point-placements: 1.02e+7 for the counts ` +
        `(points x placements x sizes x (1 + sims)) and ${surfaceWork.toExponential(2)} for the stability surface ` +
        `(raster pixels x placements x ${SURFACE_PIXEL_WEIGHT}, about 64 pixels per cell), ${factor.toFixed(1)} times the budget of 1.00e+9; ` +
        `shrink it at least ${Math.ceil(factor)}-fold: fewer placements, fewer sims or fewer cell sizes, or larger cells ` +
        '(the surface has 4 times fewer pixels at twice the cell side)',
    );
  });

  it('refuses simulated patterns too large for memory', () => {
    const estimate = estimateSweep(normalizePlan({ cells: [10], placements: 1, sims: 999 }), 1e6, 1e12);
    expect(() => assertWithinBudget(estimate)).toThrow(/simulated CSR patterns would take 15244 MB .*use fewer sims/);
  });

  it('reads the budget from GRIDSHAKE_WORK_BUDGET', () => {
    expect(workBudgetFromEnv({})).toBe(DEFAULT_WORK_BUDGET);
    expect(workBudgetFromEnv({ GRIDSHAKE_WORK_BUDGET: '5e9' })).toBe(5e9);
    expect(() => workBudgetFromEnv({ GRIDSHAKE_WORK_BUDGET: 'lots' })).toThrow(/GRIDSHAKE_WORK_BUDGET must be a positive number/);
  });
});
