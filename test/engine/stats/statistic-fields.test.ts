import { describe, expect, it } from 'vitest';
import { flattenStatistics, STATISTIC_FIELDS, STATISTIC_NAMES } from '../../../workers/stats/statistic-fields.js';
import { decodeStatistics, encodeStatistics, type ExpectationInput, STATISTICS_FIELDS } from '../../../workers/sweep/statistics-codec.js';
import { PLACEMENT_CSV_COLUMNS } from '../../../server/sweeps/placements-csv.js';
import type { PlacementStatistics } from '../../../workers/types.js';

const stats = (overrides: Partial<PlacementStatistics>): PlacementStatistics => ({
  cells: 12, points: 30, mean: 2.5, variance: 4.1, vmr: 1.64, chi2: 18.04, df: 11, chi2PerDf: 1.64,
  pClustered: 0.081, pRegular: 0.919, verdict: 'clustered', expectedPerCell: 2.5, meetsRuleOf5: false,
  meetsRuleOf1_6: true, morisita: 1.26, morisitaStandardized: 0.51, meanCrowding: 3.14, patchiness: 1.26,
  green: 0.022, negativeBinomialK: 3.9, poissonFit: { chi2: 1.2, df: 1, p: 0.27, classes: [] },
  ...overrides,
});

describe('the statistic field list', () => {
  it('gives the codec one slot per field and round-trips every kind (null as NaN, booleans, verdict codes)', () => {
    expect(STATISTICS_FIELDS).toBe(STATISTIC_NAMES.length);
    const area: ExpectationInput = { expectedFrom: 'area', baselineTotal: 1.2e6, zeroBaselineCells: 0, pointsInZeroBaselineCells: 0 };
    const baseline: ExpectationInput = { expectedFrom: 'baseline', baselineTotal: 3645, zeroBaselineCells: 2, pointsInZeroBaselineCells: 5, areaChi2PerDf: 2.5, areaVerdict: 'clustered' };
    const controls: ExpectationInput = { expectedFrom: 'controls', baselineTotal: 80, zeroBaselineCells: 1, pointsInZeroBaselineCells: 0, areaChi2PerDf: 0.4, areaVerdict: 'regular' };
    for (const input of [stats({}), stats({ verdict: 'regular', meetsRuleOf5: true, negativeBinomialK: null, poissonFit: null })]) {
      for (const expectation of [area, baseline, controls]) {
        const out = new Float64Array(STATISTICS_FIELDS + 3);
        encodeStatistics(input, expectation, out, 3);
        expect(decodeStatistics(out, 3)).toEqual(flattenStatistics(input, expectation));
      }
    }
    // area mode: no area-only comparison (NaN, null)
    const out = new Float64Array(STATISTICS_FIELDS);
    encodeStatistics(stats({}), area, out, 0);
    expect(decodeStatistics(out, 0)).toMatchObject({ expectedFrom: 'area', areaVerdict: null, areaChi2PerDf: Number.NaN });
  });

  it('names a placements.csv column for every field with one, in the same order after the placement parameters', () => {
    const withColumn = STATISTIC_NAMES.filter((name) => STATISTIC_FIELDS[name].csv !== null);
    // the area-only comparison against a baseline is in the JSON files only
    expect(STATISTIC_NAMES.filter((name) => STATISTIC_FIELDS[name].csv === null)).toEqual(['areaChi2PerDf', 'areaVerdict']);
    const statisticColumns = PLACEMENT_CSV_COLUMNS.slice(PLACEMENT_CSV_COLUMNS.length - withColumn.length);
    expect(statisticColumns.map((column) => column.field)).toEqual(withColumn);
    expect(statisticColumns.map((column) => column.name)).toEqual(withColumn.map((name) => STATISTIC_FIELDS[name].csv));
    expect(PLACEMENT_CSV_COLUMNS.slice(-4).map((column) => column.name)).toEqual(['expected_from', 'baseline_total', 'zero_baseline_cells', 'points_in_zero_baseline_cells']);
  });
});
