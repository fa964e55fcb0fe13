/**
 * Number formatting shared by the page, the charts, the report, the conclusions and the CLI (plain ASCII, no locale
 * surprises): one formatter each for numbers, metres, shares and p-values (the p-value formatter itself lives in
 * shared/p-value.ts and is re-exported here as formatP and pPhrase).
 */
export { formatPValue as formatP, pPhrase } from './p-value.js';

/** A number rounded to `digits` significant digits, printed without trailing zeros: (111.80339, 4) -> "111.8". */
export function significant(value: number, digits: number): string {
  return String(Number(value.toPrecision(digits)));
}

/** A number with `digits` significant digits, trailing zeros removed; '-' for null or non-finite. */
export function formatNumber(value: number | null | undefined, digits = 3): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '-';
  if (value === 0) return '0';
  const magnitude = Math.abs(value);
  if (magnitude >= 1e6 || magnitude < 1e-4) return value.toExponential(digits - 1);
  if (magnitude >= 10 ** digits) return String(Math.round(value));
  const text = value.toPrecision(digits);
  return text.includes('.') ? text.replace(/0+$/, '').replace(/\.$/, '') : text;
}

/**
 * A length in metres with its unit. By default rounded for labels: whole metres from 10 m, else 2 significant digits
 * ("250 m", "7.3 m"). With `significant`, that many significant digits, for sentences that name an exact side
 * ("111.8 m" at 4). Rounded for labels, '-' when not finite.
 */
export function formatMetres(metres: number, options: { significant?: number } = {}): string {
  if (options.significant !== undefined) return `${significant(metres, options.significant)} m`;
  if (!Number.isFinite(metres)) return '-';
  return metres >= 10 ? `${Math.round(metres)} m` : `${formatNumber(metres, 2)} m`;
}

/** An area in square metres, shown in km² from 1e6 m² upward. */
export function formatArea(squareMetres: number): string {
  if (!Number.isFinite(squareMetres)) return '-';
  if (squareMetres >= 1e6) return `${formatNumber(squareMetres / 1e6, 4)} km²`;
  return `${formatNumber(squareMetres, 4)} m²`;
}

/** A share in [0, 1] as a whole percentage: 0.843 -> "84 %". */
export function formatPercent(share: number): string {
  if (!Number.isFinite(share)) return '-';
  return `${Math.round(share * 100)} %`;
}

/** Seconds as "42 s", "3 min 05 s" or "1 h 02 min". */
export function formatDuration(seconds: number | null | undefined): string {
  if (seconds === null || seconds === undefined || !Number.isFinite(seconds) || seconds < 0) return '-';
  const whole = Math.round(seconds);
  if (whole < 60) return `${whole} s`;
  const minutes = Math.floor(whole / 60);
  if (minutes < 60) return `${minutes} min ${String(whole % 60).padStart(2, '0')} s`;
  return `${Math.floor(minutes / 60)} h ${String(minutes % 60).padStart(2, '0')} min`;
}
