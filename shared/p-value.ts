/**
 * The one p-value formatter of gridshake, shared by the CLI, the report and the page (one fact in one place).
 *
 * Text never says "p = 0": a p-value below SMALLEST_PRINTED_P (including one that underflowed to 0 in double
 * precision, whose smallest positive value is about 4.9e-324) prints as "< 1e-300". JSON outputs keep the number
 * and add the natural logarithm computed in log space (chiSquareLogUpperTail / chiSquareLogLowerTail), so that
 * extreme results still rank.
 */

/** Below this a p-value prints as "< 1e-300". */
export const SMALLEST_PRINTED_P = 1e-300;

/**
 * A p-value for reading: 4 significant digits from 1e-4 up ("0.06859", "0.05", "1"), scientific below
 * ("3.65e-202"), "< 1e-300" below SMALLEST_PRINTED_P, "n/a" when not a number (null, undefined, NaN).
 */
export function formatPValue(p: number | null | undefined): string {
  if (p === null || p === undefined || Number.isNaN(p)) return 'n/a';
  if (p < SMALLEST_PRINTED_P) return '< 1e-300';
  if (p < 1e-4) return p.toExponential(2);
  return String(Number(p.toPrecision(4)));
}

/** "p = 0.0123" or "p < 1e-300" (no "=" before a bound). */
export function pPhrase(p: number | null | undefined): string {
  const text = formatPValue(p);
  return text.startsWith('<') ? `p ${text}` : `p = ${text}`;
}
