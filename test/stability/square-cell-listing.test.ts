/**
 * The stability chunk's cell-by-cell path for squares (workers/stability: pixel-runs.ts, boundary-pixels.ts,
 * square-pixel-cells.ts, stability-chunk.ts) gives the same chunk entries (in another order, which the accumulator's
 * sums do not see) as locating every valid pixel in every placement by the grid contract (shared/design.md: i = floor((dx cos t + dy sin t) / s - u), ...):
 *  - the row runs give back every valid pixel's position;
 *  - the pixels near the boundary include every valid pixel whose centre lies within the distance of an edge, by
 *    brute-force point-to-segment distance (elementary geometry);
 *  - every other valid pixel lies, by the contract's formula, in a cell of coverage 1 (workers/geometry coverage);
 *  - whole chunks (observed and simulated flags, several placements per chunk) list the same pixels with the same
 *    counts either way.
 * Invented regions (star-shaped shells with a hole, fast-check).
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { placementCoverage } from '../../workers/geometry/coverage.js';
import { cellOfPoint, createGridFrame } from '../../workers/geometry/grid-frame.js';
import { createCellCounter } from '../../workers/placement/index.js';
import { createRandom } from '../../workers/random/index.js';
import { pixelsNearBoundary, squareCellReach } from '../../workers/stability/boundary-pixels.js';
import { pixelRuns } from '../../workers/stability/pixel-runs.js';
import { decodeStability } from '../../workers/stability/stability-chunk.js';
import { stabilityRaster, validPixels } from '../../workers/stability/stability-raster.js';
import { evaluateChunk } from '../../workers/sweep/evaluate-chunk.js';
import { chunkResultLength } from '../../workers/sweep/sweep-task.js';
import type { Region } from '../../workers/types.js';
import { regionFromRings, starRing } from '../engine/geometry/region-fixtures.js';

const fractions = (count: number) => fc.array(fc.double({ min: 0, max: 0.999, noNaN: true }), { minLength: count, maxLength: count });

const regionArbitrary = fc
  .record({ shell: fractions(20), hole: fractions(12), shiftX: fc.double({ min: -1e5, max: 1e5, noNaN: true }) })
  .map(({ shell, hole, shiftX }) =>
    regionFromRings([starRing(shiftX, 4e6, 600, 1000, shell), starRing(shiftX, 4e6, 100, 400, hole, true)]),
  );

const placementArbitrary = fc.record({
  u: fc.double({ min: 0, max: 0.999999, noNaN: true }),
  v: fc.double({ min: 0, max: 0.999999, noNaN: true }),
  angle: fc.double({ min: 0, max: 89.999, noNaN: true }),
});

/** Distance from (px, py) to the segment (ax, ay)-(bx, by). */
function segmentDistance(px: number, py: number, ax: number, ay: number, bx: number, by: number): number {
  const ex = bx - ax;
  const ey = by - ay;
  const length2 = ex * ex + ey * ey;
  const t = length2 > 0 ? Math.max(0, Math.min(1, ((px - ax) * ex + (py - ay) * ey) / length2)) : 0;
  return Math.hypot(px - (ax + t * ex), py - (ay + t * ey));
}

function boundaryDistance(region: Region, px: number, py: number): number {
  let least = Infinity;
  for (const ring of region.rings) {
    const n = ring.length >> 1;
    for (let k = 0, previous = n - 1; k < n; previous = k++) {
      least = Math.min(least, segmentDistance(px, py, ring[2 * previous]!, ring[2 * previous + 1]!, ring[2 * k]!, ring[2 * k + 1]!));
    }
  }
  return least;
}

function centre(raster: { x0: number; y0: number; side: number; width: number }, pixel: number): [number, number] {
  const row = Math.floor(pixel / raster.width);
  const col = pixel - row * raster.width;
  return [raster.x0 + (col + 0.5) * raster.side, raster.y0 - (row + 0.5) * raster.side];
}

