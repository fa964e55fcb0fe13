/**
 * The one list of a placement's statistic fields, in order. It drives the worker codec (one float64 per field, in
 * this order: workers/sweep/statistics-codec.ts), the statistic columns of placements.csv (name with unit and
 * rounding: server/sweeps/placements-csv.ts) and so the placement rows of placements.json and summary.json.
 * `satisfies StatisticFieldTable` makes the compiler reject a field of EncodedStatistics missing here, an extra
 * one, or a kind that does not match the field's type.
 */
import type { PlacementStatistics, Verdict } from '../types.js';

/** The statistics of a placement row without its placement parameters (shared/contracts.ts PlacementRow). */
export interface EncodedStatistics extends Omit<PlacementStatistics, 'poissonFit'> {
  poissonChi2: number | null;
  poissonDf: number | null;
  poissonP: number | null;
}

/** How numbers are written in placements.csv: as they are, or rounded to significant digits or decimals. */
export type Rounding = 'integer' | 'text' | { significant: number } | { decimals: number };

/**
 * How a field travels as one float64: 'number' as is; 'nullable' with null as NaN; 'boolean' as 0 / 1;
 * 'verdict' as its index in VERDICT_CODES.
 */
export type FieldKind = 'number' | 'nullable' | 'boolean' | 'verdict';

type KindOf<T> = [T] extends [boolean] ? 'boolean' : [T] extends [Verdict] ? 'verdict' : [T] extends [number] ? 'number' : 'nullable';

/** One statistic field: its codec kind, its placements.csv column (name with unit) and the column's rounding. */
export interface StatisticField<K extends FieldKind = FieldKind> {
  kind: K;
  csv: string;
  rounding: Rounding;
}

type StatisticFieldTable = { [F in keyof EncodedStatistics]: StatisticField<KindOf<EncodedStatistics[F]>> };

/** Verdict codes of the codec: 0 csr, 1 clustered, 2 regular. */
export const VERDICT_CODES: readonly Verdict[] = ['csr', 'clustered', 'regular'];

const SIG6 = { significant: 6 };
// p-values: four significant digits keep small tails readable (1.234e-9) without false precision
const SIG4 = { significant: 4 };

/** Every statistic field, in codec and CSV column order. */
export const STATISTIC_FIELDS = {
  cells: { kind: 'number', csv: 'cells_kept', rounding: 'integer' },
  points: { kind: 'number', csv: 'points_counted', rounding: 'integer' },
  mean: { kind: 'number', csv: 'mean_points_per_cell', rounding: SIG6 },
  variance: { kind: 'number', csv: 'variance_points2', rounding: SIG6 },
  vmr: { kind: 'number', csv: 'vmr', rounding: SIG6 },
  chi2: { kind: 'number', csv: 'chi2', rounding: SIG6 },
  df: { kind: 'number', csv: 'df', rounding: 'integer' },
  chi2PerDf: { kind: 'number', csv: 'chi2_per_df', rounding: SIG6 },
  pClustered: { kind: 'number', csv: 'p_clustered', rounding: SIG4 },
  pRegular: { kind: 'number', csv: 'p_regular', rounding: SIG4 },
  verdict: { kind: 'verdict', csv: 'verdict', rounding: 'text' },
  expectedPerCell: { kind: 'number', csv: 'expected_points_per_whole_cell', rounding: SIG6 },
  meetsRuleOf5: { kind: 'boolean', csv: 'meets_rule_of_5', rounding: 'text' },
  meetsRuleOf1_6: { kind: 'boolean', csv: 'meets_rule_of_1_6', rounding: 'text' },
  morisita: { kind: 'number', csv: 'morisita_index', rounding: SIG6 },
  morisitaStandardized: { kind: 'number', csv: 'morisita_standardized', rounding: SIG6 },
  meanCrowding: { kind: 'number', csv: 'mean_crowding_points', rounding: SIG6 },
  patchiness: { kind: 'number', csv: 'patchiness', rounding: SIG6 },
  green: { kind: 'number', csv: 'green_index', rounding: SIG6 },
  negativeBinomialK: { kind: 'nullable', csv: 'negative_binomial_k', rounding: SIG6 },
  poissonChi2: { kind: 'nullable', csv: 'poisson_fit_chi2', rounding: SIG6 },
  poissonDf: { kind: 'nullable', csv: 'poisson_fit_df', rounding: 'integer' },
  poissonP: { kind: 'nullable', csv: 'poisson_fit_p', rounding: SIG4 },
} as const satisfies StatisticFieldTable;

export type StatisticName = keyof EncodedStatistics;

/** The field names in order (the codec's slot of a field is its index here). */
export const STATISTIC_NAMES = Object.keys(STATISTIC_FIELDS) as StatisticName[];

/** Fields that come from the Poisson fit (null when there is none): the row field and the fit's property. */
export const POISSON_FIT_PARTS = { poissonChi2: 'chi2', poissonDf: 'df', poissonP: 'p' } as const satisfies Partial<
  Record<StatisticName, keyof NonNullable<PlacementStatistics['poissonFit']>>
>;

/** The statistics flattened for the codec and the rows: the Poisson fit as three nullable fields. Cost O(1). */
export function flattenStatistics(stats: PlacementStatistics): EncodedStatistics {
  const { poissonFit, ...rest } = stats;
  return {
    ...rest,
    poissonChi2: poissonFit ? poissonFit[POISSON_FIT_PARTS.poissonChi2] : null,
    poissonDf: poissonFit ? poissonFit[POISSON_FIT_PARTS.poissonDf] : null,
    poissonP: poissonFit ? poissonFit[POISSON_FIT_PARTS.poissonP] : null,
  };
}
