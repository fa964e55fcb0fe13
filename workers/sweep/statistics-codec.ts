/**
 * Compact encoding of one placement's statistics as a fixed run of float64 values, so that a chunk of
 * placements travels from a worker as one Float64Array (moved, not cloned). The fields, their order and how each
 * is encoded (null as NaN, booleans as 0/1, the verdict as a code) come from STATISTIC_FIELDS
 * (workers/stats/statistic-fields.ts).
 */
import type { PlacementStatistics } from '../types.js';
import { type EncodedStatistics, type FieldKind, flattenStatistics, STATISTIC_FIELDS, STATISTIC_NAMES, VERDICT_CODES } from '../stats/statistic-fields.js';

export type { EncodedStatistics } from '../stats/statistic-fields.js';

/** float64 slots per placement: one per statistic field. */
export const STATISTICS_FIELDS = STATISTIC_NAMES.length;

const KINDS: readonly FieldKind[] = STATISTIC_NAMES.map((name) => STATISTIC_FIELDS[name].kind);

function encodeValue(kind: FieldKind, value: EncodedStatistics[keyof EncodedStatistics]): number {
  if (kind === 'boolean') return value ? 1 : 0;
  if (kind === 'verdict') return VERDICT_CODES.indexOf(value as EncodedStatistics['verdict']);
  return value === null ? Number.NaN : (value as number);
}

function decodeValue(kind: FieldKind, value: number): EncodedStatistics[keyof EncodedStatistics] {
  if (kind === 'boolean') return value === 1;
  if (kind === 'verdict') return VERDICT_CODES[value] ?? 'csr';
  if (kind === 'nullable') return Number.isNaN(value) ? null : value;
  return value;
}

/** Writes the statistics at out[offset .. offset + STATISTICS_FIELDS). Cost O(fields). */
export function encodeStatistics(stats: PlacementStatistics, out: Float64Array, offset: number): void {
  const flat = flattenStatistics(stats);
  for (let k = 0; k < STATISTIC_NAMES.length; k++) out[offset + k] = encodeValue(KINDS[k], flat[STATISTIC_NAMES[k]]);
}

/** Reads back what encodeStatistics wrote, fields in STATISTIC_FIELDS order. Cost O(fields). */
export function decodeStatistics(data: Float64Array, offset: number): EncodedStatistics {
  const stats: Record<string, EncodedStatistics[keyof EncodedStatistics]> = {};
  for (let k = 0; k < STATISTIC_NAMES.length; k++) stats[STATISTIC_NAMES[k]] = decodeValue(KINDS[k], data[offset + k]);
  return stats as unknown as EncodedStatistics;
}
