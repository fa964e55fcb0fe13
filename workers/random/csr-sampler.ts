/**
 * Complete spatial randomness (CSR) given n: n points independently uniform in the valid region (holes and
 * no-data zones excluded), by rejection sampling (J. von Neumann 1951, "Various techniques used in connection with
 * random digits", NBS Applied Mathematics Series 12:36-38) from a coarse raster over the bounding box. Raster cells
 * are classified once: wholly inside (coverage 1, no edge near: accepted without a test), wholly outside (never
 * drawn), boundary (drawn, kept only if the exact point-in-region test passes). A uniform point in a uniformly
 * drawn candidate cell is uniform over the candidate cells, so the accepted points are exactly uniform in the
 * region. Expected cost O(1) random numbers per point (acceptance ~ region area / candidate area);
 * build O(edges + raster cells).
 * Reference for CSR given n: P. J. Diggle (2013), Statistical Analysis of Spatial and Spatio-Temporal Point
 * Patterns, 3rd ed., CRC Press, ch. 1-2.
 */
import { placementCoverage } from '../geometry/coverage.js';
import { createRegionLocator } from '../geometry/point-in-region.js';
import type { RandomSource, Region } from '../types.js';
import { markBoundaryCells } from './boundary-cells.js';

export interface CsrSampler {
  /** n points uniform in the region, flat x0, y0, x1, y1, ... (planar metres). */
  sample(n: number, random: RandomSource): Float64Array;
  /** Share of drawn candidates that were accepted in expectation: region area / candidate raster area. */
  readonly acceptance: number;
}

export function createCsrSampler(region: Region): CsrSampler {
  const { minX, minY, maxX, maxY } = region.bbox;
  const width = maxX - minX;
  const height = maxY - minY;
  if (!(region.area > 0) || !(width > 0) || !(height > 0)) {
    throw new RangeError(`cannot draw CSR points in a region of area ${region.area} m^2: the valid region is empty`);
  }
  let edgeCount = 0;
  for (const ring of region.rings) edgeCount += ring.length >> 1;
  const targetCells = Math.min(1 << 18, Math.max(1024, 16 * edgeCount));
  const cellSize = Math.sqrt((width * height) / targetCells);
  const origin = { x: minX, y: minY };
  const grid = placementCoverage(region, origin, cellSize, { u: 0, v: 0, angle: 0 });
  const { nx, ny, coverage } = grid;
  if (grid.i0 !== 0 || grid.j0 !== 0) throw new Error('CSR raster must start at the bounding box corner');
  const boundary = markBoundaryCells(region, origin, cellSize, nx, ny);
  let candidateCount = 0;
  for (let k = 0; k < nx * ny; k++) if (boundary[k] === 1 || coverage[k]! > 0.5) candidateCount++;
  const candidates = new Int32Array(candidateCount);
  const needsTest = new Uint8Array(candidateCount);
  let m = 0;
  for (let k = 0; k < nx * ny; k++) {
    if (boundary[k] === 1 || coverage[k]! > 0.5) {
      candidates[m] = k;
      needsTest[m++] = boundary[k]!;
    }
  }
  const locator = createRegionLocator(region);
  const acceptance = region.area / (candidateCount * cellSize * cellSize);

  return {
    acceptance,
    sample(n: number, random: RandomSource): Float64Array {
      if (!Number.isSafeInteger(n) || n < 0) throw new RangeError(`number of CSR points must be a non-negative integer, got ${n}`);
      const xy = new Float64Array(2 * n);
      const attemptLimit = 1e6 + (1000 * n) / Math.max(acceptance, 1e-6);
      let accepted = 0;
      for (let attempt = 0; accepted < n; attempt++) {
        if (attempt > attemptLimit) throw new Error('CSR sampling made no progress: the region has (almost) no area inside its raster');
        const pick = Math.floor(random() * candidateCount);
        const cell = candidates[pick]!;
        const row = (cell / nx) | 0;
        const column = cell - row * nx;
        const x = minX + (column + random()) * cellSize;
        const y = minY + (row + random()) * cellSize;
        if (needsTest[pick] === 1 && !locator.contains(x, y)) continue;
        xy[2 * accepted] = x;
        xy[2 * accepted + 1] = y;
        accepted++;
      }
      return xy;
    },
  };
}
