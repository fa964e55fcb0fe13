import type { MonteCarloResult } from '../../shared/contracts.js';
import { monteCarloPValue } from './monte-carlo-p-value.js';
import { quantileSorted, sortedFinite } from './quantiles.js';

/** chi2/df and significance of every placement of one cell size, for the observed and the simulated patterns. */
export interface PlacementRobustInput {
  /** chi2/df of each of the P placements on the observed pattern */
  observed: ArrayLike<number>;
  /** 1 when the placement is significant (either tail at alpha) on the observed pattern, else 0 */
  observedSignificant: ArrayLike<number>;
  /** chi2/df on simulated pattern r at placement j, stored at r * P + j (R x P values) */
  simulated: ArrayLike<number>;
  /** significance flags, same layout as simulated */
  simulatedSignificant: ArrayLike<number>;
  sims: number;
}

/** Median, maximum, minimum and share significant of one pattern's placements (NaN placements left out). */
interface PatternSummary {
  median: number;
  max: number;
  min: number;
  shareSignificant: number;
}

function summarizePattern(values: ArrayLike<number>, significant: ArrayLike<number>): PatternSummary {
  const sorted = sortedFinite(values);
  let hits = 0;
  for (let index = 0; index < significant.length; index++) hits += significant[index] ? 1 : 0;
  return {
    median: quantileSorted(sorted, 0.5),
    max: sorted.length > 0 ? sorted[sorted.length - 1] : Number.NaN,
    min: sorted.length > 0 ? sorted[0] : Number.NaN,
    shareSignificant: significant.length > 0 ? hits / significant.length : Number.NaN,
  };
}

/**
 * Placement-robust Monte Carlo test of complete spatial randomness at one cell size.
 *
 * Each of R CSR patterns (same n, uniform in the valid region) is evaluated at the same P placements as the
 * observed pattern. Summary statistics across placements: the median of chi2/df (type 7 quantile), its maximum
 * (the grid a hurried analyst could have picked) and its minimum. p-values (Besag & Diggle 1977):
 * pMedianClustered = (1 + #{r: median_r >= median_obs}) / (R + 1), pMedianRegular with <=,
 * pMaxClustered on the maxima with >=, pMinRegular on the minima with <=. The CSR envelope is the 2.5 and 97.5 %
 * type 7 quantiles of the simulated medians. Also the share of placements significant on each pattern, which
 * shows how often "significant at some placement" happens under CSR. Cost O(R P log P).
 *
 * Reference: J. Besag and P. J. Diggle (1977), "Simple Monte Carlo tests for spatial pattern", Applied
 * Statistics 26(3):327-333; R. J. Hyndman and Y. Fan (1996), The American Statistician 50:361-365 (quantiles).
 */
export function placementRobustTest(input: PlacementRobustInput): MonteCarloResult {
  const placements = input.observed.length;
  const observed = summarizePattern(input.observed, input.observedSignificant);
  const simulatedMedians: number[] = [];
  const simulatedMaxima: number[] = [];
  const simulatedMinima: number[] = [];
  const simulatedShareSignificant: number[] = [];
  for (let r = 0; r < input.sims; r++) {
    const start = r * placements;
    const values = sliceOf(input.simulated, start, start + placements);
    const flags = sliceOf(input.simulatedSignificant, start, start + placements);
    const pattern = summarizePattern(values, flags);
    simulatedMedians.push(pattern.median);
    simulatedMaxima.push(pattern.max);
    simulatedMinima.push(pattern.min);
    simulatedShareSignificant.push(pattern.shareSignificant);
  }
  const sortedMedians = sortedFinite(simulatedMedians);
  return {
    sims: input.sims,
    pMedianClustered: monteCarloPValue(observed.median, simulatedMedians, 'upper'),
    pMedianRegular: monteCarloPValue(observed.median, simulatedMedians, 'lower'),
    pMaxClustered: monteCarloPValue(observed.max, simulatedMaxima, 'upper'),
    pMinRegular: monteCarloPValue(observed.min, simulatedMinima, 'lower'),
    observedMedian: observed.median,
    observedMax: observed.max,
    observedMin: observed.min,
    simulatedMedians,
    simulatedMaxima,
    simulatedMinima,
    envelope: { lo: quantileSorted(sortedMedians, 0.025), hi: quantileSorted(sortedMedians, 0.975) },
    observedShareSignificant: observed.shareSignificant,
    simulatedShareSignificant,
  };
}

function sliceOf(values: ArrayLike<number>, start: number, end: number): ArrayLike<number> {
  if (ArrayBuffer.isView(values)) return (values as unknown as Float64Array).subarray(start, end);
  return Array.prototype.slice.call(values, start, end) as number[];
}
