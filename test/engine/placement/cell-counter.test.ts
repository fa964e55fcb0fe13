import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { placementCoverage } from '../../../workers/geometry/coverage.js';
import { cellOfPoint, createGridFrame } from '../../../workers/geometry/grid-frame.js';
import { createCellCounter } from '../../../workers/placement/cell-counter.js';
import { isMortonSorted, mortonCodes, mortonSort } from '../../../workers/placement/morton-sort.js';
import type { CoverageGrid, Origin, Placement } from '../../../workers/types.js';
import { regionFromRings } from '../geometry/region-fixtures.js';
import { counterKinds } from './counter-kinds.js';

/** The grid contract computed the obvious way (grid-frame.ts, Math.floor) for every point. */
function bruteForceCounts(xy: Float64Array, origin: Origin, grid: CoverageGrid, cellSize: number, placement: Placement): Int32Array {
  const frame = createGridFrame(origin, cellSize, placement);
  const counts = new Int32Array(grid.nx * grid.ny);
  for (let p = 0; p < xy.length / 2; p++) {
    const [i, j] = cellOfPoint(frame, xy[2 * p]!, xy[2 * p + 1]!);
    const c = i - grid.i0;
    const r = j - grid.j0;
    if (c >= 0 && c < grid.nx && r >= 0 && r < grid.ny) counts[r * grid.nx + c]!++;
  }
  return counts;
}

const square = regionFromRings([[[0, 0], [1000, 0], [1000, 800], [0, 800]]]);
const origin = { x: 0, y: 0 };

