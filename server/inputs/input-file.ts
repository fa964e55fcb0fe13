/**
 * An uploaded or read file as the inputs see it: a display name (used in every message) and its bytes or text.
 * The CLI reads files from disk, the server passes multipart uploads; both end up here.
 */
import { inputError } from '../errors.js';
import { refuseForeignFormat } from './file-signature.js';
import type { InputFile } from './input-file-type.js';

export type { InputFile } from './input-file-type.js';

const BYTE_ORDER_MARK = '\uFEFF';
export const SQLITE_MAGIC = 'SQLite format 3';

/**
 * Longest physical line a CSV file of points may have (bytes). A record of points is an id and two coordinates,
 * a few dozen bytes; a megabyte leaves room for wide attribute columns while a file of one enormous line (a wrong
 * file, or a hostile one) is refused at that line instead of being handed to the CSV parser whole.
 */
export const MAX_CSV_LINE_BYTES = 1024 * 1024;

/** A byte count in MB with three significant digits, as the size limits are worded. */
export function megabytes(bytes: number): string {
  return `${Number((bytes / 1048576).toPrecision(3))} MB`;
}

/**
 * The text of a file: bytes decoded as UTF-8, a leading byte-order mark removed.
 * Throws GS_ERR_INPUT when the file is empty, blank or binary (e.g. a GeoPackage or a spreadsheet).
 */
export function readText(file: InputFile): string {
  refuseForeignFormat(file);
  let text = typeof file.content === 'string' ? file.content : new TextDecoder('utf-8').decode(file.content);
  if (text.startsWith(BYTE_ORDER_MARK)) text = text.slice(1);
  if (text.trim() === '') throw inputError(`${file.name}: the file is empty`);
  if (text.startsWith(SQLITE_MAGIC)) {
    throw inputError(`${file.name}: this is an SQLite file that is not read as a GeoPackage here; give CSV, GeoJSON or a GeoPackage`);
  }
  if (text.slice(0, 4096).includes('\u0000')) {
    throw inputError(`${file.name}: the file is binary, not text; give CSV or GeoJSON`);
  }
  return text;
}

/** True when the file should be read as GeoJSON: a .json/.geojson name, or text starting with '{'. */
export function looksLikeGeoJson(file: InputFile, text: string): boolean {
  const lower = file.name.toLowerCase();
  if (lower.endsWith('.geojson') || lower.endsWith('.json')) return true;
  if (lower.endsWith('.csv') || lower.endsWith('.tsv') || lower.endsWith('.txt')) return false;
  return text.trimStart().startsWith('{');
}
