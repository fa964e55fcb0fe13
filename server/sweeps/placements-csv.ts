/**
 * placements.csv: one row per (cell size, placement) with the placement's parameters and all its statistics.
 * RFC 4180 text (comma separated, CRLF line ends, header row); numbers in JavaScript's shortest round-trip form,
 * empty fields for undefined values (NaN, null), booleans as true / false. Used by the CLI and the HTTP export.
 */
import type { PlacementRow } from '../contracts.js';

/** Column order of placements.csv (the PlacementRow field names). */
export const PLACEMENT_COLUMNS: readonly (keyof PlacementRow)[] = [
  'sizeIndex',
  'cellSize',
  'placementIndex',
  'u',
  'v',
  'angle',
  'cells',
  'points',
  'mean',
  'variance',
  'vmr',
  'chi2',
  'df',
  'chi2PerDf',
  'pClustered',
  'pRegular',
  'verdict',
  'expectedPerCell',
  'meetsRuleOf5',
  'meetsRuleOf1_6',
  'morisita',
  'morisitaStandardized',
  'meanCrowding',
  'patchiness',
  'green',
  'negativeBinomialK',
  'poissonChi2',
  'poissonDf',
  'poissonP',
];

function field(value: PlacementRow[keyof PlacementRow]): string {
  if (value === null || value === undefined) return '';
  if (typeof value === 'number') return Number.isFinite(value) ? String(value) : '';
  return String(value);
}

/** The rows as CSV text, in the order given. Cost O(rows x columns). */
export function placementsToCsv(rows: readonly PlacementRow[]): string {
  const lines = [PLACEMENT_COLUMNS.join(',')];
  for (const row of rows) lines.push(PLACEMENT_COLUMNS.map((column) => field(row[column])).join(','));
  return `${lines.join('\r\n')}\r\n`;
}
