/**
 * Compact encoding of one placement's statistics as a fixed run of float64 values, so that a chunk of
 * placements travels from a worker as one Float64Array (moved, not cloned). The fields, their order and how each
 * is encoded (null as NaN, booleans as 0/1, the verdict as its index in VERDICT_CODES) come from STATISTIC_FIELDS
 * (workers/stats/statistic-fields.ts): nothing here names a field.
 *
 * The encoder and decoder are generated once from that list as straight-line code (one statement per field, the
 * decoder one object literal), because a loop over the list with computed property names measured 10 to 15 times
 * slower than straight-line code; generated, they cost what hand-written ones did. The generated source uses only the
 * list's field names, each checked to be a plain identifier.
 */
import type { PlacementStatistics } from '../types.js';
import { type EncodedStatistics, type FieldKind, POISSON_FIT_PARTS, STATISTIC_FIELDS, STATISTIC_NAMES, VERDICT_CODES } from '../stats/statistic-fields.js';

export type { EncodedStatistics } from '../stats/statistic-fields.js';

/** float64 slots per placement: one per statistic field. */
export const STATISTICS_FIELDS = STATISTIC_NAMES.length;

const IDENTIFIER = /^[A-Za-z_][A-Za-z0-9_]*$/;

function checkedName(name: string): string {
  if (!IDENTIFIER.test(name)) throw new Error(`statistic field ${JSON.stringify(name)} is not a plain identifier`);
  return name;
}

/** The expression that reads field `name` of the statistics `s` as a number. */
function readExpression(name: string, kind: FieldKind): string {
  const part = (POISSON_FIT_PARTS as Record<string, string>)[name];
  const value = part === undefined ? `s.${checkedName(name)}` : `(s.poissonFit ? s.poissonFit.${checkedName(part)} : null)`;
  if (kind === 'boolean') return `(${value} ? 1 : 0)`;
  if (kind === 'verdict') return `verdicts.indexOf(${value})`;
  if (kind === 'nullable') return `(${value} ?? NaN)`;
  return value;
}

/** The expression that turns slot `k` of `d` back into field `name`'s value. */
function decodeExpression(kind: FieldKind, k: number): string {
  const slot = `d[o + ${k}]`;
  if (kind === 'boolean') return `${slot} === 1`;
  if (kind === 'verdict') return `(verdicts[${slot}] ?? 'csr')`;
  if (kind === 'nullable') return `(Number.isNaN(${slot}) ? null : ${slot})`;
  return slot;
}

const KINDS = STATISTIC_NAMES.map((name) => STATISTIC_FIELDS[name].kind as FieldKind);

const encoder = new Function(
  'verdicts',
  `return function encodeStatistics(s, out, o) {\n${STATISTIC_NAMES.map((name, k) => `  out[o + ${k}] = ${readExpression(name, KINDS[k])};`).join('\n')}\n};`,
)(VERDICT_CODES) as (stats: PlacementStatistics, out: Float64Array, offset: number) => void;

const decoder = new Function(
  'verdicts',
  `return function decodeStatistics(d, o) {\n  return {\n${STATISTIC_NAMES.map((name, k) => `    ${checkedName(name)}: ${decodeExpression(KINDS[k], k)},`).join('\n')}\n  };\n};`,
)(VERDICT_CODES) as (data: Float64Array, offset: number) => EncodedStatistics;

/** Writes the statistics at out[offset .. offset + STATISTICS_FIELDS). Cost O(fields). */
export function encodeStatistics(stats: PlacementStatistics, out: Float64Array, offset: number): void {
  encoder(stats, out, offset);
}

/** Reads back what encodeStatistics wrote, fields in STATISTIC_FIELDS order. Cost O(fields). */
export function decodeStatistics(data: Float64Array, offset: number): EncodedStatistics {
  return decoder(data, offset);
}
