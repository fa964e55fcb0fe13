/**
 * The one list of a placement's statistic fields, in order. It drives the worker codec (one float64 per field, in
 * this order: workers/sweep/statistics-codec.ts), the statistic columns of placements.csv (name with unit and
 * rounding: server/sweeps/placements-csv.ts) and so the placement rows of placements.json and summary.json.
 * `satisfies StatisticFieldTable` makes the compiler reject a field of EncodedStatistics missing here, an extra
 * one, or a kind that does not match the field's type.
 */
import type { PlacementStatistics, Verdict } from '../types.js';
import type { ExpectedFrom } from '../baseline/baseline.js';

/**
 * What a placement's expected counts follow (issue 15, workers/placement Expectation): 'area', 'baseline' or
 * 'controls'; Σ_kept w (the kept cells' valid area in m^2 in area mode); the cells passing the coverage rule with
 * w = 0 and their points; against a baseline the same placement's area-only chi2/df and verdict (NaN / null in area
 * mode).
 */
export interface ExpectationStatistics {
  expectedFrom: ExpectedFrom;
  baselineTotal: number;
  zeroBaselineCells: number;
  pointsInZeroBaselineCells: number;
  areaChi2PerDf: number;
  areaVerdict: Verdict | null;
}

/** The expectation as the engine hands it over (the area-only comparison absent in area mode). */
export type ExpectationInput = Omit<ExpectationStatistics, 'areaChi2PerDf' | 'areaVerdict'> & {
  areaChi2PerDf?: number;
  areaVerdict?: Verdict;
};

/** The statistics of a placement row without its placement parameters (shared/contracts.ts PlacementRow). */
export interface EncodedStatistics extends Omit<PlacementStatistics, 'poissonFit'>, ExpectationStatistics {
  poissonChi2: number | null;
  poissonDf: number | null;
  poissonP: number | null;
}

/** How numbers are written in placements.csv: as they are, or rounded to significant digits or decimals. */
export type Rounding = 'integer' | 'text' | { significant: number } | { decimals: number };

/**
 * How a field travels as one float64: 'number' as is; 'nullable' with null as NaN; 'boolean' as 0 / 1;
 * 'verdict' as its index in VERDICT_CODES; 'optionalVerdict' likewise with null (or absent) as -1;
 * 'expectedFrom' as its index in EXPECTED_FROM_CODES.
 */
export type FieldKind = 'number' | 'nullable' | 'boolean' | 'verdict' | 'optionalVerdict' | 'expectedFrom';

type KindOf<T> = [T] extends [boolean]
  ? 'boolean'
  : [T] extends [Verdict]
    ? 'verdict'
    : [T] extends [ExpectedFrom]
      ? 'expectedFrom'
      : [T] extends [Verdict | null]
        ? 'optionalVerdict'
        : [T] extends [number]
          ? 'number'
          : 'nullable';

/**
 * One statistic field: its codec kind, its placements.csv column (name with unit; null: not a column, the field is
 * in placements.json and summary.json only) and the column's rounding.
 */
export interface StatisticField<K extends FieldKind = FieldKind> {
  kind: K;
  csv: string | null;
  rounding: Rounding;
}

type StatisticFieldTable = { [F in keyof EncodedStatistics]: StatisticField<KindOf<EncodedStatistics[F]>> };

/** Verdict codes of the codec: 0 csr, 1 clustered, 2 regular. */
export const VERDICT_CODES: readonly Verdict[] = ['csr', 'clustered', 'regular'];

/** expectedFrom codes of the codec: 0 area, 1 baseline, 2 controls. */
export const EXPECTED_FROM_CODES: readonly ExpectedFrom[] = ['area', 'baseline', 'controls'];

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
  // issue 15: what the expected counts follow ('area', 'baseline', 'controls'), the kept cells' total weight (m² of
  // valid area in area mode) and the cells (and points) passing the coverage rule with no population at risk
  expectedFrom: { kind: 'expectedFrom', csv: 'expected_from', rounding: 'text' },
  baselineTotal: { kind: 'number', csv: 'baseline_total', rounding: SIG6 },
  zeroBaselineCells: { kind: 'number', csv: 'zero_baseline_cells', rounding: 'integer' },
  pointsInZeroBaselineCells: { kind: 'number', csv: 'points_in_zero_baseline_cells', rounding: 'integer' },
  // against a baseline, the area-only test of the same placement (report's side-by-side verdicts; not CSV columns)
  areaChi2PerDf: { kind: 'number', csv: null, rounding: SIG6 },
  areaVerdict: { kind: 'optionalVerdict', csv: null, rounding: 'text' },
} as const satisfies StatisticFieldTable;

export type StatisticName = keyof EncodedStatistics;

/** The field names in order (the codec's slot of a field is its index here). */
export const STATISTIC_NAMES = Object.keys(STATISTIC_FIELDS) as StatisticName[];

/** Fields that come from the Poisson fit (null when there is none): the row field and the fit's property. */
export const POISSON_FIT_PARTS = { poissonChi2: 'chi2', poissonDf: 'df', poissonP: 'p' } as const satisfies Partial<
  Record<StatisticName, keyof NonNullable<PlacementStatistics['poissonFit']>>
>;

/** The fields that come from the placement's expectation (the codec's second argument), not from its statistics. */
export const EXPECTATION_FIELDS: ReadonlySet<StatisticName> = new Set<keyof ExpectationStatistics>([
  'expectedFrom',
  'baselineTotal',
  'zeroBaselineCells',
  'pointsInZeroBaselineCells',
  'areaChi2PerDf',
  'areaVerdict',
]);

/**
 * The statistics and expectation flattened for the codec and the rows: the Poisson fit as three nullable fields, the
 * area-only comparison NaN / null when absent (area mode). Cost O(1).
 */
export function flattenStatistics(stats: PlacementStatistics, expectation: ExpectationInput): EncodedStatistics {
  const { poissonFit, ...rest } = stats;
  return {
    ...rest,
    expectedFrom: expectation.expectedFrom,
    baselineTotal: expectation.baselineTotal,
    zeroBaselineCells: expectation.zeroBaselineCells,
    pointsInZeroBaselineCells: expectation.pointsInZeroBaselineCells,
    areaChi2PerDf: expectation.areaChi2PerDf ?? Number.NaN,
    areaVerdict: expectation.areaVerdict ?? null,
    poissonChi2: poissonFit ? poissonFit[POISSON_FIT_PARTS.poissonChi2] : null,
    poissonDf: poissonFit ? poissonFit[POISSON_FIT_PARTS.poissonDf] : null,
    poissonP: poissonFit ? poissonFit[POISSON_FIT_PARTS.poissonP] : null,
  };
}
