/**
 * Strict parsing of one coordinate value: plain decimal or scientific notation only (no hex, no blanks, no
 * "Infinity"), finite. The message names the place given by the caller (file and line, or feature).
 */
import { inputError } from '../errors.js';
import { fieldRef } from '../messages/field-names.js';

const DECIMAL = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;
const DECIMAL_COMMA = /^[+-]?(\d+,\d*|,\d+)([eE][+-]?\d+)?$/;
/** How spreadsheets and exports write a missing value (compared in lower case). */
const MISSING = new Set(['', 'n/a', 'na', '#n/a', 'nan', 'null', 'none', '-', '?']);

/** True when a coordinate field is blank or says the value is missing ("n/a", "NA", "null", ...). */
export function isMissingValue(raw: string): boolean {
  return MISSING.has(raw.trim().toLowerCase());
}

/**
 * The number in `raw`, or a GS_ERR_INPUT naming the place (text, or a function computing it) and the column.
 * With `decimalComma` (a CSV whose delimiter is not a comma) "12,5" reads as 12.5.
 */
export function parseCoordinate(raw: string, place: string | (() => string), column: string, decimalComma = false): number {
  let text = raw.trim();
  const where = (): string => (typeof place === 'string' ? place : place());
  if (text === '') throw inputError(`${where()}: the ${column} value is empty`);
  if (decimalComma && DECIMAL_COMMA.test(text)) text = text.replace(',', '.');
  if (!DECIMAL.test(text)) {
    const hint = DECIMAL_COMMA.test(text)
      ? ' (a decimal comma in a comma-separated file: save it with ; as the delimiter, or with points as decimal separators)'
      : '';
    throw inputError(`${where()}: the ${column} value '${text}' is not a number${hint}`);
  }
  const value = Number(text);
  if (!Number.isFinite(value)) throw inputError(`${where()}: the ${column} value '${text}' is not finite`);
  return value;
}

/** Longitude in [-180, 180] and latitude in [-90, 90], or a GS_ERR_INPUT naming `where`. */
export function checkLonLat(lon: number, lat: number, where: string): void {
  if (lat < -90 || lat > 90) {
    throw inputError(`${where}: latitude ${lat} is beyond +-90 degrees (are the columns swapped or projected?)`);
  }
  if (lon < -180 || lon > 180) {
    throw inputError(`${where}: longitude ${lon} is beyond +-180 degrees (projected data? give ${fieldRef('crs')})`);
  }
}
