import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { placementCoverage } from '../../../workers/geometry/coverage.js';
import { cellOfPoint, createGridFrame } from '../../../workers/geometry/grid-frame.js';
import { pointInRegion } from '../../../workers/geometry/point-in-region.js';
import { createCellCounter } from '../../../workers/placement/cell-counter.js';
import { createPlacementBuffers, evaluatePlacement, keptCounts } from '../../../workers/placement/evaluate-placement.js';
import { selectCells } from '../../../workers/placement/select-cells.js';
import { createCsrSampler } from '../../../workers/random/csr-sampler.js';
import { createRandom } from '../../../workers/random/seeded-random.js';
import type { Origin, Placement, Region } from '../../../workers/types.js';
import { regionFromRings, starRing } from '../geometry/region-fixtures.js';

// Invented region with its lower-left bbox corner at (0, 0): a star-shaped shell with a hole.
function makeRegion(shell: number[], hole: number[]): Region {
  const raw = regionFromRings([starRing(0, 0, 600, 1000, shell), starRing(0, 0, 100, 450, hole, true)]);
  const { minX, minY } = raw.bbox;
  // shift by the exact bbox corner so that the origin is (0, 0); coordinates stay exact differences
  return regionFromRings(
    raw.rings.map((ring) => {
      const points: [number, number][] = [];
      for (let k = 0; k < ring.length; k += 2) points.push([ring[k]! - minX, ring[k + 1]! - minY]);
      return points;
    }),
  );
}

/** Uniform points with every third one pulled halfway to one of ten centres (kept only if still inside). */
function clusteredPoints(region: Region, seed: number): Float64Array {
  const uniform = createCsrSampler(region).sample(1500, createRandom(seed));
  const result: number[] = [];
  for (let p = 0; p < 1500; p++) {
    let x = uniform[2 * p]!;
    let y = uniform[2 * p + 1]!;
    if (p % 3 === 0) {
      const centre = p % 10;
      x = (x + uniform[2 * centre]!) / 2;
      y = (y + uniform[2 * centre + 1]!) / 2;
      if (!pointInRegion(region, x, y)) continue;
    }
    result.push(x, y);
  }
  return Float64Array.from(result);
}

const fractions = (count: number) => fc.array(fc.double({ min: 0, max: 0.999, noNaN: true }), { minLength: count, maxLength: count });
const scenario = fc.record({
  shell: fractions(30),
  hole: fractions(12),
  seed: fc.integer({ min: 0, max: 1e6 }),
  cellSize: fc.double({ min: 60, max: 260, noNaN: true }),
  u: fc.oneof(fc.constant(0), fc.double({ min: 1e-6, max: 0.999999, noNaN: true })),
  v: fc.oneof(fc.constant(0), fc.double({ min: 1e-6, max: 0.999999, noNaN: true })),
  angle: fc.double({ min: 0, max: 89.99, noNaN: true }),
  minCoverage: fc.constantFrom(1, 0.75, 0.5, 0.1),
});

/** The evaluated placement, with its whole coverage grid (the evaluation holds one band at a time) for onKnifeEdge. */
function evaluate(region: Region, xy: Float64Array, origin: Origin, cellSize: number, placement: Placement, minCoverage: number) {
  const evaluated = evaluatePlacement({ counter: createCellCounter(xy, origin), region, origin, cellSize, placement, minCoverage, alpha: 0.05 });
  return { ...evaluated, coverage: placementCoverage(region, origin, cellSize, placement).coverage };
}

/** (count, coverage) of kept cells as sorted strings, coverage rounded to 1e-7 (float noise differs). */
function keptPairs(result: ReturnType<typeof evaluate>): string[] {
  const counts = keptCounts(result.counts, result.kept);
  return Array.from(counts, (count, k) => `${(result.kept.coverage[k]! * 1e7).toFixed(0)}:${count}`).sort();
}

/** The region turned 90 degrees about the origin, (x, y) -> (-y, x): exact in float64, orientation preserved. */
function quarterTurn(region: Region): Region {
  return regionFromRings(
    region.rings.map((ring) => {
      const points: [number, number][] = [];
      for (let k = 0; k < ring.length; k += 2) points.push([-ring[k + 1]!, ring[k]!]);
      return points;
    }),
  );
}

