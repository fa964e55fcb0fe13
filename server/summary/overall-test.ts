import type { MonteCarloResult, OverallTest } from '../../shared/contracts.js';
import type { CellShape } from '../../workers/lattice/cell-shape.js';
import { simsCanReject } from '../../shared/monte-carlo-rule.js';

/** One cell size's Monte Carlo statistics: the observed median chi2/df and the R simulated ones. */
export interface OverallTestSize {
  cellSize: number;
  /** given for sweeps with more than one shape or with hexagons: the entry's cell shape */
  shape?: CellShape;
  monteCarlo: Pick<MonteCarloResult, 'observedMedian' | 'simulatedMedians'>;
}

/**
 * The overall test across cell sizes and both tails: one Monte Carlo test at level alpha.
 *
 * Statistic (for each of the R + 1 patterns, the observed one and the R simulated under CSR):
 *   T = max over sizes s of |m_s - mean_s| / sd_s,
 * with m_s the pattern's median chi2/df across placements at size s, and mean_s, sd_s the mean and standard
 * deviation of m_s over all R + 1 patterns (the observed included, so that the statistic treats the R + 1
 * patterns alike). The same simulated patterns serve every size (each is evaluated at every size and placement),
 * so T of a simulated pattern is computed exactly as T of the observed one.
 *   p = (1 + #{r: T_r >= T_obs}) / (R + 1)
 * Under CSR the R + 1 values of T are exchangeable, so P(p <= alpha) <= alpha whatever the number of sizes and
 * however they correlate: the maximum over sizes and the absolute value (both tails) are inside the statistic,
 * so no correction for multiple sizes or tails is needed. A non-number m_s of a simulated pattern makes its T
 * infinite (counted as at least as extreme: conservative). The direction reported is that of the observed pattern
 * at the size where its |standardized median| is largest: 'clustered' above the mean, 'regular' below.
 * Smallest possible p: 1 / (R + 1) (shared/monte-carlo-rule.ts). Cost O(K R) for K sizes.
 *
 * Reference: J. Besag and P. J. Diggle (1977), "Simple Monte Carlo tests for spatial pattern", Applied Statistics
 * 26:327-333 (exchangeability, the (1 + k) / (R + 1) p-value); the maximum of standardized statistics as a
 * single test across several scales follows the global envelope tests of M. Myllymaki, T. Mrkvicka, P. Grabarnik,
 * H. Seijo and U. Hahn (2017), "Global envelope tests for spatial processes", J. R. Stat. Soc. B 79:381-404 (here
 * in its simplest, standardized-maximum form; from memory).
 * @returns null when there are no sizes, or a size has no simulations
 */
export function overallMonteCarloTest(sizes: readonly OverallTestSize[], alpha: number): OverallTest | null {
  if (sizes.length === 0) return null;
  const sims = sizes[0]!.monteCarlo.simulatedMedians.length;
  if (sims === 0 || sizes.some((size) => size.monteCarlo.simulatedMedians.length !== sims)) return null;
  const observedT = { value: 0, size: 0, sign: 0 };
  const simulatedT = new Float64Array(sims);
  sizes.forEach((size, sizeIndex) => {
    const { observedMedian, simulatedMedians } = size.monteCarlo;
    const { mean, sd } = meanAndSd([observedMedian, ...simulatedMedians]);
    const standardize = (value: number): number => {
      if (!Number.isFinite(value)) return Number.POSITIVE_INFINITY;
      return sd > 0 ? Math.abs(value - mean) / sd : 0;
    };
    // an observed median that is not a number carries no evidence: 0, never the most extreme
    const observedZ = Number.isFinite(observedMedian) ? standardize(observedMedian) : 0;
    if (sizeIndex === 0 || observedZ > observedT.value) {
      observedT.value = observedZ;
      observedT.size = sizeIndex;
      observedT.sign = Math.sign(observedMedian - mean);
    }
    for (let r = 0; r < sims; r++) simulatedT[r] = Math.max(simulatedT[r]!, standardize(simulatedMedians[r]!));
  });
  let atLeastAsExtreme = 0;
  for (let r = 0; r < sims; r++) if (simulatedT[r]! >= observedT.value) atLeastAsExtreme += 1;
  const p = (1 + atLeastAsExtreme) / (sims + 1);
  const rejects = p <= alpha;
  return {
    method: 'monte-carlo-max-standardized-median',
    statistic: observedT.value,
    p,
    sims,
    alpha,
    canReject: simsCanReject(sims, alpha),
    rejects,
    direction: rejects ? (observedT.sign >= 0 ? 'clustered' : 'regular') : 'csr',
    strongestCellSize: sizes[observedT.size]!.cellSize,
    ...(sizes[observedT.size]!.shape === undefined ? {} : { strongestShape: sizes[observedT.size]!.shape }),
  };
}

/** Mean and sample standard deviation of the finite values. */
function meanAndSd(values: readonly number[]): { mean: number; sd: number } {
  let count = 0;
  let sum = 0;
  for (const value of values) {
    if (!Number.isFinite(value)) continue;
    count += 1;
    sum += value;
  }
  const mean = count > 0 ? sum / count : Number.NaN;
  let squares = 0;
  for (const value of values) if (Number.isFinite(value)) squares += (value - mean) ** 2;
  return { mean, sd: count > 1 ? Math.sqrt(squares / (count - 1)) : 0 };
}

/** The methods-text sentence that says what the overall test is (report and summary). */
export const OVERALL_TEST_METHOD =
  'The overall conclusion is one Monte Carlo test at level alpha across all cell sizes and both tails: for the observed ' +
  'pattern and each simulated CSR pattern, the median chi2/df across placements at each size is standardized by the mean ' +
  'and standard deviation over all patterns at that size, the largest absolute standardized value over sizes is the ' +
  'statistic, and p = (1 + number of simulated patterns at least as extreme) / (R + 1) (Besag and Diggle 1977). ' +
  'The per-size p-values are each a test at one size only; they are not corrected for the number of sizes.';
