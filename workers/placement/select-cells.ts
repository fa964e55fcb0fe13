/**
 * Cell selection by coverage (shared/design.md, grid contract): a placement keeps the cells with
 * coverage >= minCoverage - 1e-9 and coverage > 0, in grid storage order. Cost O(cells).
 */
import type { CoverageGrid, KeptCells } from '../types.js';

/** Tolerance below minCoverage that still keeps a cell (absorbs float noise in exact coverage). */
export const COVERAGE_TOLERANCE = 1e-9;

export function selectCells(grid: CoverageGrid, minCoverage: number): KeptCells {
  if (!(minCoverage >= 0 && minCoverage <= 1)) {
    throw new RangeError(`minCoverage must be a number in [0, 1], got ${minCoverage}`);
  }
  const threshold = minCoverage - COVERAGE_TOLERANCE;
  const { coverage } = grid;
  let keptCount = 0;
  for (let k = 0; k < coverage.length; k++) {
    const c = coverage[k]!;
    if (c > 0 && c >= threshold) keptCount++;
  }
  const index = new Int32Array(keptCount);
  const keptCoverage = new Float64Array(keptCount);
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