/**
 * True when some cell's coverage lies within 1e-11 of the keep threshold (minCoverage - 1e-9): there, which side
 * a cell falls on is decided by the last bits of rounding, and two grids that are equal in exact arithmetic may
 * keep different cells. Such knife-edge cases (found by fast-check: a sliver of 1e-9 of a cell) are skipped.
 */
function onKnifeEdge(result: ReturnType<typeof evaluate>, minCoverage: number): boolean {
  const threshold = minCoverage - 1e-9;
  return result.coverage.some((coverage) => Math.abs(coverage - threshold) < 1e-11);
}

describe('evaluatePlacement properties', () => {
  it('counts of kept cells sum to the points that fall in kept cells (brute force per the grid contract)', () => {
    fc.assert(
      fc.property(scenario, ({ shell, hole, seed, cellSize, u, v, angle, minCoverage }) => {
        const region = makeRegion(shell, hole);
        const xy = clusteredPoints(region, seed);
        const placement = { u, v, angle };
        const result = evaluate(region, xy, { x: 0, y: 0 }, cellSize, placement, minCoverage);
        const grid = placementCoverage(region, { x: 0, y: 0 }, cellSize, placement);
        const kept = new Set(selectCells(grid, minCoverage).index);
        const frame = createGridFrame({ x: 0, y: 0 }, cellSize, placement);
        let inKept = 0;
        for (let p = 0; p < xy.length / 2; p++) {
          const [i, j] = cellOfPoint(frame, xy[2 * p]!, xy[2 * p + 1]!);
          if (kept.has((j - grid.j0) * grid.nx + (i - grid.i0))) inKept++;
        }
        expect(result.stats.points).toBe(inKept);
        expect(result.stats.cells).toBe(kept.size);
      }),
      { numRuns: 25, seed: 20261201 },
    );
  });

  it('an offset of one whole cell changes nothing (reference-values.md, grid symmetry)', () => {
    fc.assert(
      fc.property(scenario, ({ shell, hole, seed, cellSize, u, v, angle, minCoverage }) => {
        const region = makeRegion(shell, hole);
        const xy = clusteredPoints(region, seed);
        const a = evaluate(region, xy, { x: 0, y: 0 }, cellSize, { u, v, angle }, minCoverage);
        const b = evaluate(region, xy, { x: 0, y: 0 }, cellSize, { u: u + 1, v: v + 2, angle }, minCoverage);
        fc.pre(!onKnifeEdge(a, minCoverage) && !onKnifeEdge(b, minCoverage));
        expect(keptPairs(b)).toEqual(keptPairs(a));
        expect(b.stats.chi2).toBeCloseTo(a.stats.chi2, 6);
        expect(b.stats.vmr).toBeCloseTo(a.stats.vmr, 9);
      }),
      { numRuns: 20, seed: 20261201 },
    );
  });

  it('a 90-degree turn of data and region about the origin: same multiset of (count, coverage) pairs', () => {
    fc.assert(
      fc.property(scenario, ({ shell, hole, seed, cellSize, u, v, angle, minCoverage }) => {
        const region = makeRegion(shell, hole);
        const xy = clusteredPoints(region, seed);
        // (x, y) -> (-y, x): exact in float64, orientation preserved
        const turnedXy = new Float64Array(xy.length);
        for (let p = 0; p < xy.length / 2; p++) {
          turnedXy[2 * p] = -xy[2 * p + 1]!;
          turnedXy[2 * p + 1] = xy[2 * p]!;
        }
        const turned = quarterTurn(region);
        const origin = { x: 0, y: 0 };
        // At offset 0 the origin is a cell corner: same placement. Otherwise the turned grid's offset is (1 - v, u).
        const a0 = evaluate(region, xy, origin, cellSize, { u: 0, v: 0, angle }, minCoverage);
        const b0 = evaluate(turned, turnedXy, origin, cellSize, { u: 0, v: 0, angle }, minCoverage);
        fc.pre(!onKnifeEdge(a0, minCoverage) && !onKnifeEdge(b0, minCoverage));
        expect(keptPairs(b0)).toEqual(keptPairs(a0));
        expect(b0.stats.chi2).toBeCloseTo(a0.stats.chi2, 6);
        const a = evaluate(region, xy, origin, cellSize, { u, v, angle }, minCoverage);
        const b = evaluate(turned, turnedXy, origin, cellSize, { u: v === 0 ? 0 : 1 - v, v: u, angle }, minCoverage);
        fc.pre(!onKnifeEdge(a, minCoverage) && !onKnifeEdge(b, minCoverage));
        expect(keptPairs(b)).toEqual(keptPairs(a));
      }),
      { numRuns: 20, seed: 20261201 },
    );
  });

  it('regression: a cell with a sliver of 1e-9 outside (the keep threshold) is not compared across turned grids', () => {
    // fast-check counterexample (seed -2244812): coverage 1 - 1.00e-9 in the turned grid, minCoverage 1
    const region = makeRegion(
      [0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0.23195919554214942, 0, 0, 0, 0, 0, 0, 0, 0.9524142329489045, 0, 0, 0, 0, 0, 0],
      [0, 0, 0, 0, 0, 0, 0, 0.9989999999999554, 0, 0, 0, 0],
    );
    const turned = quarterTurn(region);
    const xy = clusteredPoints(region, 0);
    const b = evaluate(turned, xy, { x: 0, y: 0 }, 259.9999999997711, { u: 1 - 0.00022428794377415961, v: 0.021218966475615664, angle: 0 }, 1);
    expect(onKnifeEdge(b, 1)).toBe(true);
  });

  it('translating data, region and origin together changes nothing (dyadic shifts keep arithmetic exact)', () => {
    fc.assert(
      fc.property(scenario, fc.integer({ min: -4000, max: 4000 }), fc.integer({ min: -4000, max: 4000 }), (s, kx, ky) => {
        const region = makeRegion(s.shell, s.hole);
        // coordinates rounded to multiples of 2^-16 so that adding multiples of 1024 is exact
        const round = (x: number) => Math.round(x * 65536) / 65536;
        const snapped = regionFromRings(
          region.rings.map((ring) => {
            const points: [number, number][] = [];
            for (let k = 0; k < ring.length; k += 2) points.push([round(ring[k]!), round(ring[k + 1]!)]);
            return points;
          }),
        );
        const xy = clusteredPoints(snapped, s.seed).map(round);
        const dx = kx * 1024;
        const dy = ky * 1024;
        const moved = regionFromRings(
          snapped.rings.map((ring) => {
            const points: [number, number][] = [];
            for (let k = 0; k < ring.length; k += 2) points.push([ring[k]! + dx, ring[k + 1]! + dy]);
            return points;
          }),
        );
        const movedXy = xy.map((value, k) => value + (k % 2 === 0 ? dx : dy));
        const placement = { u: s.u, v: s.v, angle: s.angle };
        const a = evaluate(snapped, xy, { x: 0, y: 0 }, s.cellSize, placement, s.minCoverage);
        const b = evaluate(moved, movedXy, { x: dx, y: dy }, s.cellSize, placement, s.minCoverage);
        expect(b.stats).toEqual(a.stats);
      }),
      { numRuns: 20, seed: 20261201 },
    );
  });
});

