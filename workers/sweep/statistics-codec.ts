/**
 * Compact encoding of one placement's statistics as a fixed run of float64 values, so that a chunk of
 * placements travels from a worker as one Float64Array (moved, not cloned). null and booleans are encoded as
 * NaN and 0/1; the verdict as 0 (csr), 1 (clustered), 2 (regular).
 */
import type { PlacementStatistics, Verdict } from '../types.js';
import type { ExpectedFrom } from '../baseline/baseline.js';

/** The statistics of a placement row without its placement parameters (server/contracts.ts PlacementRow). */
export interface EncodedStatistics extends Omit<PlacementStatistics, 'poissonFit'> {
  poissonChi2: number | null;
  poissonDf: number | null;
  poissonP: number | null;
  /** what the expected counts are proportional to, and its totals (workers/placement Expectation) */
  expectedFrom: ExpectedFrom;
  baselineTotal: number;
  zeroBaselineCells: number;
  pointsInZeroBaselineCells: number;
  /** with a baseline: the area-only chi2/df and verdict of the same placement (NaN / null in area mode) */
  areaChi2PerDf: number;
  areaVerdict: Verdict | null;
}

/** The expectation part of a placement's result (workers/placement Expectation without the weights). */
export interface EncodedExpectation {
  expectedFrom: ExpectedFrom;
  baselineTotal: number;
  zeroBaselineCells: number;
  pointsInZeroBaselineCells: number;
  areaChi2PerDf?: number;
  areaVerdict?: Verdict;
}

export const STATISTICS_FIELDS = 29;

const VERDICTS: readonly Verdict[] = ['csr', 'clustered', 'regular'];
const EXPECTED_FROM: readonly ExpectedFrom[] = ['area', 'baseline', 'controls'];

const orNaN = (value: number | null): number => (value === null ? Number.NaN : value);
const orNull = (value: number): number | null => (Number.isNaN(value) ? null : value);

/** Writes the statistics and the expectation at out[offset .. offset + STATISTICS_FIELDS). Cost O(1). */
export function encodeStatistics(stats: PlacementStatistics, out: Float64Array, offset: number, expectation?: EncodedExpectation): void {
  out[offset + 23] = EXPECTED_FROM.indexOf(expectation?.expectedFrom ?? 'area');
  out[offset + 24] = expectation?.baselineTotal ?? Number.NaN;
  out[offset + 25] = expectation?.zeroBaselineCells ?? 0;
  out[offset + 26] = expectation?.pointsInZeroBaselineCells ?? 0;
  out[offset + 27] = expectation?.areaChi2PerDf ?? Number.NaN;
  out[offset + 28] = expectation?.areaVerdict === undefined ? -1 : VERDICTS.indexOf(expectation.areaVerdict);
  out[offset] = stats.cells;
  out[offset + 1] = stats.points;
  out[offset + 2] = stats.mean;
  out[offset + 3] = stats.variance;
  out[offset + 4] = stats.vmr;
  out[offset + 5] = stats.chi2;
  out[offset + 6] = stats.df;
  out[offset + 7] = stats.chi2PerDf;
  out[offset + 8] = stats.pClustered;
  out[offset + 9] = stats.pRegular;
  out[offset + 10] = VERDICTS.indexOf(stats.verdict);
  out[offset + 11] = stats.expectedPerCell;
  out[offset + 12] = stats.meetsRuleOf5 ? 1 : 0;
  out[offset + 13] = stats.meetsRuleOf1_6 ? 1 : 0;
  out[offset + 14] = stats.morisita;
  out[offset + 15] = stats.morisitaStandardized;
  out[offset + 16] = stats.meanCrowding;
  out[offset + 17] = stats.patchiness;
  out[offset + 18] = stats.green;
  out[offset + 19] = orNaN(stats.negativeBinomialK);
  out[offset + 20] = stats.poissonFit ? stats.poissonFit.chi2 : Number.NaN;
  out[offset + 21] = stats.poissonFit ? stats.poissonFit.df : Number.NaN;
  out[offset + 22] = stats.poissonFit ? stats.poissonFit.p : Number.NaN;
}

/** Reads back what encodeStatistics wrote. Cost O(1). */
export function decodeStatistics(data: Float64Array, offset: number): EncodedStatistics {
  return {
    cells: data[offset],
    points: data[offset + 1],
    mean: data[offset + 2],
    variance: data[offset + 3],
    vmr: data[offset + 4],
    chi2: data[offset + 5],
    df: data[offset + 6],
    chi2PerDf: data[offset + 7],
    pClustered: data[offset + 8],
    pRegular: data[offset + 9],
    verdict: VERDICTS[data[offset + 10]] ?? 'csr',
    expectedPerCell: data[offset + 11],
    meetsRuleOf5: data[offset + 12] === 1,
    meetsRuleOf1_6: data[offset + 13] === 1,
    morisita: data[offset + 14],
    morisitaStandardized: data[offset + 15],
    meanCrowding: data[offset + 16],
    patchiness: data[offset + 17],
    green: data[offset + 18],
    negativeBinomialK: orNull(data[offset + 19]),
    poissonChi2: orNull(data[offset + 20]),
    poissonDf: orNull(data[offset + 21]),
    poissonP: orNull(data[offset + 22]),
    expectedFrom: EXPECTED_FROM[data[offset + 23]] ?? 'area',
    baselineTotal: data[offset + 24],
    zeroBaselineCells: data[offset + 25],
    pointsInZeroBaselineCells: data[offset + 26],
    areaChi2PerDf: data[offset + 27],
    areaVerdict: VERDICTS[data[offset + 28]] ?? null,
  };
}
