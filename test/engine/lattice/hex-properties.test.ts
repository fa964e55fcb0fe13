import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { createCellCounter } from '../../../workers/placement/cell-counter.js';
import { evaluatePlacement } from '../../../workers/placement/evaluate-placement.js';
import { latticeOf } from '../../../workers/lattice/registry.js';
import type { CoverageGrid, Origin, Placement, Region } from '../../../workers/types.js';
import { regionFromRings, starRing } from '../geometry/region-fixtures.js';
import { contractCell, nextDown, nextUp, oracleHex } from './hex-oracle.js';

const hex = latticeOf('hex');

function regionOf(fractions: number[]): Region {
  const shell = starRing(0, 0, 300, 500, fractions.slice(0, 30));
  const hole = starRing(40, -30, 50, 120, fractions.slice(30, 46), true);
  return regionFromRings([shell, hole]);
}

const fractionsArbitrary = fc.array(fc.double({ min: 0, max: 0.999, noNaN: true }), { minLength: 46, maxLength: 46 });
const offset = fc.double({ min: 0, max: 0.999999, noNaN: true });
const angleArbitrary = fc.double({ min: 0, max: 59.999, noNaN: true });
const cellArbitrary = fc.double({ min: 40, max: 150, noNaN: true });

/** Map from cell key to coverage (cells with coverage > 0) and to counts, for comparing two placements. */
function cellMap(grid: CoverageGrid, counts: Int32Array, rename: (i: number, j: number) => [number, number]) {
  const result = new Map<string, [number, number]>();
  for (let r = 0; r < grid.ny; r++) {
    for (let c = 0; c < grid.nx; c++) {
      const k = r * grid.nx + c;
      if (grid.coverage[k]! > 1e-12) {
        const [i, j] = rename(grid.i0 + c, grid.j0 + r);
        result.set(`${i},${j}`, [grid.coverage[k]!, counts[k]!]);
      }
    }
  }
  return result;
}

function expectSameCells(a: Map<string, [number, number]>, b: Map<string, [number, number]>): void {
  const keys = new Set([...a.keys(), ...b.keys()]);
  for (const key of keys) {
    const [coverageA, countA] = a.get(key) ?? [0, 0];
    const [coverageB, countB] = b.get(key) ?? [0, 0];
    expect(Math.abs(coverageA - coverageB), key).toBeLessThan(1e-12);
    // points outside the region may fall outside one of the two grids (their extents differ): cells that meet the
    // region lie inside both
    if (coverageA > 1e-12) expect(countA, key).toBe(countB);
  }
}

function uniformPoints(count: number, seed: number, half: number): Float64Array {
  let state = seed >>> 0;
  const xy = new Float64Array(2 * count);
  for (let k = 0; k < xy.length; k++) {
    state = (Math.imul(state, 1664525) + 1013904223) >>> 0;
    xy[k] = (state / 2 ** 32 - 0.5) * 2 * half;
  }
  return xy;
}

function run(region: Region, origin: Origin, xy: Float64Array, cellSize: number, placement: Placement) {
  const grid = hex.coverage(region, origin, cellSize, placement);
  const counts = new Int32Array(grid.nx * grid.ny);
  createCellCounter(xy, origin).count(grid, cellSize, placement, counts);
  return { grid, counts };
}

