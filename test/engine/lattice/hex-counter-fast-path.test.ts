/**
 * The hexagon counting kernel's fast path (corner table, then the bisectors of the axial unit cell, then the exact
 * pass) against the straightforward implementation of the issue 16 rule (hex-frame.ts: q, r, m in float64 in the
 * contract's order, Math.round and the "moved most" fix-up), point by point: every point is counted alone, so a point
 * sent to a wrong cell cannot hide behind another sent the other way. Points: uniform, on hexagon sides and corners
 * (and one float step off), on the unit cell's bisectors 2 fq + fr = 1, fq + 2 fr = 1, fq = fr, 2 fq + fr = 2,
 * fq + 2 fr = 2, on the corners of the corner table's squares, and exact ties at angle 0 (the contract's own
 * property test, hex-properties.test.ts, checks the rule itself against a direct implementation of the written rounding rule).
 * Every case runs with both block functions of the kernel: the list of near-bisector points decided after the block
 * (grids that fit in the second-level cache) and the decision at once (larger grids).
 */
import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { createHexCounter } from '../../../workers/lattice/hex/hex-counter.js';
import { createHexFrame, hexCellOfPoint, hexCorners } from '../../../workers/lattice/hex/hex-frame.js';
import { latticeOf } from '../../../workers/lattice/registry.js';
import type { Origin, Placement } from '../../../workers/types.js';
import { regionFromRings } from '../geometry/region-fixtures.js';
import { nextDown, nextUp } from './hex-oracle.js';

const hex = latticeOf('hex');
const origin: Origin = { x: 0, y: 0 };
const region = regionFromRings([[[0, 0], [1500, 0], [1500, 1100], [0, 1100]]]);

/** Planar point of fractional axial coordinates (q, r): the inverse of the contract's frame (test-side, approximate). */
function planarOfAxial(cellSize: number, placement: Placement, q: number, r: number): [number, number] {
  const a = cellSize * Math.sqrt(2 / (3 * Math.sqrt(3)));
  const y = (r + placement.v) * 1.5 * a;
  const x = (q + placement.u + y / (3 * a)) * Math.sqrt(3) * a;
  const t = (placement.angle * Math.PI) / 180;
  return [origin.x + x * Math.cos(t) - y * Math.sin(t), origin.y + x * Math.sin(t) + y * Math.cos(t)];
}

/** The points of one case: sides and corners of hexagons, bisectors and table-square corners near a few unit cells. */
function pointsFor(cellSize: number, placement: Placement, fractions: number[]): number[] {
  const values: number[] = [];
  const push = (x: number, y: number): void => {
    values.push(x, y, nextUp(x), y, nextDown(x), y, x, nextUp(y), x, nextDown(y));
  };
  const frame = createHexFrame(origin, cellSize, placement);
  for (let j = 2; j < 7; j++) {
    for (let i = 2; i < 7; i++) {
      const ring = hexCorners(frame, i, j);
      for (let k = 0; k < 6; k++) {
        const [xa, ya] = ring[k]!;
        const [xb, yb] = ring[k + 1]!;
        for (const f of [0, 0.5, 1 / 3, fractions[(i + j + k) % fractions.length]!]) push(xa + f * (xb - xa), ya + f * (yb - ya));
      }
    }
  }
  for (let k = 0; k < fractions.length; k++) {
    const q0 = 3 + (k % 4);
    const r0 = 3 + ((k >> 2) % 4);
    const f = fractions[k]!;
    // on the five bisectors of the unit cell (q0, r0) + [0, 1)^2
    for (const [fq, fr] of [[f, 1 - 2 * f], [1 - 2 * f, f], [f, f], [f, 2 - 2 * f], [2 - 2 * f, f]] as const) {
      if (fq >= 0 && fq < 1 && fr >= 0 && fr < 1) push(...planarOfAxial(cellSize, placement, q0 + fq, r0 + fr));
    }
    // corners of the table's squares (multiples of 1/128 in fq and fr) and centres of the hexagon corners (1/3, 2/3)
    const a = Math.floor(f * 128) / 128;
    const b = fractions[(k + 1) % fractions.length]!;
    push(...planarOfAxial(cellSize, placement, q0 + a, r0 + Math.floor(b * 128) / 128));
    push(...planarOfAxial(cellSize, placement, q0 + (k % 2 === 0 ? 1 / 3 : 2 / 3), r0 + (k % 2 === 0 ? 1 / 3 : 2 / 3)));
  }
  return values;
}

