/**
 * Compact encoding of one placement's statistics as a fixed run of float64 values, so that a chunk of
 * placements travels from a worker as one Float64Array (moved, not cloned). The fields, their order and how each
 * is encoded (null as NaN, booleans as 0/1, the verdict as its index in VERDICT_CODES, an absent verdict as -1,
 * expectedFrom as its index in EXPECTED_FROM_CODES) come from STATISTIC_FIELDS (workers/stats/statistic-fields.ts):
 * nothing here names a field. The fields of EXPECTATION_FIELDS are read from the placement's expectation (the
 * second argument), the others from its statistics.
 *
 * The encoder and decoder are generated once from that list as straight-line code (one statement per field, the
 * decoder one object literal), because a loop over the list with computed property names measured 10 to 15 times
 * slower than straight-line code; generated, they cost what hand-written ones did. The generated source uses only the
 * list's field names, each checked to be a plain identifier.
 */
import type { PlacementStatistics } from '../types.js';
import {
  type EncodedStatistics,
  EXPECTATION_FIELDS,
  EXPECTED_FROM_CODES,
  type ExpectationInput,
  type FieldKind,
  POISSON_FIT_PARTS,
  STATISTIC_FIELDS,
  STATISTIC_NAMES,
  type StatisticName,
  VERDICT_CODES,
} from '../stats/statistic-fields.js';

export type { EncodedStatistics, ExpectationInput } from '../stats/statistic-fields.js';

/** float64 slots per placement: one per statistic field. */
export const STATISTICS_FIELDS = STATISTIC_NAMES.length;

const IDENTIFIER = /^[A-Za-z_][A-Za-z0-9_]*$/;

function checkedName(name: string): string {
  if (!IDENTIFIER.test(name)) throw new Error(`statistic field ${JSON.stringify(name)} is not a plain identifier`);
  return name;
}

/** The expression that reads field `name` of the statistics `s` (or of the expectation `e`) as a number. */
function readExpression(name: StatisticName, kind: FieldKind): string {
  const part = (POISSON_FIT_PARTS as Record<string, string>)[name];
  const value =
    part !== undefined
      ? `(s.poissonFit ? s.poissonFit.${checkedName(part)} : null)`
      : `${EXPECTATION_FIELDS.has(name) ? 'e' : 's'}.${checkedName(name)}`;
  if (kind === 'boolean') return `(${value} ? 1 : 0)`;
  if (kind === 'verdict') return `verdicts.indexOf(${value})`;
  if (kind === 'optionalVerdict') return `(${value} == null ? -1 : verdicts.indexOf(${value}))`;
  if (kind === 'expectedFrom') return `sources.indexOf(${value})`;
  if (kind === 'number' && EXPECTATION_FIELDS.has(name)) return `(${value} ?? NaN)`;
  if (kind === 'nullable') return `(${value} ?? NaN)`;
  return value;
}

/** The expression that turns slot `k` of `d` back into field `name`'s value. */
function decodeExpression(kind: FieldKind, k: number): string {
  const slot = `d[o + ${k}]`;
  if (kind === 'boolean') return `${slot} === 1`;
  if (kind === 'verdict') return `(verdicts[${slot}] ?? 'csr')`;
  if (kind === 'optionalVerdict') return `(verdicts[${slot}] ?? null)`;
  if (kind === 'expectedFrom') return `(sources[${slot}] ?? 'area')`;
  if (kind === 'nullable') return `(Number.isNaN(${slot}) ? null : ${slot})`;
  return slot;
}

const KINDS = STATISTIC_NAMES.map((name) => STATISTIC_FIELDS[name].kind as FieldKind);

const encoder = new Function(
  'verdicts',
  'sources',
  `return function encodeStatistics(s, e, out, o) {\n${STATISTIC_NAMES.map((name, k) => `  out[o + ${k}] = ${readExpression(name, KINDS[k]!)};`).join('\n')}\n};`,
)(VERDICT_CODES, EXPECTED_FROM_CODES) as (stats: PlacementStatistics, expectation: ExpectationInput, out: Float64Array, offset: number) => void;

const decoder = new Function(
  'verdicts',
  'sources',
  `return function decodeStatistics(d, o) {\n  return {\n${STATISTIC_NAMES.map((name, k) => `    ${checkedName(name)}: ${decodeExpression(KINDS[k]!, k)},`).join('\n')}\n  };\n};`,
)(VERDICT_CODES, EXPECTED_FROM_CODES) as (data: Float64Array, offset: number) => EncodedStatistics;

/**
 * Writes the statistics and the expectation (what the expected counts follow, workers/placement Expectation) at
 * out[offset .. offset + STATISTICS_FIELDS). Cost O(fields).
 */
export function encodeStatistics(stats: PlacementStatistics, expectation: ExpectationInput, out: Float64Array, offset: number): void {
  encoder(stats, expectation, out, offset);
}

/** Reads back what encodeStatistics wrote, fields in STATISTIC_FIELDS order. Cost O(fields). */
export function decodeStatistics(data: Float64Array, offset: number): EncodedStatistics {
  return decoder(data, offset);
}
