import type { DispersionResult } from '../types.js';

/**
 * Area-weighted index-of-dispersion chi-square (Pearson's statistic with expected counts proportional to each
 * kept cell's valid area).
 *
 * Formula: N = sum(O_c), E_c = N * a_c / sum(a), chi2 = sum (O_c - E_c)^2 / E_c, df = m - 1, where a_c is the
 * coverage (valid share of the cell's area, 0 < a_c <= 1). When every coverage is 1 this equals
 * sum (O_c - mean)^2 / mean = (m - 1) * vmr, the classical index of dispersion. With N = 0 the expected counts
 * are 0 and chi2 is NaN (undefined). Coverages must be > 0 (kept cells); the hot path does not check.
 *
 * Computed in one pass through the identity of chiSquareFromTotals, the same arithmetic as placementStatistics, so
 * that observed and simulated patterns are compared on exactly equal terms.
 * Cost: O(m), one pass over the arrays, no allocation besides the small result object. Its one-pass twin for
 * counts still in grid order, gatheredDispersionChiSquare below, runs for every simulated CSR or polygon-baseline
 * pattern and every placement; this one for a placement's baseline statistics and the area-only comparison.
 *
 * Reference: K. Pearson (1900), "On the criterion that a given system of deviations from the probable in the case
 * of a correlated system of variables is such that it can be reasonably supposed to have arisen from random
 * sampling", Philosophical Magazine 50:157-175; R. A. Fisher, H. G. Thornton and W. A. Mackenzie (1922), Annals of
 * Applied Biology 9:325-359 (the index of dispersion).
 */
export function dispersionChiSquare(counts: ArrayLike<number>, coverage: ArrayLike<number>): DispersionResult {
  const cells = counts.length;
  let points = 0;
  let coverageSum = 0;
  let weightedSquares = 0;
  for (let c = 0; c < cells; c++) {
    const x = counts[c]!;
    const a = coverage[c]!;
    points += x;
    coverageSum += a;
    weightedSquares += (x * x) / a;
  }
  return { chi2: chiSquareFromTotals(points, coverageSum, weightedSquares), df: cells - 1, points };
}

/**
 * Cells a caller wants listed while gatheredDispersionChiSquare reads the counts (workers/stability/cell-flags.ts):
 * in kept order, every cell whose count is >= from or <= to or whose coverage is not 1. `count` is set by the call.
 */
export interface ExtremeCells {
  from: number;
  to: number;
  cells: Int32Array;
  count: number;
}

/**
 * dispersionChiSquare of kept cells whose counts are still in grid order: cell c's count is gridCounts[keptIndex[c]],
 * and it is written to gridCounts[c] on the way (the kept counts end up over the start of the grid's counts, as
 * workers/placement compactKeptCounts leaves them; safe because keptIndex increases, so keptIndex[c] >= c). One pass
 * instead of two for every simulated pattern; the same sums in the same order, so the same chi2 to the last bit
 * (x^2 / 1 is x^2 exactly: whole cells skip the division). `extremes` (cells.length >= m): its cells are listed in
 * the same pass. Cost O(m).
 */
export function gatheredDispersionChiSquare(gridCounts: Float64Array, keptIndex: Int32Array, coverage: ArrayLike<number>, extremes?: ExtremeCells): DispersionResult {
  const cells = keptIndex.length;
  let points = 0;
  let coverageSum = 0;
  let weightedSquares = 0;
  // without extremes nothing is listed: no count is >= Infinity or <= -Infinity, and partial cells check `listed`
  const listed = extremes?.cells ?? null;
  const from = extremes?.from ?? Number.POSITIVE_INFINITY;
  const to = extremes?.to ?? Number.NEGATIVE_INFINITY;
  let count = 0;
  for (let c = 0; c < cells; c++) {
    const x = gridCounts[keptIndex[c]!]!;
    gridCounts[c] = x;
    const a = coverage[c]!;
    points += x;
    coverageSum += a;
    if (a === 1) {
      weightedSquares += x * x;
      if (x >= from || x <= to) listed![count++] = c;
    } else {
      weightedSquares += (x * x) / a;
      if (listed !== null) listed[count++] = c;
    }
  }
  if (extremes !== undefined) extremes.count = count;
  return { chi2: chiSquareFromTotals(points, coverageSum, weightedSquares), df: cells - 1, points };
}

/**
 * The area-weighted chi-square from three totals, N = sum(O_c), A = sum(a_c) and S = sum(O_c^2 / a_c): with
 * E_c = N a_c / A, sum (O_c - E_c)^2 / E_c = sum O_c^2 / E_c - 2N + sum E_c = (A / N) S - N. NaN with N = 0
 * (undefined); rounding below 0 is clamped to 0. Cost O(1).
 * Reference: K. Pearson (1900), as above (expanding the square); the same identity gives X2 = (m - 1) vmr for
 * whole cells.
 */
export function chiSquareFromTotals(points: number, coverageSum: number, weightedSquares: number): number {
  if (!(points > 0)) return Number.NaN;
  return Math.max(0, (coverageSum / points) * weightedSquares - points);
}
