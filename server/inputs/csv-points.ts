/**
 * Points from a CSV file with a header row, parsed by csv-parse (quoted fields, mixed line endings, BOM).
 * Messages name the physical line (the header is line 1; a quoted field spanning lines counts every line).
 */
import { parse } from 'csv-parse/sync';
import { badRowsError, inputError } from '../errors.js';
import { twoWays, FIELD_NAMES } from '../messages/field-names.js';
import { findCoordinateColumns } from './column-names.js';
import { detectDelimiter } from './detect-delimiter.js';
import { isMissingValue, parseCoordinate } from './parse-coordinate.js';
import type { RawPoints } from './raw-points.js';

interface ParsedRecord {
  record: string[];
  info: { lines: number };
}

const LINE_BREAK = /\r\n|\r|\n/g;

/** Physical line on which a record starts: csv-parse reports the line where it ends. */
function startLine(parsed: ParsedRecord): number {
  let breaks = 0;
  for (const field of parsed.record) breaks += (field.match(LINE_BREAK) ?? []).length;
  return parsed.info.lines - breaks;
}

/** Line numbers listed in a bad-rows message at most; the count is always given. */
export const BAD_ROWS_LISTED = 100;

function parseRecords<T>(fileName: string, text: string, info: boolean): T[] {
  try {
    return parse(text, {
      delimiter: detectDelimiter(text),
      record_delimiter: ['\r\n', '\n', '\r'],
      bom: true,
      info,
      trim: true,
      skip_empty_lines: true,
      relax_column_count: true,
    }) as unknown as T[];
  } catch (error) {
    const reason = error instanceof Error ? error.message : String(error);
    throw inputError(`${fileName}: not readable as CSV: ${reason}`);
  }
}

/**
 * Physical line numbers of the records (header excluded), computed only when a message needs one: parsing with
 * line information costs about twice as much, so the first pass goes without it.
 */
function lazyLines(fileName: string, text: string): (index: number) => number {
  let lines: Int32Array | null = null;
  return (index) => {
    if (lines === null) {
      const records = parseRecords<ParsedRecord>(fileName, text, true).slice(1);
      lines = Int32Array.from(records.map(startLine));
    }
    return lines[index];
  };
}

interface BadRow {
  line: number;
  what: string;
}

/**
 * The message for rows without coordinates: the count, every line (up to BAD_ROWS_LISTED) with what is missing,
 * and how to skip them (a page checkbox, a CLI flag).
 */
function badRowsMessage(fileName: string, bad: BadRow[]): string {
  const listed = bad.slice(0, BAD_ROWS_LISTED).map((row) => `line ${row.line} (${row.what})`).join(', ');
  const more = bad.length > BAD_ROWS_LISTED ? `, and ${bad.length - BAD_ROWS_LISTED} more` : '';
  const rows = bad.length === 1 ? '1 row has' : `${bad.length} rows have`;
  return (
    `${fileName}: ${rows} no coordinates (blank or n/a): ${listed}${more}; fill them in, or ` +
    `${twoWays('add --skip-bad-rows', `tick "${FIELD_NAMES.skipBadRows.label}"`)} to leave them out (they are then listed in a warning)`
  );
}

export interface CsvReadOptions {
  x?: string;
  y?: string;
  id?: string;
  /** leave out rows whose coordinates are blank or n/a (listed in RawPoints.skipped) instead of refusing the file */
  skipBadRows?: boolean;
}

export function readCsvPoints(fileName: string, text: string, columns: CsvReadOptions): RawPoints {
  const records = parseRecords<string[]>(fileName, text, false);
  if (records.length === 0) throw inputError(`${fileName}: the file is empty`);
  const header = records[0];
  const found = findCoordinateColumns(fileName, header, columns);
  const rows = records.slice(1);
  if (rows.length === 0) throw inputError(`${fileName}: no point records after the header (line 1)`);
  const decimalComma = detectDelimiter(text) !== ',';
  const coordinates = new Float64Array(rows.length * 2);
  const ids: string[] = [];
  /** index of each kept record among the file's records (for its line number) */
  const recordOf: number[] = [];
  const bad: BadRow[] = [];
  const lineOf = lazyLines(fileName, text);
  for (let k = 0; k < rows.length; k += 1) {
    const fields = rows[k];
    const where = (): string => `${fileName}: line ${lineOf(k)}`;
    if (fields.length !== header.length) {
      throw inputError(`${where()}: ${fields.length} fields where the header (line 1) has ${header.length}`);
    }
    const xText = fields[found.x];
    const yText = fields[found.y];
    if (isMissingValue(xText) || isMissingValue(yText)) {
      const describe = (name: string, value: string) => `'${name}' ${value.trim() === '' ? 'blank' : `'${value.trim()}'`}`;
      const parts = [isMissingValue(xText) ? describe(found.xName, xText) : null, isMissingValue(yText) ? describe(found.yName, yText) : null];
      bad.push({ line: lineOf(k), what: parts.filter((part) => part !== null).join(', ') });
      continue;
    }
    const kept = ids.length;
    coordinates[2 * kept] = parseCoordinate(xText, where, `'${found.xName}'`, decimalComma);
    coordinates[2 * kept + 1] = parseCoordinate(yText, where, `'${found.yName}'`, decimalComma);
    const id = found.id >= 0 ? fields[found.id] : '';
    ids.push(id === '' ? String(k + 1) : id);
    recordOf.push(k);
  }
  if (bad.length > 0 && columns.skipBadRows !== true) throw badRowsError(badRowsMessage(fileName, bad));
  if (ids.length === 0) throw inputError(`${fileName}: every row lacks coordinates (${bad.length} rows blank or n/a); no point is left`);
  return {
    fileName,
    format: 'csv',
    coordinates: bad.length === 0 ? coordinates : coordinates.slice(0, 2 * ids.length),
    ids,
    kind: found.kind,
    locate: (index) => `${fileName}: line ${lineOf(recordOf[index])}`,
    skippedLines: bad.map((row) => row.line),
  };
}