describe('evaluatePlacement end to end: Clarke (1946) flying-bomb squares', () => {
  // R. D. Clarke (1946), J. Inst. Actuaries 72:481: 576 squares of 500 m, counts 0..4 and one square of 7 hits
  // (derived: 537 - 530). A point set whose 500 m squares give the table, in an invented 12 km x 12 km area.
  const table: [number, number][] = [[0, 229], [1, 211], [2, 93], [3, 35], [4, 7], [7, 1]];
  const cellCounts: number[] = table.flatMap(([hits, squares]) => new Array<number>(squares).fill(hits));
  // a fixed shuffle of the squares: k -> 7k + 3 mod 576 is a permutation (7 is coprime to 576)
  const points: number[] = [];
  cellCounts.forEach((hits, k) => {
    const square = (k * 7 + 3) % 576;
    const column = square % 24;
    const row = Math.floor(square / 24);
    for (let h = 0; h < hits; h++) points.push(column * 500 + 60 + 55 * h, row * 500 + 440 - 50 * h);
  });
  const region = regionFromRings([[[0, 0], [12000, 0], [12000, 12000], [0, 12000]]]);
  const xy = Float64Array.from(points);

  it('reproduces mean, variance, VMR, X^2 and p (reference-values.md, scipy)', () => {
    const { stats, kept } = evaluatePlacement({
      counter: createCellCounter(xy, { x: 0, y: 0 }),
      region,
      origin: { x: 0, y: 0 },
      cellSize: 500,
      placement: { u: 0, v: 0, angle: 0 },
      minCoverage: 1,
      alpha: 0.05,
    });
    expect(kept.index.length).toBe(576);
    expect(stats.points).toBe(537);
    expect(stats.mean).toBeCloseTo(0.932292, 6);
    expect(stats.variance).toBeCloseTo(0.97106, 5);
    expect(stats.vmr).toBeCloseTo(1.041584, 6);
    // scipy: chi2.sf(598.9106, 575) = 0.237263
    expect(stats.chi2).toBeCloseTo(598.9106, 3);
    expect(stats.df).toBe(575);
    expect(stats.pClustered).toBeCloseTo(0.237263, 5);
    expect(stats.verdict).toBe('csr');
  });

  it('fewer than 2 kept cells is a RangeError that says at least 2 are needed', () => {
    expect(() =>
      evaluatePlacement({
        counter: createCellCounter(xy, { x: 0, y: 0 }),
        region,
        origin: { x: 0, y: 0 },
        cellSize: 12000,
        placement: { u: 0.5, v: 0.5, angle: 0 },
        minCoverage: 1,
        alpha: 0.05,
      }),
    ).toThrow(/keep 0 cell\(s\) with coverage >= 1; at least 2 are needed/);
  });
});

