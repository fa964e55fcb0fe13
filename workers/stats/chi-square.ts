import {
  logGamma, logGammaPrefix, logRegularizedGammaP, logRegularizedGammaQ, regularizedGammaP, regularizedGammaQ,
} from './incomplete-gamma.js';

/**
 * Chi-square upper tail probability (survival function).
 *
 * Formula: P(chi2_df >= x) = Q(df/2, x/2), the upper regularized incomplete gamma function, evaluated directly
 * (never as 1 - cdf) so that p-values down to about 1e-300 keep their relative accuracy. Returns 1 for x <= 0,
 * NaN for df <= 0 or NaN input. Values below the smallest double underflow to 0: chiSquareLogUpperTail keeps them.
 *
 * Cost: O(1) (Temme's expansion near the mean, else a series or continued fraction of a few dozen terms).
 *
 * Reference: K. Pearson (1900), "On the criterion that a given system of deviations from the probable ...",
 * Philosophical Magazine 50:157-175; the incomplete gamma function of incomplete-gamma.ts (DiDonato & Morris 1986,
 * Temme 1979/1987), accurate to about 1e-13 relative over df 1..1e7 against mpmath.
 */
export function chiSquareUpperTail(x: number, df: number): number {
  if (!(df > 0) || Number.isNaN(x)) return Number.NaN;
  if (x <= 0) return 1;
  if (x === Number.POSITIVE_INFINITY) return 0;
  return regularizedGammaQ(df / 2, x / 2);
}

/**
 * Chi-square lower tail probability (cumulative distribution function).
 *
 * Formula: P(chi2_df <= x) = P(df/2, x/2), the lower regularized incomplete gamma function, evaluated directly.
 * Returns 0 for x <= 0, NaN for df <= 0 or NaN input.
 *
 * Cost: O(1).
 *
 * Reference: as chiSquareUpperTail.
 */
export function chiSquareLowerTail(x: number, df: number): number {
  if (!(df > 0) || Number.isNaN(x)) return Number.NaN;
  if (x <= 0) return 0;
  if (x === Number.POSITIVE_INFINITY) return 1;
  return regularizedGammaP(df / 2, x / 2);
}

/**
 * Natural logarithm of P(chi2_df >= x), computed in log space (finite where the tail underflows, e.g. about
 * -805 for x = 2000, df = 100). 0 for x <= 0, -Infinity at x = Infinity, NaN for df <= 0 or NaN.
 * Cost O(1). Reference: as chiSquareUpperTail.
 */
export function chiSquareLogUpperTail(x: number, df: number): number {
  if (!(df > 0) || Number.isNaN(x)) return Number.NaN;
  if (x <= 0) return 0;
  if (x === Number.POSITIVE_INFINITY) return Number.NEGATIVE_INFINITY;
  return logRegularizedGammaQ(df / 2, x / 2);
}

/**
 * Natural logarithm of P(chi2_df <= x), computed in log space. -Infinity for x <= 0, 0 at x = Infinity, NaN for
 * df <= 0 or NaN. Cost O(1). Reference: as chiSquareUpperTail.
 */
export function chiSquareLogLowerTail(x: number, df: number): number {
  if (!(df > 0) || Number.isNaN(x)) return Number.NaN;
  if (x <= 0) return Number.NEGATIVE_INFINITY;
  if (x === Number.POSITIVE_INFINITY) return 0;
  return logRegularizedGammaP(df / 2, x / 2);
}

/**
 * Chi-square probability density f(x) = x^(df/2-1) exp(-x/2) / (2^(df/2) Gamma(df/2)) = g(df/2, x/2) / x with
 * g(a, y) = y^a e^-y / Gamma(a), formed without cancelling large logarithms (logGammaPrefix).
 */
function chiSquareDensity(x: number, df: number): number {
  return Math.exp(logGammaPrefix(df / 2, x / 2)) / x;
}

const MAX_NEWTON_STEPS = 100;

/**
 * Standard normal quantile, rough: Abramowitz & Stegun (1964), Handbook of Mathematical Functions, formula 26.2.23
 * (absolute error below 4.5e-4). Only a starting point for chiSquareQuantile's Newton steps. 0 < p < 1.
 */
