import { regularizedGammaP, regularizedGammaQ } from './incomplete-gamma.js';

/**
 * Exact one-sided tails of the Poisson distribution with mean lambda > 0, through the regularized incomplete gamma
 * function (never as 1 - cdf):
 *   P(X >= k) = P(k, lambda) for k >= 1 (and 1 for k <= 0),
 *   P(X <= k) = Q(k + 1, lambda) for k >= 0 (and 0 for k < 0).
 * Reference: NIST DLMF 8.4.10 (Q(n + 1, x) = e^-x sum_{j<=n} x^j / j!); M. Abramowitz and I. A. Stegun (1964),
 * Handbook of Mathematical Functions, 26.4.21. Cost O(1) to O(sqrt(k)) (workers/stats/incomplete-gamma.ts).
 */
export function poissonUpperTail(k: number, lambda: number): number {
  if (k <= 0) return 1;
  return regularizedGammaP(k, lambda);
}

/** P(X <= k) for X ~ Poisson(lambda); see poissonUpperTail. */
export function poissonLowerTail(k: number, lambda: number): number {
  if (k < 0) return 0;
  return regularizedGammaQ(k + 1, lambda);
}