/** Each point counted alone by the kernel: its cell (i, j), or null when the kernel put it in no cell of the grid. */
function kernelCells(xy: number[], cellSize: number, placement: Placement, inlineFrom: number): { cells: ([number, number] | null)[]; inGrid: (i: number, j: number) => boolean } {
  const grid = hex.coverage(region, origin, cellSize, placement);
  const out = new Int32Array(grid.nx * grid.ny);
  const cells: ([number, number] | null)[] = [];
  for (let p = 0; p < xy.length; p += 2) {
    createHexCounter(Float64Array.of(xy[p]!, xy[p + 1]!), origin, inlineFrom).count(grid, cellSize, placement, out);
    const found = out.findIndex((count) => count > 0);
    cells.push(found < 0 ? null : [grid.i0 + (found % grid.nx), grid.j0 + Math.floor(found / grid.nx)]);
    if (found >= 0) expect(out.reduce((sum, count) => sum + count, 0)).toBe(1);
  }
  const inGrid = (i: number, j: number): boolean => i >= grid.i0 && i < grid.i0 + grid.nx && j >= grid.j0 && j < grid.j0 + grid.ny;
  return { cells, inGrid };
}

function expectSameAsRule(xy: number[], cellSize: number, placement: Placement, inlineFrom: number): void {
  const frame = createHexFrame(origin, cellSize, placement);
  const { cells, inGrid } = kernelCells(xy, cellSize, placement, inlineFrom);
  for (let p = 0; p < xy.length; p += 2) {
    const rule = hexCellOfPoint(frame, xy[p]!, xy[p + 1]!);
    const expected = inGrid(rule[0], rule[1]) ? rule : null;
    expect(cells[p / 2], `point (${xy[p]}, ${xy[p + 1]}) at ${JSON.stringify(placement)}, s = ${cellSize}`).toEqual(expected);
  }
}

const offset = fc.double({ min: 0, max: 0.999999, noNaN: true });
const angle = fc.oneof(fc.constantFrom(0, 30, 45), fc.double({ min: 0, max: 59.999, noNaN: true }));
const cellSize = fc.oneof(fc.constantFrom(100, 64, 0.1 * 3 * 100), fc.double({ min: 60, max: 140, noNaN: true }));
const fractions = fc.array(fc.double({ min: 0, max: 0.999, noNaN: true }), { minLength: 8, maxLength: 8 });

