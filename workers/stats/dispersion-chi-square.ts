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
 * Cost: O(m), two passes over the arrays, no allocation besides the small result object. This is the function
 * run for every simulated CSR pattern and every placement.
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
  for (let c = 0; c < cells; c++) {
    points += counts[c]!;
    coverageSum += coverage[c]!;
  }
  const pointsPerCoverage = points / coverageSum;
  let chi2 = 0;
  for (let c = 0; c < cells; c++) {
    const expected = pointsPerCoverage * coverage[c]!;
    const residual = counts[c]! - expected;
    chi2 += (residual * residual) / expected;
  }
  return { chi2, df: cells - 1, points };
}
