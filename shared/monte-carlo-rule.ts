/**
 * How many simulations a Monte Carlo test needs before it can reject at all, shared by the server, the CLI and
 * the page (one fact in one place).
 *
 * With R simulated patterns the smallest p-value a Monte Carlo test can give is 1 / (R + 1) (the observed pattern
 * is the most extreme of the R + 1; J. Besag and P. J. Diggle (1977), "Simple Monte Carlo tests for spatial
 * pattern", Applied Statistics 26:327-333). A test at level alpha can therefore reject only when
 * 1 / (R + 1) <= alpha, i.e. R >= ceil(1 / alpha) - 1: 19 at alpha 0.05, 99 at alpha 0.01. The overall test
 * across cell sizes (server/summary/overall-test.ts) ranks one continuous statistic over the R + 1 patterns, so
 * its smallest p-value is also 1 / (R + 1): the same bound serves both. R = 0 runs no test (the per-placement
 * chi-square p-values are then evidence about single grids, not a test of the sweep).
 */

/** Relative slack for alpha values such as 0.05 that are not exact in binary (1 / 0.05 = 20.000000000000004). */
const ALPHA_SLACK = 1e-9;

/** The smallest R with 1 / (R + 1) <= alpha: ceil(1 / alpha) - 1 (19 at alpha 0.05). */
export function smallestWorkingSims(alpha: number): number {
  return Math.max(1, Math.ceil(1 / alpha - ALPHA_SLACK) - 1);
}

/** Whether R simulations can give a p-value at or below alpha (R = 0 is "no test", not a failing test). */
export function simsCanReject(sims: number, alpha: number): boolean {
  return sims >= smallestWorkingSims(alpha);
}

/** The sentence that refuses a plan whose Monte Carlo test could never reject; null when the plan is fine. */
export function tooFewSimsMessage(sims: number, alpha: number): string | null {
  if (sims === 0 || simsCanReject(sims, alpha)) return null;
  const least = smallestWorkingSims(alpha);
  return (
    `sims ${sims} is too few for a test at alpha ${alpha}: with R simulations no Monte Carlo p-value is below ` +
    `1/(R+1) = ${Number((1 / (sims + 1)).toPrecision(3))}, so the test could never reject; use sims of at least ${least} ` +
    `(or 0 for per-placement evidence without a test)`
  );
}

/** How a plan with sims = 0 labels its results: evidence about single placements, not a test of the sweep. */
export const NO_SIMS_LABEL =
  'per-placement evidence only (sims = 0): no Monte Carlo test was run, so no conclusion about the sweep as a whole is tested';