describe.each(counterKinds)('createCellCounter (%s kernel): the counting kernel agrees with the grid contract exactly', (_kind, makeCounter) => {
  it('random points, placements and cell sizes (points also outside the grid)', () => {
    fc.assert(
      fc.property(
        fc.array(fc.double({ min: -200, max: 1200, noNaN: true }), { minLength: 2, maxLength: 600 }),
        fc.double({ min: 0, max: 0.999999, noNaN: true }),
        fc.double({ min: 0, max: 0.999999, noNaN: true }),
        fc.double({ min: 0, max: 89.999, noNaN: true }),
        fc.double({ min: 7, max: 400, noNaN: true }),
        (values, u, v, angle, cellSize) => {
          const xy = Float64Array.from(values.length % 2 === 0 ? values : values.slice(1));
          const placement = { u, v, angle };
          const grid = placementCoverage(square, origin, cellSize, placement);
          const out = new Int32Array(grid.nx * grid.ny).fill(7);
          makeCounter(xy, origin).count(grid, cellSize, placement, out);
          const expected = bruteForceCounts(xy, origin, grid, cellSize, placement);
          expect(Array.from(out)).toEqual(Array.from(expected));
        },
      ),
      { numRuns: 300, seed: 20261201 },
    );
  });

  it('points exactly on grid lines and one float step either side of them (angle 0, offsets 0 and 0.5)', () => {
    const cellSize = 0.1 * 3; // 0.30000000000000004: lines at k * s do not fall on round numbers
    const values: number[] = [];
    for (let k = -2; k < 40; k++) {
      for (const shift of [0, 0.5]) {
        const line = (k + shift) * cellSize;
        for (const x of [line, nextDown(line), nextUp(line)]) values.push(x, 5.5 * cellSize, 3.25 * cellSize, x);
      }
    }
    const xy = Float64Array.from(values);
    const region = regionFromRings([[[0, 0], [10, 0], [10, 10], [0, 10]]]);
    for (const placement of [{ u: 0, v: 0, angle: 0 }, { u: 0.5, v: 0.5, angle: 0 }, { u: 0.5, v: 0, angle: 0 }]) {
      const grid = placementCoverage(region, origin, cellSize, placement);
      const out = new Int32Array(grid.nx * grid.ny);
      makeCounter(xy, origin).count(grid, cellSize, placement, out);
      expect(Array.from(out)).toEqual(Array.from(bruteForceCounts(xy, origin, grid, cellSize, placement)));
    }
  });

  it('a grid far from the origin (large cell indices) still agrees', () => {
    const farOrigin = { x: -3.7e6, y: 2.1e6 };
    const region = regionFromRings([[[500000, 6000000], [503000, 6000000], [503000, 6002000], [500000, 6002000]]]);
    const xy = new Float64Array(4000);
    for (let p = 0; p < 2000; p++) {
      xy[2 * p] = 500000 + ((p * 0.7548776662466927) % 1) * 3000;
      xy[2 * p + 1] = 6000000 + ((p * 0.5698402909980532) % 1) * 2000;
    }
    for (const placement of [{ u: 0.25, v: 0.75, angle: 0 }, { u: 0.1, v: 0.2, angle: 41 }]) {
      const grid = placementCoverage(region, farOrigin, 50, placement);
      const out = new Int32Array(grid.nx * grid.ny);
      makeCounter(xy, farOrigin).count(grid, 50, placement, out);
      expect(out.reduce((a, b) => a + b, 0)).toBe(2000);
      expect(Array.from(out)).toEqual(Array.from(bruteForceCounts(xy, farOrigin, grid, 50, placement)));
    }
  });

  it('never counts NaN, infinite or far points, whichever pass takes them (odd counts: the last point takes the exact pass)', () => {
    const odd = [Number.NaN, Number.POSITIVE_INFINITY, Number.NEGATIVE_INFINITY, 1e300, -1e300, 3e9];
    for (const bad of odd) {
      // 4 points (the bad one in the fast pass), then 5 (a bad last one: the WebAssembly kernel's exact pass)
      for (const values of [[5, 5, 15, 15, 25, 5, bad, 3], [5, 5, 15, 15, 25, 5, bad, 3, 3, bad]]) {
        const xy = Float64Array.from(values);
        // u = v = 0 gives i0 = j0 = 0 on this square; u = v = 0.3 gives i0 = j0 = -1
        for (const placement of [{ u: 0, v: 0, angle: 0 }, { u: 0.3, v: 0.3, angle: 0 }, { u: 0.3, v: 0.6, angle: 30 }]) {
          const grid = placementCoverage(square, origin, 10, placement);
          const out = new Int32Array(grid.nx * grid.ny);
          makeCounter(xy, origin).count(grid, 10, placement, out);
          expect(Array.from(out)).toEqual(Array.from(bruteForceCounts(xy, origin, grid, 10, placement)));
          expect(out.reduce((a, b) => a + b, 0)).toBe(3);
        }
      }
    }
  });

  it('rejects a too short output and a bad cell size', () => {
    const grid = placementCoverage(square, origin, 100, { u: 0, v: 0, angle: 0 });
    const counter = makeCounter(new Float64Array([1, 1]), origin);
    expect(() => counter.count(grid, 100, { u: 0, v: 0, angle: 0 }, new Int32Array(3))).toThrow(/output holds 3 cells/);
    expect(() => counter.count(grid, 0, { u: 0, v: 0, angle: 0 }, new Int32Array(80))).toThrow(RangeError);
  });
});

function nextUp(x: number): number {
  const buffer = new Float64Array([x]);
  const bits = new BigInt64Array(buffer.buffer);
  if (x === 0) return Number.MIN_VALUE;
  bits[0] = bits[0]! + (x > 0 ? 1n : -1n);
  return buffer[0]!;
}

function nextDown(x: number): number {
  return -nextUp(-x);
}

