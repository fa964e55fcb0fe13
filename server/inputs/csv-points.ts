/**
 * Points from a CSV file with a header row, parsed by csv-parse (quoted fields, mixed line endings, BOM).
 * Messages name the physical line (the header is line 1; a quoted field spanning lines counts every line).
 */
import { parse } from 'csv-parse/sync';
import { inputError } from '../errors.js';
import { findCoordinateColumns } from './column-names.js';
import { detectDelimiter } from './detect-delimiter.js';
import { parseCoordinate } from './parse-coordinate.js';
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

export function readCsvPoints(
  fileName: string,
  text: string,
  columns: { x?: string; y?: string; id?: string },
): RawPoints {
  const records = parseRecords<string[]>(fileName, text, false);
  if (records.length === 0) throw inputError(`${fileName}: the file is empty`);
  const header = records[0];
  const found = findCoordinateColumns(fileName, header, columns);
  const rows = records.slice(1);
  if (rows.length === 0) throw inputError(`${fileName}: no point records after the header (line 1)`);
  const coordinates = new Float64Array(rows.length * 2);
  const ids: string[] = new Array(rows.length);
  const lineOf = lazyLines(fileName, text);
  for (let k = 0; k < rows.length; k += 1) {
    const fields = rows[k];
    const where = (): string => `${fileName}: line ${lineOf(k)}`;
    if (fields.length !== header.length) {
      throw inputError(`${where()}: ${fields.length} fields where the header (line 1) has ${header.length}`);
    }
    coordinates[2 * k] = parseCoordinate(fields[found.x], where, `'${found.xName}'`);
    coordinates[2 * k + 1] = parseCoordinate(fields[found.y], where, `'${found.yName}'`);
    const id = found.id >= 0 ? fields[found.id] : '';
    ids[k] = id === '' ? String(k + 1) : id;
  }
  return {
    fileName,
    format: 'csv',
    coordinates,
    ids,
    kind: found.kind,
    locate: (index) => `${fileName}: line ${lineOf(index)}`,
  };
}