describe('evaluatePlacement with reused buffers (createPlacementBuffers)', () => {
  it('gives every placement the numbers a fresh evaluation gives, whatever larger or smaller placement used the buffers before (squares and hexagons)', () => {
    const region = makeRegion(Array.from({ length: 30 }, (_, k) => (k * 0.37) % 1), Array.from({ length: 12 }, (_, k) => (k * 0.61) % 1));
    const xy = clusteredPoints(region, 7);
    const origin = { x: 0, y: 0 };
    const counter = createCellCounter(xy, origin);
    // sides and angles that make the grid grow and shrink from one placement to the next
    const sequence: [number, Placement, number][] = [
      [80, { u: 0.2, v: 0.7, angle: 0 }, 0.5],
      [150, { u: 0.9, v: 0.1, angle: 45 }, 1],
      [60, { u: 0.5, v: 0.5, angle: 30 }, 0.1],
      [200, { u: 0, v: 0, angle: 10 }, 0.75],
      [70, { u: 0.3, v: 0.3, angle: 60 }, 0.5],
    ];
    for (const shape of ['square', 'hex'] as const) {
      const buffers = createPlacementBuffers();
      for (const [cellSize, placement, minCoverage] of sequence) {
        const input = { counter, region, origin, cellSize, placement, minCoverage, alpha: 0.05, shape };
        // squares hold one band of the grid (select-cells-by-band.ts)
        const before = buffers.band;
        const reused = evaluatePlacement({ ...input, buffers });
        expect(reused.counts).toBe(buffers.counts);
        // after the 60 m grid (the largest), the square grids are written into the same buffer
        if (shape === 'square' && cellSize >= 70 && cellSize !== 80 && cellSize !== 150) expect(buffers.band).toBe(before);
        const fresh = evaluatePlacement(input);
        expect(reused.grid).toEqual(fresh.grid);
        expect(Array.from(reused.kept.index)).toEqual(Array.from(fresh.kept.index));
        expect(Array.from(reused.kept.coverage)).toEqual(Array.from(fresh.kept.coverage));
        expect(reused.stats).toEqual(fresh.stats);
      }
    }
  });

  it('gives the same statistics and kept counts when the kept counts are written over the grid counts (countsInKeptOrder)', () => {
    const region = makeRegion(Array.from({ length: 30 }, (_, k) => (k * 0.29) % 1), Array.from({ length: 12 }, (_, k) => (k * 0.53) % 1));
    const xy = clusteredPoints(region, 11);
    const origin = { x: 0, y: 0 };
    const counter = createCellCounter(xy, origin);
    for (const shape of ['square', 'hex'] as const) {
      const buffers = createPlacementBuffers();
      for (const [cellSize, angle] of [[90, 0], [60, 35], [120, 80]] as const) {
        const input = { counter, region, origin, cellSize, placement: { u: 0.4, v: 0.1, angle }, minCoverage: 0.5, alpha: 0.05, shape };
        const fresh = evaluatePlacement(input);
        const expected = Array.from(keptCounts(fresh.counts, fresh.kept));
        const compacted = evaluatePlacement({ ...input, buffers, countsInKeptOrder: true });
        expect(Array.from(compacted.observed)).toEqual(expected);
        expect(Array.from(compacted.counts.subarray(0, expected.length))).toEqual(expected);
        expect(compacted.stats).toEqual(fresh.stats);
      }
    }
  });
});
