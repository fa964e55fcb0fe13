import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { placementCoverage, ringsInCellUnits } from '../../../workers/geometry/coverage.js';
import type { CoverageGrid, Placement, Region } from '../../../workers/types.js';
import { oracleCellArea } from './clip-oracle.js';
import { regionFromRings, starRing } from './region-fixtures.js';

function row(grid: CoverageGrid, j: number): number[] {
  return Array.from(grid.coverage.subarray((j - grid.j0) * grid.nx, (j - grid.j0 + 1) * grid.nx));
}

const fractions = (count: number) => fc.array(fc.double({ min: 0, max: 0.999, noNaN: true }), { minLength: count, maxLength: count });

/** A random region: a star shell with a star hole, and a second disjoint shell. */
const regionArbitrary = fc
  .record({
    shell: fractions(24),
    hole: fractions(14),
    second: fractions(10),
    scale: fc.double({ min: 50, max: 5000, noNaN: true }),
    shiftX: fc.double({ min: -1e5, max: 1e5, noNaN: true }),
    shiftY: fc.double({ min: -1e5, max: 1e5, noNaN: true }),
  })
  .map(({ shell, hole, second, scale, shiftX, shiftY }) =>
    regionFromRings([
      starRing(shiftX, shiftY, 0.6 * scale, scale, shell),
      starRing(shiftX, shiftY, 0.1 * scale, 0.5 * scale, hole, true),
      starRing(shiftX + 3 * scale, shiftY + 0.5 * scale, 0.3 * scale, 0.9 * scale, second),
    ]),
  );

// Offsets 0 or at least 1e-6: a smaller offset is lost when 1 is added (1 + 1e-17 === 1 in float64).
const offsetArbitrary = fc.oneof(fc.constant(0), fc.double({ min: 1e-6, max: 0.999999, noNaN: true }));
const placementArbitrary = fc.record({
  u: offsetArbitrary,
  v: offsetArbitrary,
  angle: fc.double({ min: 0, max: 89.999, noNaN: true }),
});

function cellSizeFor(region: Region, cellsAcross: number): number {
  return (region.bbox.maxX - region.bbox.minX) / cellsAcross;
}

describe('placementCoverage: exact triangles (shared/reference-values.md, exact rational arithmetic)', () => {
  it('triangle (0,0),(3,0),(0,3) on unit cells', () => {
    const grid = placementCoverage(regionFromRings([[[0, 0], [3, 0], [0, 3]]]), { x: 0, y: 0 }, 1, { u: 0, v: 0, angle: 0 });
    expect([grid.i0, grid.j0, grid.nx, grid.ny]).toEqual([0, 0, 3, 3]);
    const expected = [[1, 1, 1 / 2], [1, 1 / 2, 0], [1 / 2, 0, 0]];
    for (let j = 0; j < 3; j++) row(grid, j).forEach((c, i) => expect(c).toBeCloseTo(expected[j]![i]!, 12));
  });

  it('triangle (1/2,1/4),(11/4,1),(1,5/2), area 75/32, on unit cells and on scaled, shifted cells', () => {
    const expected = [
      [13 / 48, 5 / 12, 3 / 32],
      [2 / 9, 311 / 336, 27 / 112],
      [1 / 36, 7 / 48, 0],
    ];
    const triangle: [number, number][] = [[0.5, 0.25], [2.75, 1], [1, 2.5]];
    for (const [scale, shiftX, shiftY] of [[1, 0, 0], [250, 431000.5, 5102000.25], [0.01, -3, 7]] as const) {
      const region = regionFromRings([triangle.map(([x, y]) => [shiftX + scale * x, shiftY + scale * y] as [number, number])]);
      expect(region.area).toBeCloseTo((75 / 32) * scale * scale, 6);
      const grid = placementCoverage(region, { x: shiftX, y: shiftY }, scale, { u: 0, v: 0, angle: 0 });
      expect([grid.i0, grid.j0, grid.nx, grid.ny]).toEqual([0, 0, 3, 3]);
      for (let j = 0; j < 3; j++) row(grid, j).forEach((c, i) => expect(Math.abs(c - expected[j]![i]!)).toBeLessThan(1e-12));
    }
  });
});

