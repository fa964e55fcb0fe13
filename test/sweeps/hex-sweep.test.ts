import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Dataset, PlacementRow } from '../../shared/contracts.js';
import { insideCoordinates } from '../../server/inputs/index.js';
import { normalizePlan, planShapes } from '../../server/sweeps/plan.js';
import { estimateSweep } from '../../server/sweeps/sweep-budget.js';
import { SweepPool } from '../../server/sweeps/sweep-pool.js';
import { createCellCounter, evaluatePlacement } from '../../workers/placement/index.js';
import { haltonPlacements } from '../../workers/random/index.js';
import { fixtureDataset } from './sweep-fixtures.js';

// Sweeps with hexagonal cells (issue 16). The pool runs dist/workers (npm test builds first). The hexagon engine
// itself is checked against an independent oracle (polygons clipped one by one, brute-force nearest centre) in the
// engine suites; here: the sweep path hands every chunk its shape and the lattice's angle period, and a sweep of
// both shapes is the two single-shape sweeps side by side.

let pool: SweepPool;
let clustered: Dataset;

beforeAll(() => {
  pool = new SweepPool({ threads: 2 });
  clustered = fixtureDataset(1500, true);
});

afterAll(async () => {
  await pool.destroy();
});

/** The statistics of a row that the engine computes (everything but the placement's identity). */
function statistics(row: PlacementRow): Omit<PlacementRow, 'sizeIndex'> {
  const { sizeIndex: _ignored, ...rest } = row;
  return rest;
}

describe('plan field shape', () => {
  it('accepts one shape or a list, keeps it as given, and runs squares when absent', () => {
    expect(normalizePlan({ cells: [100] }).shape).toBeUndefined();
    expect(planShapes(normalizePlan({ cells: [100] }))).toEqual(['square']);
    expect(normalizePlan({ cells: [100], shape: 'hex' }).shape).toBe('hex');
    expect(planShapes(normalizePlan({ cells: [100], shape: ['square', 'hex'] }))).toEqual(['square', 'hex']);
    expect(planShapes(normalizePlan({ cells: [100], shape: ['hex', 'square'] }))).toEqual(['hex', 'square']);
  });

  it('refuses unknown shapes, repeats and empty lists with a parameter error naming the field', () => {
    expect(() => normalizePlan({ cells: [100], shape: 'triangle' })).toThrow(/shape.*must be one of square, hex or a list of them/);
    expect(() => normalizePlan({ cells: [100], shape: [] })).toThrow(/shape.*must be one of square, hex or a list/);
    expect(() => normalizePlan({ cells: [100], shape: ['hex', 'hex'] })).toThrow(/names hex twice/);
    expect(() => normalizePlan({ cells: [100], shape: ['square', 'circle'] })).toThrow(/must be one of square, hex, got "circle"/);
    expect(() => normalizePlan({ cells: [100], shape: 3 })).toThrow(/GS_ERR_PARAMETER|must be one of/);
  });

  it('counts every (shape, cell size) pair in the work estimate', () => {
    const one = estimateSweep(normalizePlan({ cells: [10, 20], placements: 100, sims: 19 }), 1000, 1e12);
    const two = estimateSweep(normalizePlan({ cells: [10, 20], placements: 100, sims: 19, shape: ['square', 'hex'] }), 1000, 1e12);
    expect(two.work).toBe(2 * one.work);
    expect(two.tasks).toBe(2 * one.tasks);
    expect(two.evaluations).toBe(2 * (one.evaluations ?? 0));
  });
});

