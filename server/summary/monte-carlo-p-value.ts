export type Tail = 'upper' | 'lower';

/**
 * Monte Carlo p-value of an observed statistic against R statistics of patterns simulated under the null.
 *
 * Formula: upper tail p = (1 + #{r: t_r >= t_obs}) / (R + 1); lower tail p = (1 + #{r: t_r <= t_obs}) / (R + 1).
 * Ties count as at least as extreme; a simulated value that is not a number (NaN) also counts as at least as
 * extreme (conservative). With R = 0 the p-value is 1. The test is exact: under the null the observed pattern is
 * exchangeable with the simulated ones, so P(p <= k / (R + 1)) = k / (R + 1). Cost O(R).
 *
 * Reference: J. Besag and P. J. Diggle (1977), "Simple Monte Carlo tests for spatial pattern", Applied
 * Statistics 26(3):327-333.
 */
export function monteCarloPValue(observed: number, simulated: ArrayLike<number>, tail: Tail): number {
  let atLeastAsExtreme = 0;
  for (let index = 0; index < simulated.length; index++) {
    const value = simulated[index];
    if (Number.isNaN(value) || (tail === 'upper' ? value >= observed : value <= observed)) atLeastAsExtreme += 1;
  }
  return (1 + atLeastAsExtreme) / (simulated.length + 1);
}