describe.each([
  ['near-bisector points listed', Infinity],
  ['near-bisector points decided at once', 0],
])('hexagon counting kernel (%s): the fast path gives the rule cell of every point', (_name, threshold) => {
  // threshold: grids of at least this many cells decide near-bisector points at once (createHexCounter's choice)

  it('points on sides, corners, bisectors and table squares (and one float step off), rotated and offset', () => {
    fc.assert(
      fc.property(offset, offset, angle, cellSize, fractions, (u, v, t, s, f) => {
        const placement = { u, v, angle: t };
        expectSameAsRule(pointsFor(s, placement, f), s, placement, threshold);
      }),
      { numRuns: 30, seed: 1601 },
    );
  });

  it('uniform points over the whole grid, its border strip included', () => {
    fc.assert(
      fc.property(offset, offset, angle, cellSize, fc.integer({ min: 1, max: 2 ** 30 }), (u, v, t, s, seed) => {
        const placement = { u, v, angle: t };
        let state = seed;
        const xy: number[] = [];
        for (let k = 0; k < 800; k++) {
          state = (Math.imul(state, 1664525) + 1013904223) >>> 0;
          xy.push((state / 2 ** 32) * 1700 - 100);
          state = (Math.imul(state, 1664525) + 1013904223) >>> 0;
          xy.push((state / 2 ** 32) * 1300 - 100);
        }
        expectSameAsRule(xy, s, placement, threshold);
      }),
      { numRuns: 20, seed: 1602 },
    );
  });

  it('exact ties at angle 0 and offset 0: q = k / 2 on the x axis, and the hexagon corners on it', () => {
    const s = 100;
    const placement = { u: 0, v: 0, angle: 0 };
    const side = s * Math.sqrt(2 / (3 * Math.sqrt(3)));
    const xy: number[] = [];
    for (let k = 1; k < 30; k++) {
      const x = (k / 2) * Math.sqrt(3) * side;
      xy.push(x, 0, x, 1.5 * side * 2, nextUp(x), 0, nextDown(x), 0);
    }
    expectSameAsRule(xy, s, placement, threshold);
  });

  it('many points near the bisectors at once (listed, decided after the block or deferred) count as the rule says', () => {
    // the fast pass counts a point of a table square near a bisector in corner (0, 0), lists it and takes it back after
    // the block: thousands of such points in one counter, at distances around the bisector band (4 x 2^-20) and the
    // table margin (2^-16), must give the rule's count in every cell
    const offsets = [0, 1e-12, -1e-12, 1e-9, -1e-9, 3e-6, -3e-6, 4e-6, -4e-6, 5e-6, -5e-6, 1.6e-5, -1.6e-5, 1e-3, -1e-3];
    fc.assert(
      fc.property(offset, offset, angle, cellSize, fc.integer({ min: 1, max: 2 ** 30 }), (u, v, t, s, seed) => {
        const placement = { u, v, angle: t };
        let state = seed;
        const next = (): number => {
          state = (Math.imul(state, 1664525) + 1013904223) >>> 0;
          return state / 2 ** 32;
        };
        const xy: number[] = [];
        for (let k = 0; k < 3000; k++) {
          const f = next();
          const line = [[f, 1 - 2 * f], [1 - 2 * f, f], [f, f], [f, 2 - 2 * f], [2 - 2 * f, f]][k % 5]!;
          const shift = offsets[Math.floor(next() * offsets.length)]!;
          const [fq, fr] = [line[0]! + shift, line[1]! - (k % 2 === 0 ? shift : 0)];
          if (fq < 0 || fq >= 1 || fr < 0 || fr >= 1) continue;
          xy.push(...planarOfAxial(s, placement, 3 + Math.floor(next() * 6) + fq, 3 + Math.floor(next() * 4) + fr));
        }
        const grid = hex.coverage(region, origin, s, placement);
        const together = new Int32Array(grid.nx * grid.ny);
        createHexCounter(Float64Array.from(xy), origin, threshold).count(grid, s, placement, together);
        const frame = createHexFrame(origin, s, placement);
        const byRule = new Int32Array(grid.nx * grid.ny);
        for (let p = 0; p < xy.length; p += 2) {
          const [i, j] = hexCellOfPoint(frame, xy[p]!, xy[p + 1]!);
          if (i >= grid.i0 && i < grid.i0 + grid.nx && j >= grid.j0 && j < grid.j0 + grid.ny) byRule[(j - grid.j0) * grid.nx + (i - grid.i0)]!++;
        }
        expect(Array.from(together)).toEqual(Array.from(byRule));
      }),
      { numRuns: 25, seed: 1603 },
    );
  });

  it('many points at once count like the points one by one (the table, the bisectors and the exact pass together)', () => {
    const placement = { u: 0.37, v: 0.81, angle: 23.5 };
    const s = 70;
    const xy = pointsFor(s, placement, [0.1, 0.25, 0.4, 0.5, 0.62, 0.75, 0.9, 0.97]);
    const grid = hex.coverage(region, origin, s, placement);
    const together = new Int32Array(grid.nx * grid.ny);
    createHexCounter(Float64Array.from(xy), origin, threshold).count(grid, s, placement, together);
    const alone = new Int32Array(grid.nx * grid.ny);
    const { cells } = kernelCells(xy, s, placement, threshold);
    for (const cell of cells) if (cell !== null) alone[(cell[1] - grid.j0) * grid.nx + (cell[0] - grid.i0)]!++;
    expect(Array.from(together)).toEqual(Array.from(alone));
  });
});