describe('hexagon sweeps', () => {
  it('gives per placement exactly what evaluatePlacement gives with shape hex, on the Halton design over 60 degrees', async () => {
    const plan = normalizePlan({ cells: [90, 130], placements: 24, sims: 0, minCoverage: 0.5, shape: 'hex' });
    const { rows, summary } = await pool.runSweep(clustered, plan);
    expect(rows).toHaveLength(48);
    const design = haltonPlacements(24, true, 60);
    const counter = createCellCounter(insideCoordinates(clustered), clustered.origin);
    for (const row of rows) {
      expect(row.shape).toBe('hex');
      const placement = design[row.placementIndex];
      expect([row.u, row.v, row.angle]).toEqual([placement.u, placement.v, placement.angle]);
      expect(row.angle).toBeGreaterThanOrEqual(0);
      expect(row.angle).toBeLessThan(60);
      const { stats } = evaluatePlacement({
        counter,
        region: clustered.region,
        origin: clustered.origin,
        cellSize: row.cellSize,
        placement,
        minCoverage: 0.5,
        alpha: plan.alpha,
        shape: 'hex',
      });
      expect(row.cells).toBe(stats.cells);
      expect(row.points).toBe(stats.points);
      expect(row.chi2).toBe(stats.chi2);
      expect(row.df).toBe(stats.df);
      expect(row.vmr).toBe(stats.vmr);
      expect(row.pClustered).toBe(stats.pClustered);
      expect(row.pRegular).toBe(stats.pRegular);
      expect(row.verdict).toBe(stats.verdict);
    }
    // hexagons and squares of the same area keep different cells at the same placement
    const squares = await pool.runSweep(clustered, normalizePlan({ cells: [90, 130], placements: 24, sims: 0, minCoverage: 0.5 }));
    expect(squares.rows.map((row) => row.cells)).not.toEqual(rows.map((row) => row.cells));
    expect(summary.sizes.map((size) => [size.sizeIndex, size.cellSize, size.shape])).toEqual([
      [0, 90, 'hex'],
      [1, 130, 'hex'],
    ]);
    expect(summary.sizes[0].conclusion).toMatch(/^90 m hexagonal cells: /);
  });

  it('runs square,hex as the square sweep and the hex sweep side by side, on the same design and simulated patterns', async () => {
    const base = { cells: [80, 120], placements: 20, sims: 9, seed: 4, alpha: 0.1 };
    const [both, squares, hexes] = await Promise.all([
      pool.runSweep(clustered, normalizePlan({ ...base, shape: ['square', 'hex'] })),
      pool.runSweep(clustered, normalizePlan(base)),
      pool.runSweep(clustered, normalizePlan({ ...base, shape: 'hex' })),
    ]);
    expect(both.rows).toHaveLength(80);
    const squareRows = both.rows.filter((row) => row.shape === 'square');
    const hexRows = both.rows.filter((row) => row.shape === 'hex');
    // the square half is bit for bit the square sweep, sizeIndex included
    expect(squareRows).toEqual(squares.rows);
    expect(hexRows.map(statistics)).toEqual(hexes.rows.map(statistics));
    expect(hexRows.map((row) => row.sizeIndex)).toEqual(hexes.rows.map((row) => row.sizeIndex + 2));
    // same design: equal offsets, angles at the same fraction of each lattice's period (90 and 60 degrees)
    for (let k = 0; k < squareRows.length; k++) {
      expect(hexRows[k].u).toBe(squareRows[k].u);
      expect(hexRows[k].v).toBe(squareRows[k].v);
      expect(hexRows[k].angle / 60).toBeCloseTo(squareRows[k].angle / 90, 12);
    }
    expect(both.summary.sizes.map((size) => [size.sizeIndex, size.cellSize, size.shape])).toEqual([
      [0, 80, 'square'],
      [1, 120, 'square'],
      [2, 80, 'hex'],
      [3, 120, 'hex'],
    ]);
    // each (shape, size) entry has the Monte Carlo result of its single-shape sweep: the same simulated patterns
    expect(both.summary.sizes[0].monteCarlo).toEqual(squares.summary.sizes[0].monteCarlo);
    expect(both.summary.sizes[1].monteCarlo).toEqual(squares.summary.sizes[1].monteCarlo);
    expect(both.summary.sizes[2].monteCarlo).toEqual(hexes.summary.sizes[0].monteCarlo);
    expect(both.summary.sizes[3].monteCarlo).toEqual(hexes.summary.sizes[1].monteCarlo);
    expect(both.summary.sizes[2].conclusion).toBe(hexes.summary.sizes[0].conclusion);
    expect(squares.summary.sizes.every((size) => size.shape === 'square')).toBe(true);
  });
});
