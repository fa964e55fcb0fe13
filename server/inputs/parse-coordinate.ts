/**
 * Strict parsing of one coordinate value: plain decimal or scientific notation only (no hex, no blanks, no
 * "Infinity"), finite. The message names the place given by the caller (file and line, or feature).
 */
import { inputError } from '../errors.js';
import { fieldRef } from '../messages/field-names.js';

const DECIMAL = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;
const DECIMAL_COMMA = /^[+-]?\d+,\d+$/;

/** The number in `raw`, or a GS_ERR_INPUT naming the place (text, or a function computing it) and the column. */
export function parseCoordinate(raw: string, place: string | (() => string), column: string): number {
  const text = raw.trim();
  const where = (): string => (typeof place === 'string' ? place : place());
  if (text === '') throw inputError(`${where()}: the ${column} value is empty`);
  if (!DECIMAL.test(text)) {
    const hint = DECIMAL_COMMA.test(text) ? ' (a decimal comma? use a point as decimal separator)' : '';
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
