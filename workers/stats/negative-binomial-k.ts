/**
 * Negative-binomial k by the method of moments.
 *
 * Formula: k = mean^2 / (variance - mean), with the sample variance (divisor m - 1). Small k means strong
 * aggregation; k grows without bound toward Poisson. Returns null when variance <= mean (not aggregated: the
 * moment estimate is infinite or negative) or when either moment is undefined.
 *
 * Cost: O(1) given mean and variance.
 *
 * Reference: R. A. Fisher (1941), "The negative binomial distribution", Annals of Eugenics 11:182-187;
 * F. J. Anscombe (1949), "The statistical analysis of insect counts based on the negative binomial
 * distribution", Biometrics 5:165-173.
 */
export function negativeBinomialK(mean: number, variance: number): number | null {
  if (!Number.isFinite(mean) || !Number.isFinite(variance) || !(variance > mean)) return null;
  return (mean * mean) / (variance - mean);
}
