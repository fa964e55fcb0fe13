/**
 * Calibration of the stability surface by the largest share anywhere on the map. Each simulated null pattern r
 * (the sweep's Monte Carlo patterns, evaluated at the same placements) gives M_r = the largest share over the
 * assessed pixels. A pixel is in a stable area when its observed share s satisfies
 *   (1 + #{r : M_r >= s}) / (R + 1) <= level,
 * i.e. s exceeds the k-th largest M_r, k = floor(level (R + 1)): the (1 - level) quantile of the simulated maxima.
 * Under the null the observed map's maximum is exchangeable with the R simulated maxima, so a map shows any stable
 * area with probability at most `level` (the Monte Carlo test of the maximum: J. Besag and P. J. Diggle (1977),
 * "Simple Monte Carlo tests for spatial pattern", Applied Statistics 26:327-333; the maximum over locations as in
 * A. P. Holmes et al. (1996), J. Cerebral Blood Flow and Metabolism 16:7-22). Ties count against the pixel (>=), so
 * discrete shares keep the level. When k = 0 (too few simulations for the level) no pixel can be stable.
 */

/** The share a pixel must exceed (strictly); Infinity when floor(level (R + 1)) = 0. Cost O(R log R). */
export function shareThreshold(maxima: Float64Array, level: number): number {
  const k = Math.floor(level * (maxima.length + 1) + 1e-9);
  if (k < 1) return Number.POSITIVE_INFINITY;
  const sorted = Float64Array.from(maxima).sort((a, b) => b - a);
  return sorted[k - 1]!;
}

/** The Monte Carlo p-value of a share against the simulated maxima: (1 + #{M_r >= s}) / (R + 1). */
export function maximumPValue(maxima: Float64Array, share: number): number {
  let atLeast = 0;
  for (const value of maxima) if (value >= share) atLeast += 1;
  return (1 + atLeast) / (maxima.length + 1);
}
