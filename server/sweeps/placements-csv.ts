/**
 * placements.csv: one row per (cell size, placement) with the placement's parameters and all its statistics.
 * Comma separated with LF line ends; a first comment line (starting with '#') names the run; then a header row whose
 * column names carry their units (cell_side_m, angle_deg, offset_u_cells); numbers with the precision they merit
 * (see PLACEMENT_CSV_COLUMNS); empty fields for undefined values (NaN, null); booleans as true / false.
 * placements.json keeps every number at full precision. Used by the CLI and the HTTP export; README documents
 * the columns.
 */
import type { PlacementRow, SweepSummary } from '../../shared/contracts.js';
import { type Rounding, type StatisticField, STATISTIC_FIELDS, STATISTIC_NAMES } from '../../workers/stats/statistic-fields.js';

/** Column of placements.csv: its name (with unit), the PlacementRow field and how its numbers are written. */
export interface PlacementCsvColumn {
  name: string;
  field: keyof PlacementRow;
  rounding: Rounding;
}

/**
 * Column order and names of placements.csv: the placement's parameters, then every statistic field in the order
 * and with the names and roundings of STATISTIC_FIELDS (workers/stats/statistic-fields.ts), leaving out the fields
 * without a column (csv null: the area-only comparison against a baseline, in the JSON files only).
 */
export const PLACEMENT_CSV_COLUMNS: readonly PlacementCsvColumn[] = [
  { name: 'size_index', field: 'sizeIndex', rounding: 'integer' },
  { name: 'cell_side_m', field: 'cellSize', rounding: { significant: 6 } },
  { name: 'shape', field: 'shape', rounding: 'text' },
  { name: 'placement', field: 'placementIndex', rounding: 'integer' },
  // offsets and angles come from a low-discrepancy sequence; 1e-6 cell and 1e-4 degree are far below any effect
  { name: 'offset_u_cells', field: 'u', rounding: { decimals: 6 } },
  { name: 'offset_v_cells', field: 'v', rounding: { decimals: 6 } },
  { name: 'angle_deg', field: 'angle', rounding: { decimals: 4 } },
  ...STATISTIC_NAMES.flatMap((field) => {
    const { csv, rounding } = STATISTIC_FIELDS[field] as StatisticField;
    return csv === null ? [] : [{ name: csv, field, rounding }];
  }),
];

/** The PlacementRow fields in CSV column order. */
export const PLACEMENT_COLUMNS: readonly (keyof PlacementRow)[] = PLACEMENT_CSV_COLUMNS.map((column) => column.field);

function field(value: PlacementRow[keyof PlacementRow], rounding: Rounding): string {
  if (value === null || value === undefined) return '';
  if (typeof value === 'number') {
    if (!Number.isFinite(value)) return '';
    if (rounding === 'integer' || rounding === 'text' || Number.isInteger(value)) return String(value);
    if ('significant' in rounding) return String(Number(value.toPrecision(rounding.significant)));
    return String(Number(value.toFixed(rounding.decimals)));
  }
  return String(value);
}

/** What the first comment line says about the run. */
export interface CsvRun {
  sweepId?: string;
  summary: Pick<SweepSummary, 'dataset' | 'plan' | 'sizes'>;
}

/** "# gridshake placements: dataset "Heath", sweep 1a2b3c4d, cell sides 100, 200 m, 256 placements, ..." */
export function runCommentLine(run: CsvRun): string {
  const { dataset, plan, sizes } = run.summary;
  const sides = [...new Set(sizes.map((size) => Number(size.cellSize.toPrecision(6))))].sort((a, b) => a - b).join(', ');
  const shapes = [...new Set(sizes.map((size) => size.shape ?? 'square'))];
  const shapeWords = shapes.length === 1 && shapes[0] === 'square' ? '' : `, ${shapes.join(' and ')} cells`;
  const name = dataset.name.replace(/[\r\n]+/g, ' ');
  return (
    `# gridshake placements: dataset "${name}"${run.sweepId ? `, sweep ${run.sweepId}` : ''}, cell sides ${sides} m${shapeWords}, ` +
    `${plan.placements} placements per side (${plan.design}, rotation ${plan.rotation ? 'on' : 'off'}), minCoverage ${plan.minCoverage}, ` +
    `alpha ${plan.alpha}, ${plan.sims} CSR simulations, seed ${plan.seed}; coordinates ${dataset.crs}; full precision in placements.json`
  );
}

/** The rows as CSV text, in the order given, after the comment line naming the run. Cost O(rows x columns). */
export function placementsToCsv(rows: readonly PlacementRow[], run?: CsvRun): string {
  const lines = run ? [runCommentLine(run)] : [];
  lines.push(PLACEMENT_CSV_COLUMNS.map((column) => column.name).join(','));
  // rows stored before shapes existed name none: they are squares
  for (const row of rows) lines.push(PLACEMENT_CSV_COLUMNS.map((column) => field(column.field === 'shape' ? (row.shape ?? 'square') : row[column.field], column.rounding)).join(','));
  return `${lines.join('\n')}\n`;
}
