import type { Verdict } from '../types.js';
import { chiSquareLowerTail, chiSquareQuantile, chiSquareUpperTail } from './chi-square.js';

export interface DispersionVerdict {
  /** P(chi2_df >= chi2): small when the counts are more variable than Poisson (clustering) */
  pClustered: number;
  /** P(chi2_df <= chi2): small when the counts are more even than Poisson (regularity) */
  pRegular: number;
  verdict: Verdict;
}

/**
 * Two-sided verdict of the index-of-dispersion test.
 *
 * Formula: pClustered = P(chi2_df >= chi2) (upper tail, computed directly), pRegular = P(chi2_df <= chi2);
 * 'clustered' when pClustered < alpha/2, 'regular' when pRegular < alpha/2, else 'csr' (no departure from
 * complete spatial randomness at level alpha). A NaN chi2 (no points) gives NaN p-values and 'csr'.
 *
 * Cost: O(1), two incomplete gamma evaluations.
 *
 * Reference: K. Pearson (1900), Philosophical Magazine 50:157-175; P. J. Diggle (2013), Statistical Analysis of
 * Spatial and Spatio-Temporal Point Patterns, 3rd ed., CRC Press (quadrat counts, two-sided dispersion test).
 */
export function dispersionVerdict(chi2: number, df: number, alpha: number): DispersionVerdict {
  const pClustered = chiSquareUpperTail(chi2, df);
  const pRegular = chiSquareLowerTail(chi2, df);
  const halfAlpha = alpha / 2;
  let verdict: Verdict = 'csr';
  if (pClustered < halfAlpha) verdict = 'clustered';
  else if (pRegular < halfAlpha) verdict = 'regular';
  return { pClustered, pRegular, verdict };
}

/** The two-sided critical values of chi2 with df degrees of freedom at level alpha. */
export interface CriticalValues {
  /** lower quantile, P(chi2_df <= lower) = alpha/2 */
  lower: number;
  /** upper quantile, P(chi2_df >= upper) = alpha/2 */
  upper: number;
}

const criticalValueCache = new Map<number, Map<number, CriticalValues>>();

/**
 * Two-sided critical values for (df, alpha): lower = F^-1(alpha/2), upper = F^-1(1 - alpha/2), with F the
 * chi-square distribution function. Memoized per (alpha, df) (a deterministic cache, no I/O).
 *
 * Cost: O(1) after the first call per (df, alpha); the first call runs two quantile inversions.
 *
 * Reference: NIST/SEMATECH e-Handbook of Statistical Methods (2012), section 1.3.6.7.4.
 */
export function criticalValues(df: number, alpha: number): CriticalValues {
  let byDf = criticalValueCache.get(alpha);
  if (byDf === undefined) {
    byDf = new Map();
    criticalValueCache.set(alpha, byDf);
  }
  let values = byDf.get(df);
  if (values === undefined) {
    values = { lower: chiSquareQuantile(alpha / 2, df), upper: chiSquareQuantile(1 - alpha / 2, df) };
    byDf.set(df, values);
  }
  return values;
}

/**
 * The verdict of dispersionVerdict without p-values: 'clustered' when chi2 > upper critical value, 'regular'
 * when chi2 < lower critical value, else 'csr' (NaN gives 'csr'). Equivalent to dispersionVerdict because the
 * tails are monotone in chi2. Cost O(1) with cached critical values: meant for millions of simulated rows.
 * Reference: as criticalValues.
 */
export function verdictByCriticalValues(chi2: number, df: number, alpha: number): Verdict {
  const { lower, upper } = criticalValues(df, alpha);
  if (chi2 > upper) return 'clustered';
  if (chi2 < lower) return 'regular';
  return 'csr';
}

/**
 * Whether the two-sided index-of-dispersion test rejects CSR at level alpha (either tail), by comparison with
 * cached critical values: chi2 > F^-1(1 - alpha/2) or chi2 < F^-1(alpha/2). Cost O(1) amortized.
 * Reference: as criticalValues.
 */
export function isSignificant(chi2: number, df: number, alpha: number): boolean {
  return verdictByCriticalValues(chi2, df, alpha) !== 'csr';
}