describe('placementCoverage against Sutherland & Hodgman (1974) clipping per cell', () => {
  it('random polygons with holes, random cell sizes, offsets and angles: equal to 1e-9 per cell', () => {
    fc.assert(
      fc.property(regionArbitrary, placementArbitrary, fc.integer({ min: 2, max: 25 }), (region, placement, across) => {
        const cellSize = cellSizeFor(region, across);
        const origin = { x: region.bbox.minX, y: region.bbox.minY };
        const grid = placementCoverage(region, origin, cellSize, placement);
        const rings = ringsInCellUnits(region, origin, cellSize, placement);
        for (let r = 0; r < grid.ny; r++) {
          for (let c = 0; c < grid.nx; c++) {
            const oracle = oracleCellArea(rings, grid.i0 + c, grid.j0 + r);
            expect(Math.abs(grid.coverage[r * grid.nx + c]! - oracle)).toBeLessThan(1e-9);
          }
        }
      }),
      { numRuns: 60, seed: 20261201 },
    );
  });

  it('coverage times s^2 sums to the region area, and every coverage is in [0, 1]', () => {
    fc.assert(
      fc.property(regionArbitrary, placementArbitrary, fc.integer({ min: 1, max: 200 }), (region, placement, across) => {
        const cellSize = cellSizeFor(region, across);
        const grid = placementCoverage(region, { x: region.bbox.minX, y: region.bbox.minY }, cellSize, placement);
        let sum = 0;
        let low = Infinity;
        let high = -Infinity;
        for (const c of grid.coverage) {
          low = Math.min(low, c);
          high = Math.max(high, c);
          sum += c;
        }
        expect(low).toBeGreaterThanOrEqual(0);
        expect(high).toBeLessThanOrEqual(1);
        expect(Math.abs(sum * cellSize * cellSize - region.area) / region.area).toBeLessThan(1e-9);
      }),
      { numRuns: 100, seed: 20261201 },
    );
  });
});

function sortedCoverages(grid: CoverageGrid): number[] {
  return Array.from(grid.coverage)
    .filter((c) => c > 1e-9)
    .sort((a, b) => a - b);
}

describe('placementCoverage symmetries (reference-values.md, "Grid symmetry")', () => {
  it('an offset of one whole cell gives the same cells shifted by one index', () => {
    fc.assert(
      fc.property(regionArbitrary, placementArbitrary, fc.integer({ min: 2, max: 30 }), (region, placement, across) => {
        const cellSize = cellSizeFor(region, across);
        const origin = { x: region.bbox.minX, y: region.bbox.minY };
        const base = placementCoverage(region, origin, cellSize, placement);
        const shifted = placementCoverage(region, origin, cellSize, { ...placement, u: placement.u + 1, v: placement.v + 1 });
        // Compare cell by cell: (i, j) in the base grid is (i - 1, j - 1) in the shifted one. The grids may differ by
        // an empty border row when a vertex lies within float rounding of a grid line.
        let nonEmpty = 0;
        for (let r = 0; r < base.ny; r++) {
          for (let c = 0; c < base.nx; c++) {
            const value = base.coverage[r * base.nx + c]!;
            const i = base.i0 + c - 1 - shifted.i0;
            const j = base.j0 + r - 1 - shifted.j0;
            const inside = i >= 0 && i < shifted.nx && j >= 0 && j < shifted.ny;
            const other = inside ? shifted.coverage[j * shifted.nx + i]! : 0;
            expect(Math.abs(other - value)).toBeLessThan(1e-9);
            if (value > 1e-9) nonEmpty++;
          }
        }
        expect(shifted.coverage.filter((c) => c > 1e-9).length).toBe(nonEmpty);
      }),
      { numRuns: 40, seed: 20261201 },
    );
  });

  it('a 90-degree turn of the region about the origin (a cell corner at offset 0) gives the same multiset', () => {
    fc.assert(
      fc.property(regionArbitrary, fc.double({ min: 0, max: 89.9, noNaN: true }), fc.integer({ min: 2, max: 30 }), (region, angle, across) => {
        const cellSize = cellSizeFor(region, across);
        const origin = { x: region.bbox.minX, y: region.bbox.minY };
        const placement: Placement = { u: 0, v: 0, angle };
        const turned = regionFromRings(
          region.rings.map((ring) => {
            const points: [number, number][] = [];
            for (let k = 0; k < ring.length; k += 2) points.push([origin.x - (ring[k + 1]! - origin.y), origin.y + (ring[k]! - origin.x)]);
            return points;
          }),
        );
        const a = sortedCoverages(placementCoverage(region, origin, cellSize, placement));
        const b = sortedCoverages(placementCoverage(turned, origin, cellSize, placement));
        expect(b.length).toBe(a.length);
        a.forEach((c, k) => expect(Math.abs(b[k]! - c)).toBeLessThan(1e-9));
      }),
      { numRuns: 40, seed: 20261201 },
    );
  });

  it('a half-cell shift changes the coverages (the symmetry is not trivial)', () => {
    const region = regionFromRings([[[0, 0], [3, 0], [0, 3]]]);
    const a = sortedCoverages(placementCoverage(region, { x: 0, y: 0 }, 1, { u: 0, v: 0, angle: 0 }));
    const b = sortedCoverages(placementCoverage(region, { x: 0, y: 0 }, 1, { u: 0.5, v: 0, angle: 0 }));
    expect(b).not.toEqual(a);
  });
});

describe('placementCoverage input errors', () => {
  it('rejects a cell size that is not positive', () => {
    const region = regionFromRings([[[0, 0], [3, 0], [0, 3]]]);
    expect(() => placementCoverage(region, { x: 0, y: 0 }, 0, { u: 0, v: 0, angle: 0 })).toThrow(/cell size must be a positive/);
    expect(() => placementCoverage(region, { x: 0, y: 0 }, 1e-9, { u: 0, v: 0, angle: 0 })).toThrow(/choose a larger cell size/);
  });
});
