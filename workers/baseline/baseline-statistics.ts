/**
 * The statistics of one placement against a baseline (issue 15): expected counts E_c = N · w_c / Σ_kept w,
 * chi2 = Σ (O_c − E_c)^2 / E_c, df = m − 1, both tails and the verdict as for area (dispersion-verdict.ts).
 * VMR, Morisita, Lloyd, Green, negative-binomial k and the Poisson frequency fit keep their equal-area definitions
 * (they describe the counts per cell, not the null), computed by placementStatistics on the coverages.
 * The chi-square is the same Pearson statistic as dispersion-chi-square.ts with w_c in place of a_c: its identity
 * chi2 = (W / N) Σ O_c^2 / w_c − N (W = Σ w) needs only w_c > 0, not w_c <= 1.
 * Cost O(m) beyond placementStatistics.
 * Reference: K. Pearson (1900), Philosophical Magazine 50:157-175 (the statistic with any expected counts).
 */
import { dispersionChiSquare } from '../stats/dispersion-chi-square.js';
import { dispersionVerdict } from '../stats/dispersion-verdict.js';
import { placementStatistics } from '../stats/placement-statistics.js';
import type { PlacementStatistics } from '../types.js';

export function baselineStatistics(
  counts: ArrayLike<number>,
  coverage: ArrayLike<number>,
  weights: ArrayLike<number>,
  alpha: number,
): PlacementStatistics {
  const stats = placementStatistics(counts, coverage, alpha);
  const { chi2, df } = dispersionChiSquare(counts, weights);
  const { pClustered, pRegular, verdict } = dispersionVerdict(chi2, df, alpha);
  return { ...stats, chi2, df, chi2PerDf: chi2 / df, pClustered, pRegular, verdict };
}