describe('hexagonal lattice: properties of the contract', () => {
  it('the angle period is 60 degrees (square: 90)', () => {
    expect(hex.anglePeriod).toBe(60);
    expect(latticeOf('square').anglePeriod).toBe(90);
  });

  it('coverage sums to the valid area (relative 1e-12)', () => {
    fc.assert(
      fc.property(fractionsArbitrary, offset, offset, angleArbitrary, cellArbitrary, (fractions, u, v, angle, cellSize) => {
        const region = regionOf(fractions);
        const grid = hex.coverage(region, { x: region.bbox.minX, y: region.bbox.minY }, cellSize, { u, v, angle });
        let sum = 0;
        for (const c of grid.coverage) sum += c;
        expect(Math.abs((sum * cellSize * cellSize) / region.area - 1)).toBeLessThan(1e-12);
      }),
      { numRuns: 60, seed: 161 },
    );
  });

  it('a whole lattice vector added to the offset changes nothing (cells renamed by that vector)', () => {
    fc.assert(
      fc.property(
        fractionsArbitrary,
        offset,
        offset,
        angleArbitrary,
        cellArbitrary,
        fc.constantFrom<[number, number]>([1, 0], [0, 1], [-1, 1], [2, -3]),
        (fractions, u, v, angle, cellSize, [di, dj]) => {
          const region = regionOf(fractions);
          const origin = { x: region.bbox.minX, y: region.bbox.minY };
          const xy = uniformPoints(400, Math.floor(u * 1e9), 520);
          const base = run(region, origin, xy, cellSize, { u, v, angle });
          const moved = run(region, origin, xy, cellSize, { u: u + di, v: v + dj, angle });
          // centre (i + u + di, j + v + dj): cell (i, j) of the moved lattice is cell (i + di, j + dj) of the base one
          expectSameCells(cellMap(base.grid, base.counts, (i, j) => [i, j]), cellMap(moved.grid, moved.counts, (i, j) => [i + di, j + dj]));
        },
      ),
      { numRuns: 40, seed: 162 },
    );
  });

  it('a 60 degree turn changes nothing (cells renamed by the turn)', () => {
    fc.assert(
      fc.property(fractionsArbitrary, fc.constantFrom(0, 0.25, 0.5), fc.constantFrom(0, 0.25, 0.5), angleArbitrary, cellArbitrary, (fractions, u, v, angle, cellSize) => {
        const region = regionOf(fractions);
        const origin = { x: region.bbox.minX, y: region.bbox.minY };
        const xy = uniformPoints(400, Math.floor(angle * 1e7), 520);
        // turning by 60 degrees maps the centre (i + u) E1 + (j + v) E2 to -(j + v) E1 + (i + u + j + v) E2
        // (E1, E2 the lattice vectors): the same lattice at offset (frac(-v), frac(u + v)). Offsets are dyadic so that
        // 1 - v and u + v are exact.
        const u2 = v === 0 ? 0 : 1 - v;
        const v2 = (u + v) % 1;
        const turned = run(region, origin, xy, cellSize, { u, v, angle: angle + 60 });
        const base = run(region, origin, xy, cellSize, { u: u2, v: v2, angle });
        const rename = (i: number, j: number): [number, number] => [-(j + v) - u2, i + u + j + v - v2];
        expectSameCells(cellMap(base.grid, base.counts, (i, j) => [i, j]), cellMap(turned.grid, turned.counts, rename));
      }),
      { numRuns: 40, seed: 163 },
    );
  });

  it('points on hexagon sides and corners (and one float step off) follow the rounding rule', () => {
    const region = regionFromRings([[[0, 0], [2000, 0], [2000, 1500], [0, 1500]]]);
    const origin = { x: 0, y: 0 };
    fc.assert(
      fc.property(offset, offset, fc.constantFrom(0, 0, 17.5, 45), fc.constantFrom(0.1 * 3 * 100, 64, 100), (u, v, angle, cellSize) => {
        const placement = { u, v, angle };
        const values: number[] = [];
        for (let j = 1; j < 8; j++) {
          for (let i = 1; i < 8; i++) {
            const polygon = oracleHex(origin, cellSize, placement, i, j).polygon;
            for (let k = 0; k < 6; k++) {
              const [xa, ya] = polygon[k]!;
              const [xb, yb] = polygon[(k + 1) % 6]!;
              for (const f of [0, 0.5, 1 / 3]) {
                const x = xa + f * (xb - xa);
                const y = ya + f * (yb - ya);
                values.push(x, y, nextUp(x), y, x, nextDown(y));
              }
            }
          }
        }
        const xy = Float64Array.from(values);
        const grid = hex.coverage(region, origin, cellSize, placement);
        const counts = new Int32Array(grid.nx * grid.ny);
        createCellCounter(xy, origin).count(grid, cellSize, placement, counts);
        const expected = new Int32Array(grid.nx * grid.ny);
        const frame = hex.frame(origin, cellSize, placement);
        for (let p = 0; p < xy.length / 2; p++) {
          const cell = contractCell(origin, cellSize, placement, xy[2 * p]!, xy[2 * p + 1]!);
          if (placement.angle === 0) expect(frame.cellOfPoint(xy[2 * p]!, xy[2 * p + 1]!)).toEqual(cell);
          expected[(cell[1] - grid.j0) * grid.nx + (cell[0] - grid.i0)]!++;
        }
        expect(Array.from(counts)).toEqual(Array.from(expected));
      }),
      { numRuns: 40, seed: 164 },
    );
  });

  it('the fast path agrees with the rule far from the origin (large axial coordinates) and at the grid border', () => {
    fc.assert(
      fc.property(offset, offset, angleArbitrary, fc.constantFrom(3, 7.5, 20), fc.integer({ min: 1, max: 2 ** 30 }), (u, v, angle, cellSize, seed) => {
        const placement = { u, v, angle };
        const origin = { x: 0, y: 0 };
        const region = regionFromRings([[[4e6, 3e6], [4e6 + 900, 3e6], [4e6 + 900, 3e6 + 700], [4e6, 3e6 + 700]]]);
        const xy = uniformPoints(3000, seed, 700).map((value, k) => value + (k % 2 === 0 ? 4e6 + 450 : 3e6 + 350));
        const grid = hex.coverage(region, origin, cellSize, placement);
        const counts = new Int32Array(grid.nx * grid.ny);
        createCellCounter(xy, origin).count(grid, cellSize, placement, counts);
        const expected = new Int32Array(grid.nx * grid.ny);
        for (let p = 0; p < xy.length / 2; p++) {
          const [i, j] = contractCell(origin, cellSize, placement, xy[2 * p]!, xy[2 * p + 1]!);
          const c = i - grid.i0;
          const r = j - grid.j0;
          if (c >= 0 && c < grid.nx && r >= 0 && r < grid.ny) expected[r * grid.nx + c]!++;
        }
        expect(Array.from(counts)).toEqual(Array.from(expected));
      }),
      { numRuns: 25, seed: 165 },
    );
  });

  it('exact ties go where the rule sends them (angle 0: q = k/2 exactly on the x axis)', () => {
    const origin = { x: 0, y: 0 };
    const cellSize = 100;
    const a = cellSize * Math.sqrt(2 / (3 * Math.sqrt(3)));
    const placement = { u: 0, v: 0, angle: 0 };
    const ties: [number, number][] = [];
    for (let k = 1; k < 40; k += 2) {
      const x = (k * Math.sqrt(3) * a) / 2;
      if (x / (Math.sqrt(3) * a) === k / 2) ties.push([x, 0]);
    }
    expect(ties.length).toBeGreaterThan(5);
    const frame = hex.frame(origin, cellSize, placement);
    for (const [x, y] of ties) {
      // q = k/2, r = 0, m = -k/2: q and m move 1/2, r none; q did not move strictly more than m, m more than r: m is
      // replaced, so the cell is (round(k/2), 0), the neighbour in +x (halves go up)
      const expected: [number, number] = [Math.round(x / (Math.sqrt(3) * a)), 0];
      expect(frame.cellOfPoint(x, y)).toEqual(expected);
      expect(contractCell(origin, cellSize, placement, x, y)).toEqual(expected);
    }
    const region = regionFromRings([[[-10, -500], [3000, -500], [3000, 500], [-10, 500]]]);
    const grid = hex.coverage(region, origin, cellSize, placement);
    const counts = new Int32Array(grid.nx * grid.ny);
    createCellCounter(Float64Array.from(ties.flat()), origin).count(grid, cellSize, placement, counts);
    for (const [x] of ties) expect(counts[(0 - grid.j0) * grid.nx + (Math.round(x / (Math.sqrt(3) * a)) - grid.i0)]).toBe(1);
  });

  it('statistics unchanged: a placement of hexagons runs through the same kept-cell rule and statistics', () => {
    const region = regionFromRings([[[0, 0], [1200, 0], [1200, 900], [0, 900]]]);
    const origin = { x: 0, y: 0 };
    const xy = uniformPoints(2000, 7, 600).map((value, k) => value + (k % 2 === 0 ? 600 : 450));
    const evaluated = evaluatePlacement({
      counter: createCellCounter(xy, origin),
      region,
      origin,
      cellSize: 100,
      placement: { u: 0.3, v: 0.6, angle: 20 },
      minCoverage: 1,
      alpha: 0.05,
      shape: 'hex',
    });
    expect(evaluated.grid.shape).toBe('hex');
    // whole hexagons only: chi2 = (m - 1) vmr (design.md), expected per cell N s^2 / sum(a)
    expect(evaluated.stats.chi2).toBeCloseTo((evaluated.stats.cells - 1) * evaluated.stats.vmr, 9);
    expect(evaluated.stats.expectedPerCell).toBeCloseTo(evaluated.stats.points / evaluated.stats.cells, 12);
    expect(evaluated.stats.cells).toBeGreaterThan(60);
  });
});
