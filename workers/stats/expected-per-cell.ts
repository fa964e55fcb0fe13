/**
 * Expected points per whole cell.
 *
 * Formula: N * s^2 / sum(a_c) where a_c = coverage_c * s^2 is the valid area of kept cell c; the s^2 cancel, so
 * expected = N / sum(coverage_c). NaN when there are no cells. Cost O(m).
 *
 * Reference: definition; compared with the rules of thumb below.
 */
export function expectedPointsPerCell(points: number, coverage: ArrayLike<number>): number {
  let coverageSum = 0;
  for (let c = 0; c < coverage.length; c++) coverageSum += coverage[c]!;
  return coverageSum > 0 ? points / coverageSum : Number.NaN;
}

/**
 * Rule of 5 (common practice): at least 5 expected points per cell, the chi-square adequacy rule for expected
 * counts carried over to quadrats; the conservative choice. Sources: NIST/SEMATECH e-Handbook of Statistical
 * Methods (2012), section 1.3.5.15, "Chi-square goodness-of-fit test"; W. G. Cochran (1954), "Some methods for
 * strengthening the common chi-square tests", Biometrics 10:417-451.
 */
export const RULE_OF_5_EXPECTED = 5;

/** Rule of 1.6 (common practice, no primary source found): about 1.6 expected points per cell. */
export const RULE_OF_1_6_EXPECTED = 1.6;

/** expectedPerCell >= 5 (common practice, see RULE_OF_5_EXPECTED). */
export function meetsRuleOf5(expectedPerCell: number): boolean {
  return expectedPerCell >= RULE_OF_5_EXPECTED;
}

/** expectedPerCell >= 1.6 (common practice, no primary source; see RULE_OF_1_6_EXPECTED). */
export function meetsRuleOf1_6(expectedPerCell: number): boolean {
  return expectedPerCell >= RULE_OF_1_6_EXPECTED;
}

/**
 * Cell side for a target number of expected points per cell.
 *
 * Formula: side = sqrt(k * A / n), with A the valid area (m^2), n the number of points and k the target expected
 * points per whole cell (so that n * side^2 / A = k). NaN unless k, A and n are all positive. Cost O(1).
 *
 * Reference: the rules of thumb above (common practice); derivation: one cell of area side^2 expects
 * n * side^2 / A points under a uniform intensity.
 */
export function cellSizeForExpected(k: number, validArea: number, n: number): number {
  if (!(k > 0) || !(validArea > 0) || !(n > 0)) return Number.NaN;
  return Math.sqrt((k * validArea) / n);
}