describe('mortonSort', () => {
  it('returns a permutation of the points ordered by Z-order code, and counts do not change', () => {
    const n = 5000;
    const xy = new Float64Array(2 * n);
    for (let p = 0; p < n; p++) {
      xy[2 * p] = ((p * 0.7548776662466927) % 1) * 1000;
      xy[2 * p + 1] = ((p * 0.5698402909980532) % 1) * 800;
    }
    const sorted = mortonSort(xy);
    const key = (a: Float64Array) => Array.from({ length: n }, (_, p) => `${a[2 * p]},${a[2 * p + 1]}`).sort();
    expect(key(sorted)).toEqual(key(xy));
    const codes = mortonCodes(sorted);
    for (let p = 1; p < n; p++) expect(codes[p]!).toBeGreaterThanOrEqual(codes[p - 1]!);
    const placement = { u: 0.3, v: 0.1, angle: 17 };
    const grid = placementCoverage(square, origin, 40, placement);
    const a = new Int32Array(grid.nx * grid.ny);
    const b = new Int32Array(grid.nx * grid.ny);
    createCellCounter(xy, origin).count(grid, 40, placement, a);
    createCellCounter(sorted, origin).count(grid, 40, placement, b);
    expect(Array.from(b)).toEqual(Array.from(a));
  });

  it('writes into a given array (e.g. shared memory) exactly what it returns, and refuses a wrong length', () => {
    const xy = Float64Array.from([5, 5, 0, 0, 9, 1, 1, 9, 3, 3]);
    const into = new Float64Array(new SharedArrayBuffer(xy.length * 8));
    expect(mortonSort(xy, into)).toBe(into);
    expect(Array.from(into)).toEqual(Array.from(mortonSort(xy)));
    expect(() => mortonSort(xy, new Float64Array(4))).toThrow('mortonSort output holds 4 numbers, the points 10');
  });

  it('is stable: points with equal codes keep their input order (as a stable sort of the codes, ECMA-262 Array.prototype.sort)', () => {
    // 3000 points on a 7 x 5 lattice of positions, so that many share a code; the y carries the input index in its
    // fraction below the quantization step, so the order among equal codes shows
    const n = 3000;
    const xy = new Float64Array(2 * n);
    for (let p = 0; p < n; p++) {
      xy[2 * p] = ((p * 37) % 7) * 100;
      xy[2 * p + 1] = ((p * 11) % 5) * 100 + p * 1e-6;
    }
    xy[1] = 0;
    xy[2 * (n - 1) + 1] = 400 + 1e-3; // the box's corners fix the quantization
    const codes = mortonCodes(xy);
    const order = Array.from({ length: n }, (_, p) => p).sort((a, b) => codes[a]! - codes[b]!);
    const expected = order.flatMap((p) => [xy[2 * p]!, xy[2 * p + 1]!]);
    expect(Array.from(mortonSort(xy))).toEqual(expected);
  });

  it('isMortonSorted: true for a sorted copy and for 0 or 1 point, false once two points are swapped', () => {
    const xy = Float64Array.from({ length: 200 }, (_, k) => ((k * 0.6180339887) % 1) * 1000);
    const sorted = mortonSort(xy);
    expect(isMortonSorted(sorted)).toBe(true);
    expect(isMortonSorted(new Float64Array(0))).toBe(true);
    expect(isMortonSorted(Float64Array.from([3, 4]))).toBe(true);
    const codes = mortonCodes(sorted);
    const p = codes.findIndex((code, k) => k > 0 && code > codes[k - 1]!);
    const swapped = sorted.slice();
    swapped.set([sorted[2 * p]!, sorted[2 * p + 1]!, sorted[2 * p - 2]!, sorted[2 * p - 1]!], 2 * p - 2);
    expect(isMortonSorted(swapped)).toBe(false);
  });

  it('interleaves bits: x in even, y in odd positions (hand-worked corners of the box)', () => {
    // points (0,0), (max,0), (0,max), (max,max): codes 0, 0x55555555, 0xaaaaaaaa, 0xffffffff
    const codes = mortonCodes(Float64Array.from([0, 0, 1, 0, 0, 1, 1, 1]));
    expect(Array.from(codes)).toEqual([0, 0x55555555, 0xaaaaaaaa, 0xffffffff]);
  });
});

describe.each(counterKinds)('createCellCounter (%s kernel) over many blocks', (_kind, makeCounter) => {
  it('counts 50000 points (several blocks of the fast pass) exactly as the contract, near-line points included', () => {
    const n = 50000;
    const xy = new Float64Array(2 * n);
    for (let p = 0; p < n; p++) {
      // every 97th point sits exactly on a vertical grid line of the 25 m grid at angle 0
      xy[2 * p] = p % 97 === 0 ? 25 * (p % 40) : ((p * 0.7548776662466927) % 1) * 1000;
      xy[2 * p + 1] = ((p * 0.5698402909980532) % 1) * 800;
    }
    for (const placement of [{ u: 0, v: 0, angle: 0 }, { u: 0.4, v: 0.9, angle: 63 }]) {
      const grid = placementCoverage(square, origin, 25, placement);
      const out = new Int32Array(grid.nx * grid.ny);
      makeCounter(xy, origin).count(grid, 25, placement, out);
      expect(Array.from(out)).toEqual(Array.from(bruteForceCounts(xy, origin, grid, 25, placement)));
    }
  });
});