describe('square cell listing: its pieces', () => {
  it('the row runs give back the position of every valid pixel', () => {
    fc.assert(
      fc.property(regionArbitrary, fc.double({ min: 60, max: 400, noNaN: true }), (region, cellSize) => {
        const raster = stabilityRaster(region, cellSize);
        const pixels = validPixels(region, raster);
        const runs = pixelRuns(pixels, raster.width, raster.height);
        const found: number[] = [];
        for (let row = 0; row < raster.height; row++) {
          for (let t = runs.rowFirst[row]!; t < runs.rowFirst[row + 1]!; t++) {
            for (let col = runs.col0[t]!; col < runs.col1[t]!; col++) {
              expect(pixels[runs.q0[t]! + col - runs.col0[t]!]).toBe(row * raster.width + col);
              found.push(row * raster.width + col);
            }
          }
        }
        expect(found).toEqual(Array.from(pixels));
      }),
      { numRuns: 25 },
    );
  });

  it('the pixels near the boundary hold every valid pixel within the distance of an edge; the others lie in cells of coverage 1', () => {
    fc.assert(
      fc.property(regionArbitrary, fc.double({ min: 30, max: 110, noNaN: true }), placementArbitrary, (region, cellSize, placement) => {
        const raster = stabilityRaster(region, cellSize);
        const pixels = validPixels(region, raster);
        const reach = squareCellReach(cellSize);
        const near = new Set(pixelsNearBoundary(region, raster, pixels, reach));
        const origin = { x: region.bbox.minX, y: region.bbox.minY };
        const grid = placementCoverage(region, origin, cellSize, placement);
        const frame = createGridFrame(origin, cellSize, placement);
        let interior = 0;
        for (let q = 0; q < pixels.length; q++) {
          const [x, y] = centre(raster, pixels[q]!);
          if (boundaryDistance(region, x, y) <= reach) expect(near.has(q)).toBe(true);
          if (near.has(q)) continue;
          interior += 1;
          const [i, j] = cellOfPoint(frame, x, y);
          expect(grid.coverage[(j - grid.j0) * grid.nx + (i - grid.i0)]).toBe(1);
        }
        // the shortcut is worth having: most pixels are far from the boundary at these sizes
        expect(interior).toBeGreaterThan(0);
      }),
      { numRuns: 12 },
    );
  });
});

describe('square cell listing: whole chunks', () => {
  it('observed and simulated flags over 6 placements per chunk list the same pixels as locating every pixel (minCoverage 0.01 to 1, pixels of s / 8 or coarser than the cells)', () => {
    fc.assert(
      fc.property(regionArbitrary, fc.integer({ min: 1, max: 1e6 }), fc.double({ min: 50, max: 160, noNaN: true }), fc.constantFrom(0.01, 0.5, 1), fc.constantFrom(0, 1.3), (region, seed, cellSize, minCoverage, coarse) => {
        const random = createRandom(seed);
        const origin = { x: region.bbox.minX, y: region.bbox.minY };
        const inRegionBox = (count: number, cluster: boolean): Float64Array => {
          const xy = new Float64Array(2 * count);
          const { minX, minY, maxX, maxY } = region.bbox;
          for (let k = 0; k < count; k++) {
            const spread = cluster && k % 3 === 0 ? 0.1 : 1;
            xy[2 * k] = minX + (maxX - minX) * (cluster && k % 3 === 0 ? 0.2 + spread * random() : random());
            xy[2 * k + 1] = minY + (maxY - minY) * (cluster && k % 3 === 0 ? 0.5 + spread * random() : random());
          }
          return xy;
        };
        const observed = createCellCounter(inRegionBox(600, true), origin);
        const simulated = Array.from({ length: 4 }, () => createCellCounter(inRegionBox(600, false), origin));
        // coarse: pixels 1.3 cell sides wide, as when a large region coarsens its raster (many cells per pixel)
        const fine = stabilityRaster(region, cellSize);
        const raster = coarse > 0 ? { ...fine, side: coarse * cellSize, width: Math.ceil((fine.width * fine.side) / (coarse * cellSize)), height: Math.ceil((fine.height * fine.side) / (coarse * cellSize)) } : fine;
        const pixels = validPixels(region, raster);
        const squareCells = { runs: pixelRuns(pixels, raster.width, raster.height), nearBoundary: pixelsNearBoundary(region, raster, pixels, squareCellReach(cellSize)) };
        const placements = new Float64Array(18);
        for (let k = 0; k < 18; k += 3) {
          placements[k] = random();
          placements[k + 1] = random();
          placements[k + 2] = 90 * random();
        }
        const context = { region, origin, observed, simulated, cellSize, minCoverage, alpha: 0.2 };
        const everyPixel = evaluateChunk({ ...context, stability: { raster, pixels } }, placements);
        const byCells = evaluateChunk({ ...context, stability: { raster, pixels, squareCells } }, placements);
        const offset = chunkResultLength(6, 4);
        expect(Array.from(byCells.subarray(0, offset))).toEqual(Array.from(everyPixel.subarray(0, offset)));
        const a = decodeStability(everyPixel, offset);
        const b = decodeStability(byCells, offset);
        const sortedPairs = (values: Float64Array): string[] => {
          const pairs: string[] = [];
          for (let t = 0; t < values.length; t += 2) pairs.push(`${values[t]}:${values[t + 1]}`);
          return pairs.sort();
        };
        expect(b.placements).toBe(a.placements);
        for (const key of ['notKept', 'excess', 'deficit', 'simulated'] as const) expect(sortedPairs(b[key])).toEqual(sortedPairs(a[key]));
        // the flags are not empty: the comparison covers listed cells
        expect(a.excess.length + a.simulated.length).toBeGreaterThan(0);
      }),
      { numRuns: 24 },
    );
  });
});
