/**
 * Cell selection by coverage (shared/design.md, grid contract): a placement keeps the cells with
 * coverage >= minCoverage - 1e-9 and coverage > 0, in grid storage order. Cost O(cells).
 */
import type { CoverageGrid, KeptCells } from '../types.js';

/** Tolerance below minCoverage that still keeps a cell (absorbs float noise in exact coverage). */
export const COVERAGE_TOLERANCE = 1e-9;

/**
 * The least coverage a kept cell has, minCoverage - COVERAGE_TOLERANCE (a cell is kept when its coverage is > 0 and
 * >= this). Throws a RangeError for a minCoverage outside [0, 1].
 */
export function keepThreshold(minCoverage: number): number {
  if (!(minCoverage >= 0 && minCoverage <= 1)) {
    throw new RangeError(`minCoverage must be a number in [0, 1], got ${minCoverage}`);
  }
  return minCoverage - COVERAGE_TOLERANCE;
}

/**
 * `into`: arrays the kept cells may be written into (KeptCells then holds views of them, valid until they are used
 * again), so that a thread reuses them from placement to placement; used when they hold the kept cells, new arrays
 * otherwise.
 */
export function selectCells(grid: CoverageGrid, minCoverage: number, into?: KeptCells): KeptCells {
  const threshold = keepThreshold(minCoverage);
  const { coverage } = grid;
  let keptCount = 0;
  for (let k = 0; k < coverage.length; k++) {
    const c = coverage[k]!;
    if (c > 0 && c >= threshold) keptCount++;
  }
  const reuse = into !== undefined && into.index.length >= keptCount && into.coverage.length >= keptCount;
  const index = reuse ? into.index.subarray(0, keptCount) : new Int32Array(keptCount);
  const keptCoverage = reuse ? into.coverage.subarray(0, keptCount) : new Float64Array(keptCount);
  let m = 0;
  for (let k = 0; k < coverage.length; k++) {
    const c = coverage[k]!;
    if (c > 0 && c >= threshold) {
      index[m] = k;
      keptCoverage[m++] = c;
    }
  }
  return { index, coverage: keptCoverage };
}
