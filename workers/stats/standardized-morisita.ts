import { criticalValues } from './dispersion-verdict.js';
import type { CountSums } from './moments.js';
import { morisitaIndex } from './morisita.js';

/**
 * Standardized Morisita index Ip, on a scale from -1 (most even) to +1 (most clumped), with the limits
 * -0.5 and +0.5 marking the two-sided test at level alpha (0.05 in the source).
 *
 * Formula (m cells, N points, Id = Morisita's index, chi2 quantiles with m - 1 df):
 *   uniform index Mu = (F^-1(alpha/2) - m + N) / (N - 1)       (lower quantile)
 *   clumped index Mc = (F^-1(1 - alpha/2) - m + N) / (N - 1)   (upper quantile)
 *   Id >= Mc > 1:  Ip = 0.5 + 0.5 (Id - Mc) / (m - Mc)
 *   Mc > Id >= 1:  Ip = 0.5 (Id - 1) / (Mc - 1)
 *   1 > Id > Mu:   Ip = -0.5 (Id - 1) / (Mu - 1)
 *   1 > Mu >= Id:  Ip = -0.5 + 0.5 (Id - Mu) / Mu
 * Because Id (N - 1) + m - N = X^2, Id >= Mc exactly when X^2 reaches the upper critical value and Id < Mu exactly
 * when X^2 falls below the lower one: |Ip| > 0.5 when the two-sided whole-cell test rejects. NaN when N < 2.
 * When Id = Mc = m (all points in one cell at the smallest N) Ip is 1.
 *
 * Cost: O(1) given the count sums; the two chi-square quantiles come from the cached criticalValues(df, alpha).
 *
 * Reference: D. E. Smith-Gill (1975), "Cytophysiological basis of disruptive pigmentary patterns in the leopard
 * frog Rana pipiens. II. Wild type and mutant cell-specific patterns", Journal of Morphology 146:35-54; as
 * presented in C. J. Krebs (1999), Ecological Methodology, 2nd ed., Addison-Wesley (from memory).
 */
export function standardizedMorisitaIndex(sums: CountSums, alpha = 0.05): number {
  const { cells, points } = sums;
  if (points < 2) return Number.NaN;
  const morisita = morisitaIndex(sums);
  const { lower, upper } = criticalValues(cells - 1, alpha);
  const uniformIndex = (lower - cells + points) / (points - 1);
  const clumpedIndex = (upper - cells + points) / (points - 1);
  if (morisita >= clumpedIndex) {
    const room = cells - clumpedIndex;
    return room > 0 ? 0.5 + (0.5 * (morisita - clumpedIndex)) / room : 1;
  }
  if (morisita >= 1) return (0.5 * (morisita - 1)) / (clumpedIndex - 1);
  if (morisita > uniformIndex) return (-0.5 * (morisita - 1)) / (uniformIndex - 1);
  return -0.5 + (0.5 * (morisita - uniformIndex)) / uniformIndex;
}
