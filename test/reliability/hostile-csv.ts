/**
 * fast-check generators of hostile CSV point files: known and unknown column names (missing, extra, repeated,
 * padded), every delimiter, BOMs, mixed line endings, blank lines, quoted fields holding delimiters and line breaks,
 * unterminated quotes, wrong types, NaN/Infinity/huge/denormal values, duplicated ids, short and long records, and a
 * choice of coordinate-system options (good, bad and missing).
 */
import fc from 'fast-check';
import type { HostileCase } from './hostile-outcome.js';

const DELIMITERS = [',', ';', '\t', '|'] as const;
const LINE_ENDINGS = ['\n', '\r\n', '\r'] as const;
const COLUMN_NAMES = ['x', 'y', 'lon', 'lat', 'id', 'X', ' y ', 'easting', 'northing', 'name', 'note', '', 'x', 'LAT'];
const ODD_VALUES = [
  'NaN', 'Infinity', '-Infinity', '1e999', '-1e400', '1e308', '-1.7976931348623157e308', '5e-324', '1e-400',
  '0x10', '1,5', '', ' ', 'abc', 'null', 'true', '+.5', '.', '-', '1.2.3', '1e', '\u00a0', '\uff11', '1_000',
];
const CRS_CHOICES = [undefined, 'planar', 'planar', 'EPSG:4326', 'EPSG:32633', 'EPSG:2263', 'EPSG:999999', 'bogus', ' '];

function quoted(delimiter: string): fc.Arbitrary<string> {
  return fc.constantFrom(`"1${delimiter}2"`, '"a""b"', '"two\nlines"', '"unterminated', '"12"', '""', '"3.5"x');
}

/** A hostile replacement for one field. */
function oddField(delimiter: string): fc.Arbitrary<string> {
  return fc.oneof(
    { weight: 3, arbitrary: fc.constantFrom(...ODD_VALUES) },
    { weight: 1, arbitrary: fc.double().map(String) },
    { weight: 1, arbitrary: quoted(delimiter) },
    { weight: 1, arbitrary: fc.string({ maxLength: 6 }) },
  );
}

const HEADERS: { names: string[]; lonLat: boolean }[] = [
  { names: ['x', 'y'], lonLat: false },
  { names: ['id', 'x', 'y'], lonLat: false },
  { names: ['ID', ' X ', 'Y', 'note'], lonLat: false },
  { names: ['easting', 'northing', 'name'], lonLat: false },
  { names: ['lon', 'lat'], lonLat: true },
  { names: ['lat', 'lon', 'id'], lonLat: true },
];

/** One change to a valid file: a field replaced, a field dropped or added, a header name replaced. */
type Mutation =
  | { kind: 'field'; row: number; column: number; value: string }
  | { kind: 'drop'; row: number }
  | { kind: 'extra'; row: number; value: string }
  | { kind: 'header'; column: number; name: string };

function mutation(delimiter: string): fc.Arbitrary<Mutation> {
  const row = fc.nat({ max: 40 });
  return fc.oneof(
    { weight: 4, arbitrary: fc.record({ kind: fc.constant('field' as const), row, column: fc.nat({ max: 5 }), value: oddField(delimiter) }) },
    { weight: 1, arbitrary: fc.record({ kind: fc.constant('drop' as const), row }) },
    { weight: 1, arbitrary: fc.record({ kind: fc.constant('extra' as const), row, value: oddField(delimiter) }) },
    { weight: 1, arbitrary: fc.record({ kind: fc.constant('header' as const), column: fc.nat({ max: 5 }), name: fc.constantFrom(...COLUMN_NAMES) }) },
  );
}

interface CsvShape {
  delimiter: string;
  header: string[];
  rows: string[][];
  endings: string[];
  bom: boolean;
  blankLines: boolean;
  trailingNewline: boolean;
}

