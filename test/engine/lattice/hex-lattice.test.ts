import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { createCellCounter } from '../../../workers/placement/cell-counter.js';
import { latticeOf } from '../../../workers/lattice/registry.js';
import type { CoverageGrid, Origin, Region } from '../../../workers/types.js';
import { regionFromRings, starRing } from '../geometry/region-fixtures.js';
import { oracleAreaInside, oracleHex, oracleNearest } from './hex-oracle.js';

const hex = latticeOf('hex');

/** An invented irregular study area: a star-shaped shell, a second island, a lake (hole) and a no-data zone (hole). */
function irregularRegion(fractions: number[]): Region {
  const shell = starRing(500, 400, 260, 420, fractions.slice(0, 40));
  const island = starRing(1150, 900, 60, 110, fractions.slice(40, 56));
  const lake = starRing(430, 380, 40, 90, fractions.slice(56, 72), true);
  const zone: [number, number][] = [[640, 300], [640, 470], [700, 470], [700, 300]]; // clockwise: a hole
  return regionFromRings([shell, island, lake, zone]);
}

const fractionsArbitrary = fc.array(fc.double({ min: 0, max: 0.999, noNaN: true }), { minLength: 72, maxLength: 72 });
const placementArbitrary = fc.record({
  u: fc.double({ min: 0, max: 0.999999, noNaN: true }),
  v: fc.double({ min: 0, max: 0.999999, noNaN: true }),
  angle: fc.double({ min: 0, max: 59.999, noNaN: true }),
});

function originOf(region: Region): Origin {
  return { x: region.bbox.minX, y: region.bbox.minY };
}

function coverageAt(grid: CoverageGrid, i: number, j: number): number {
  const c = i - grid.i0;
  const r = j - grid.j0;
  return c >= 0 && c < grid.nx && r >= 0 && r < grid.ny ? grid.coverage[r * grid.nx + c]! : 0;
}

/** Uniform points in the region's bounding box kept when inside (even-odd over all rings), seeded. */
function pointsIn(region: Region, count: number, seed: number): Float64Array {
  let state = seed >>> 0;
  const random = () => {
    state = (Math.imul(state, 1664525) + 1013904223) >>> 0;
    return state / 2 ** 32;
  };
  const values: number[] = [];
  const { minX, minY, maxX, maxY } = region.bbox;
  while (values.length < 2 * count) {
    const x = minX + random() * (maxX - minX);
    const y = minY + random() * (maxY - minY);
    let inside = false;
    for (const ring of region.rings) {
      for (let k = 0, n = ring.length / 2, p = n - 1; k < n; p = k++) {
        const [xa, ya, xb, yb] = [ring[2 * k]!, ring[2 * k + 1]!, ring[2 * p]!, ring[2 * p + 1]!];
        if (ya > y !== yb > y && x < xa + ((y - ya) * (xb - xa)) / (yb - ya)) inside = !inside;
      }
    }
    if (inside) values.push(x, y);
  }
  return Float64Array.from(values);
}

describe('hexagonal lattice against an independent oracle (clipped hexagons, nearest centre)', () => {
  it('coverage of every hexagon to 1e-12 and equal counts, irregular areas with holes, rotated and offset', () => {
    fc.assert(
      fc.property(fractionsArbitrary, placementArbitrary, fc.double({ min: 60, max: 180, noNaN: true }), (fractions, placement, cellSize) => {
        const region = irregularRegion(fractions);
        const origin = originOf(region);
        const grid = hex.coverage(region, origin, cellSize, placement);
        expect(grid.shape).toBe('hex');
        // every hexagon of the grid and a ring of two around it: the ones outside the grid must hold no area
        for (let j = grid.j0 - 2; j < grid.j0 + grid.ny + 2; j++) {
          for (let i = grid.i0 - 2; i < grid.i0 + grid.nx + 2; i++) {
            const expected = oracleAreaInside(region, oracleHex(origin, cellSize, placement, i, j).polygon) / (cellSize * cellSize);
            expect(Math.abs(coverageAt(grid, i, j) - expected)).toBeLessThan(1e-12);
          }
        }
        const xy = pointsIn(region, 300, fractions.length + Math.floor(fractions[0]! * 1e6));
        const counts = new Int32Array(grid.nx * grid.ny);
        createCellCounter(xy, origin).count(grid, cellSize, placement, counts);
        const expected = new Int32Array(grid.nx * grid.ny);
        const frame = hex.frame(origin, cellSize, placement);
        for (let p = 0; p < xy.length / 2; p++) {
          const [i, j] = frame.cellOfPoint(xy[2 * p]!, xy[2 * p + 1]!);
          const nearest = oracleNearest(origin, cellSize, placement, xy[2 * p]!, xy[2 * p + 1]!, [i - 2, i + 2, j - 2, j + 2]);
          if (nearest !== null) expect([i, j]).toEqual(nearest);
          expected[(j - grid.j0) * grid.nx + (i - grid.i0)]!++;
        }
        expect(Array.from(counts)).toEqual(Array.from(expected));
      }),
      { numRuns: 12, seed: 20261216 },
    );
  });
});
