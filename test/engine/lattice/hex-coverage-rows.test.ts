/**
 * The hexagon coverage by rows (hex-row-accumulation.ts) against the independent oracle of hex-oracle.ts
 * (Sutherland & Hodgman 1974 clipping of every hexagon, shoelace areas) to 1e-12, where the row method has its own
 * cases: long rows (many hexagons summed from the right), edges lying on hexagon sides and through corners and
 * centres, horizontal and vertical edges, vertices on the rows' band limits, and holes.
 */
import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { latticeOf } from '../../../workers/lattice/registry.js';
import type { CoverageGrid, Origin, Placement, Region } from '../../../workers/types.js';
import { regionFromRings, starRing } from '../geometry/region-fixtures.js';
import { oracleAreaInside, oracleHex } from './hex-oracle.js';

const hex = latticeOf('hex');

function expectOracleCoverage(region: Region, origin: Origin, cellSize: number, placement: Placement): CoverageGrid {
  const grid = hex.coverage(region, origin, cellSize, placement);
  let total = 0;
  for (let j = grid.j0 - 1; j < grid.j0 + grid.ny + 1; j++) {
    for (let i = grid.i0 - 1; i < grid.i0 + grid.nx + 1; i++) {
      const c = i - grid.i0;
      const r = j - grid.j0;
      const value = c >= 0 && c < grid.nx && r >= 0 && r < grid.ny ? grid.coverage[r * grid.nx + c]! : 0;
      const expected = oracleAreaInside(region, oracleHex(origin, cellSize, placement, i, j).polygon) / (cellSize * cellSize);
      expect(Math.abs(value - expected), `hexagon (${i}, ${j})`).toBeLessThan(1e-12);
      total += value;
    }
  }
  expect(Math.abs(total * cellSize * cellSize - region.area) / region.area).toBeLessThan(1e-12);
  return grid;
}

describe('hexagon coverage by rows of hexagons against clipped hexagons', () => {
  it('long rows: small hexagons over a star-shaped area with a hole, rotated and offset', () => {
    fc.assert(
      fc.property(
        fc.array(fc.double({ min: 0, max: 0.999, noNaN: true }), { minLength: 40, maxLength: 40 }),
        fc.double({ min: 0, max: 0.999999, noNaN: true }),
        fc.double({ min: 0, max: 0.999999, noNaN: true }),
        fc.double({ min: 0, max: 59.999, noNaN: true }),
        (fractions, u, v, angle) => {
          const shell = starRing(600, 500, 300, 560, fractions.slice(0, 28));
          const hole = starRing(620, 480, 40, 130, fractions.slice(28, 40), true);
          const region = regionFromRings([shell, hole]);
          const grid = expectOracleCoverage(region, { x: region.bbox.minX, y: region.bbox.minY }, 24, { u, v, angle });
          expect(grid.nx).toBeGreaterThan(25);
        },
      ),
      { numRuns: 4, seed: 1616 },
    );
  });

  it('edges on hexagon sides, through corners and centres, on band limits; horizontal and vertical edges', () => {
    const cellSize = 50;
    const origin = { x: 0, y: 0 };
    const a = cellSize * Math.sqrt(2 / (3 * Math.sqrt(3)));
    for (const placement of [{ u: 0, v: 0, angle: 0 }, { u: 0.5, v: 0.25, angle: 0 }, { u: 0.3, v: 0.7, angle: 30 }]) {
      // a polygon through hexagon corners and centres of this placement (its vertices taken from the oracle)
      const corner = (i: number, j: number, k: number) => oracleHex(origin, cellSize, placement, i, j).polygon[k]!;
      const centre = (i: number, j: number) => oracleHex(origin, cellSize, placement, i, j).centre;
      const alongSides = [corner(2, 2, 4), corner(2, 2, 5), corner(2, 2, 0), corner(5, 2, 5), corner(5, 2, 0), centre(6, 4), corner(4, 6, 1), corner(2, 6, 2), centre(1, 5)];
      // an axis-parallel rectangle whose sides sit on rows' band limits (y' = 1.5 a j +- a and +- a / 2)
      const y0 = 1.5 * a * 3 - a;
      const y1 = 1.5 * a * 6 + a / 2;
      const rectangle: [number, number][] = [[5, y0], [40 * a, y0], [40 * a, y1], [5, y1]];
      for (const ring of [alongSides, rectangle]) {
        const shell: [number, number][] = [[-200, -200], [3000, -200], [3000, 2000], [-200, 2000]];
        // the ring as a hole in a large shell, and alone (counter-clockwise)
        expectOracleCoverage(regionFromRings([ring]), origin, cellSize, placement);
        expectOracleCoverage(regionFromRings([shell, [...ring].reverse()]), origin, cellSize, placement);
      }
    }
  });
});