function goodRow(header: string[], lonLat: boolean): fc.Arbitrary<string[]> {
  const fields = header.map((name) => {
    const key = name.trim().toLowerCase();
    if (key === 'lon') return fc.double({ min: 9.99, max: 10.01, noNaN: true }).map(String);
    if (key === 'lat') return fc.double({ min: 44.99, max: 45.01, noNaN: true }).map(String);
    if (['x', 'y', 'easting', 'northing'].includes(key)) {
      return lonLat ? fc.constant('0') : fc.double({ min: -1000, max: 1000, noNaN: true }).map(String);
    }
    return fc.constantFrom('a', 'b', 'a', '7', 'site 3');
  });
  return fc.tuple(...fields);
}

function applyMutation(shape: CsvShape, change: Mutation): void {
  if (change.kind === 'header') {
    if (shape.header.length > 0) shape.header[change.column % shape.header.length] = change.name;
    return;
  }
  if (shape.rows.length === 0) return;
  const row = shape.rows[change.row % shape.rows.length];
  if (change.kind === 'field') row[change.column % Math.max(1, row.length)] = change.value;
  else if (change.kind === 'drop') row.pop();
  else row.push(change.value);
}

const csvShape: fc.Arbitrary<CsvShape> = fc
  .tuple(fc.constantFrom(...DELIMITERS), fc.constantFrom(...HEADERS))
  .chain(([delimiter, header]) =>
    fc
      .record({
        rows: fc.array(goodRow(header.names, header.lonLat), { minLength: 0, maxLength: 25 }),
        mutations: fc.array(mutation(delimiter), { maxLength: 3 }),
        endings: fc.array(fc.constantFrom(...LINE_ENDINGS), { minLength: 1, maxLength: 4 }),
        bom: fc.boolean(),
        blankLines: fc.boolean(),
        trailingNewline: fc.boolean(),
      })
      .map(({ rows, mutations, ...layout }) => {
        const shape: CsvShape = { delimiter, header: [...header.names], rows: rows.map((r) => [...r]), ...layout };
        for (const change of mutations) applyMutation(shape, change);
        return shape;
      }),
  );

function renderCsv(shape: CsvShape): string {
  const lines = [shape.header, ...shape.rows].map((fields) => fields.join(shape.delimiter));
  let text = '';
  lines.forEach((line, k) => {
    text += line;
    if (k < lines.length - 1 || shape.trailingNewline) text += shape.endings[k % shape.endings.length];
    if (shape.blankLines && k % 3 === 1) text += shape.endings[0];
  });
  return (shape.bom ? '\uFEFF' : '') + text;
}

/** Hostile CSV cases, each with its own file name and options. */
export const hostileCsvCase: fc.Arbitrary<HostileCase> = fc
  .record({
    shape: csvShape,
    fileName: fc.constantFrom('pts.csv', 'pts.txt', 'pts', 'pts.tsv'),
    crs: fc.oneof({ weight: 4, arbitrary: fc.constant('planar') }, { weight: 2, arbitrary: fc.constant(undefined) }, { weight: 2, arbitrary: fc.constantFrom(...CRS_CHOICES) }),
    columns: fc.option(fc.record({ x: fc.constantFrom('x', 'lon', 'nope'), y: fc.constantFrom('y', 'lat') }), { nil: undefined, freq: 6 }),
    maxPoints: fc.option(fc.integer({ min: 0, max: 30 }), { nil: undefined, freq: 6 }),
  })
  .map(({ shape, fileName, crs, columns, maxPoints }) => ({
    label: `csv ${fileName} crs ${String(crs)} ${JSON.stringify(renderCsv(shape)).slice(0, 160)}`,
    input: { points: { name: fileName, content: renderCsv(shape) } },
    options: { crs, ...(columns ?? {}), maxPoints },
  }));

/** Plain CSV text of `rows` under the header `x,y` with the given line ending (for fixed cases). */
export function simpleCsv(rows: number[][], ending = '\n'): string {
  return ['x,y', ...rows.map((row) => row.join(','))].join(ending) + ending;
}
