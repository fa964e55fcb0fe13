import { describe, expect, it } from 'vitest';
import { GridshakeError } from '../../server/errors.js';
import { normalizePlan, PLAN_LIMITS, resolveCellSizes } from '../../server/sweeps/plan.js';

// Regression tests for plan bugs found by the security tests, named after the bug.
describe('plan regressions', () => {
  it('a cell size of 0.09 m on a 1 km square passed the work budget, then took 50 s and 4 GB for one placement', () => {
    const validArea = 1000 * 1000;
    let error: unknown = null;
    try {
      resolveCellSizes(normalizePlan({ cells: [150, 0.09], placements: 2, sims: 0 }), validArea, 60);
    } catch (caught) {
      error = caught;
    }
    expect(error).toBeInstanceOf(GridshakeError);
    expect((error as GridshakeError).code).toBe('GS_ERR_PARAMETER');
    expect((error as GridshakeError).message).toMatch(/^cell side 2 gives cells of 0\.09 m, about 123457000 cells in the valid region of 1000000 m², more than 4194304; use cells of at least 0\.488281 m$/);
    expect((error as GridshakeError).cliMessage).toMatch(/^--cells value 2 gives cells of 0\.09 m/);
    // the smallest side still allowed: sqrt(1e6 / 2^22) = 0.48828125 m
    expect(resolveCellSizes(normalizePlan({ cells: [0.48828125], placements: 2, sims: 0 }), validArea, 60)).toEqual([0.48828125]);
    expect(PLAN_LIMITS.maxCellsInRegion).toBe(4194304);
  });

  it('expected points per cell far below one gave the same unbounded grids', () => {
    expect(() => resolveCellSizes(normalizePlan({ perCell: [1e-6], placements: 2, sims: 0 }), 1e6, 60)).toThrow(/^the cell side for expected points per cell value 1 gives cells of/);
  });
});