function roughNormalQuantile(p: number): number {
  const q = p < 0.5 ? p : 1 - p;
  const t = Math.sqrt(-2 * Math.log(q));
  const z = t - (2.515517 + 0.802853 * t + 0.010328 * t * t) / (1 + 1.432788 * t + 0.189269 * t * t + 0.001308 * t * t * t);
  return p < 0.5 ? -z : z;
}

/**
 * A starting point for the chi-square quantile: the Wilson & Hilferty (1931) cube,
 * df (1 - 2/(9 df) + z sqrt(2/(9 df)))^3 with z the normal quantile of p; where that is not positive (small df,
 * small p), the lower tail's leading term P(x) ~ (x/2)^a / Gamma(a + 1), a = df/2, solved for x.
 * Reference: E. B. Wilson & M. M. Hilferty (1931), PNAS 17:684-688.
 */
function quantileStart(p: number, df: number): number {
  const h = 2 / (9 * df);
  const cube = 1 - h + roughNormalQuantile(p) * Math.sqrt(h);
  if (cube > 0) return df * cube * cube * cube;
  const a = df / 2;
  return 2 * Math.exp((Math.log(p) + logGamma(a + 1)) / a);
}

/**
 * Chi-square quantile (inverse cumulative distribution function).
 *
 * Formula: the x > 0 with P(chi2_df <= x) = p. Start from the Wilson-Hilferty approximation (quantileStart), then
 * Newton steps x <- x - (F(x) - p)/f(x) on the incomplete gamma functions of incomplete-gamma.ts, kept inside the
 * bracket that the signs of the residuals have narrowed so far (a step outside it bisects instead); for p > 0.5 the
 * step uses the upper tail, (1 - p) - Q(x), to avoid cancellation. Stops when a step moves x by at most 1e-14
 * relative. Result accurate to about 1e-14 relative. p = 0 gives 0, p = 1 gives Infinity, p outside [0, 1] or
 * df <= 0 gives NaN; a quantile below the smallest double gives 0.
 *
 * Cost: O(1): typically 3 to 6 Newton steps (criticalValues caches the results per df and level).
 *
 * Reference: NIST/SEMATECH e-Handbook of Statistical Methods (2012), section 1.3.6.7.4, "Critical values of the
 * chi-square distribution" (the table the tests reproduce); Newton's method safeguarded by bisection (W. H. Press
 * et al., Numerical Recipes, 3rd ed., 2007, section 9.4, "rtsafe").
 */
export function chiSquareQuantile(p: number, df: number): number {
  if (!(df > 0) || !(p >= 0 && p <= 1)) return Number.NaN;
  if (p === 0) return 0;
  if (p === 1) return Number.POSITIVE_INFINITY;
  const useUpperTail = p > 0.5;
  const target = useUpperTail ? 1 - p : p;
  let x = quantileStart(p, df);
  // a start that underflows to 0 (df 1 and p below about 1e-154): the quantile lies below the double range
  if (x === 0) return 0;
  if (!(x > 0) || !Number.isFinite(x)) x = df;
  // the root lies in (below, above): F(below) < p < F(above)
  let below = 0;
  let above = Number.POSITIVE_INFINITY;
  for (let step = 0; step < MAX_NEWTON_STEPS; step++) {
    const tail = useUpperTail ? chiSquareUpperTail(x, df) : chiSquareLowerTail(x, df);
    // lower tail rises with x, upper tail falls: the residual F(x) - p has the same sign either way
    const residual = useUpperTail ? target - tail : tail - target;
    if (residual === 0) break;
    if (residual > 0) above = x;
    else below = x;
    const density = chiSquareDensity(x, df);
    let next = density > 0 ? x - residual / density : Number.NaN;
    if (!(next > below && next < above)) next = above === Number.POSITIVE_INFINITY ? 2 * x : (below + above) / 2;
    const change = Math.abs(next - x);
    x = next;
    if (change <= 1e-14 * x) break;
  }
  return x;
}
