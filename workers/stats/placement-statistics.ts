import type { PlacementStatistics } from '../types.js';
import { cellSums, chiSquareFromSums, varianceFromSums } from './cell-sums.js';
import { dispersionVerdict } from './dispersion-verdict.js';
import { meetsRuleOf1_6, meetsRuleOf5 } from './expected-per-cell.js';
import { greenIndex } from './green-index.js';
import { lloydCrowding } from './lloyd-crowding.js';
import { morisitaIndex } from './morisita.js';
import { negativeBinomialK } from './negative-binomial-k.js';
import { poissonGoodnessOfFit } from './poisson-goodness-of-fit.js';
import { standardizedMorisitaIndex } from './standardized-morisita.js';

/**
 * Every dispersion statistic of one placement (shared/design.md, "Statistics of one placement").
 *
 * Inputs: the counts O_c and coverages a_c (0 < a_c <= 1) of the m kept cells, and the two-sided level alpha.
 * Formulas: see each module: mean = N/m, sample variance (divisor m - 1), vmr = variance/mean, area-weighted
 * chi2 with df m - 1 and its two tails, verdict at alpha/2 per tail, expected points per whole cell N/sum(a_c)
 * with the rules of thumb 5 and 1.6 (common practice), Morisita I, standardized Morisita Ip (at the same alpha, so
 * |Ip| > 0.5 matches the whole-cell verdict), Lloyd mean crowding and patchiness, Green's C, negative-binomial k
 * (null when variance <= mean) and the Poisson frequency goodness of fit (null with fewer than 3 classes).
 * The indices use the raw counts; only chi2, its p-values and the Poisson fit's expected frequencies are
 * area-weighted.
 *
 * NaN means undefined: with N = 0 the ratio statistics (vmr, chi2, p-values, Morisita, Ip, Lloyd, Green) are
 * NaN and the verdict is 'csr'; with N = 1 Morisita, Ip and Green are NaN.
 *
 * Cost: O(m + D * K) (D distinct coverages, K largest count): two passes over the cells (cellSums, then the
 * Poisson frequency table), the rest from the sums.
 *
 * Throws RangeError when m < 2, the arrays differ in length, alpha is not in (0, 1), a count is not a
 * non-negative integer or a coverage is not in (0, 1 + 1e-9]; the message names the first bad cell.
 *
 * Reference: the modules' references; M. R. T. Dale (1999), Spatial Pattern Analysis in Plant Ecology,
 * Cambridge University Press, and C. J. Krebs (1999), Ecological Methodology, 2nd ed., for the set of indices.
 */
export function placementStatistics(counts: ArrayLike<number>, coverage: ArrayLike<number>,
  alpha: number): PlacementStatistics {
  if (counts.length < 2) {
    throw new RangeError(`placementStatistics requires at least 2 kept cells, got ${counts.length}`);
  }
  if (coverage.length !== counts.length) {
    throw new RangeError(
      `placementStatistics requires one coverage per cell: ${counts.length} counts, ${coverage.length} coverages`);
  }
  if (!(alpha > 0 && alpha < 1)) {
    throw new RangeError(`placementStatistics requires alpha in (0, 1), got ${alpha}`);
  }
  const sums = cellSums(counts, coverage);
  if (sums.firstInvalid >= 0) throwInvalidCell(counts, coverage, sums.firstInvalid);
  const { cells, points } = sums;
  const mean = points / cells;
  const variance = varianceFromSums(sums);
  const vmr = points > 0 ? variance / mean : Number.NaN;
  const chi2 = chiSquareFromSums(sums);
  const df = cells - 1;
  const { pClustered, pRegular, verdict } = dispersionVerdict(chi2, df, alpha);
  const expectedPerCell = sums.coverageSum > 0 ? points / sums.coverageSum : Number.NaN;
  const { meanCrowding, patchiness } = lloydCrowding(mean, vmr);
  return {
    cells,
    points,
    mean,
    variance,
    vmr,
    chi2,
    df,
    chi2PerDf: chi2 / df,
    pClustered,
    pRegular,
    verdict,
    expectedPerCell,
    meetsRuleOf5: meetsRuleOf5(expectedPerCell),
    meetsRuleOf1_6: meetsRuleOf1_6(expectedPerCell),
    morisita: morisitaIndex(sums),
    morisitaStandardized: standardizedMorisitaIndex(sums, alpha),
    meanCrowding,
    patchiness,
    green: greenIndex(vmr, points),
    negativeBinomialK: negativeBinomialK(mean, variance),
    poissonFit: poissonGoodnessOfFit(counts, coverage, 5, sums),
  };
}

function throwInvalidCell(counts: ArrayLike<number>, coverage: ArrayLike<number>, c: number): never {
  const count = counts[c]!;
  if (!(Number.isInteger(count) && count >= 0)) {
    throw new RangeError(`placementStatistics requires non-negative integer counts: cell ${c} holds ${count}`);
  }
  throw new RangeError(`placementStatistics requires coverage in (0, 1]: cell ${c} has ${coverage[c]!}`);
}
