import { describe, expect, it } from 'vitest';
import { flattenStatistics, STATISTIC_FIELDS, STATISTIC_NAMES } from '../../../workers/stats/statistic-fields.js';
import { decodeStatistics, encodeStatistics, STATISTICS_FIELDS } from '../../../workers/sweep/statistics-codec.js';
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
    for (const input of [stats({}), stats({ verdict: 'regular', meetsRuleOf5: true, negativeBinomialK: null, poissonFit: null })]) {
      const out = new Float64Array(STATISTICS_FIELDS + 3);
      encodeStatistics(input, out, 3);
      expect(decodeStatistics(out, 3)).toEqual(flattenStatistics(input));
    }
  });

  it('names a placements.csv column for every field, in the same order after the placement parameters', () => {
    const statisticColumns = PLACEMENT_CSV_COLUMNS.slice(PLACEMENT_CSV_COLUMNS.length - STATISTIC_NAMES.length);
    expect(statisticColumns.map((column) => column.field)).toEqual(STATISTIC_NAMES);
    expect(statisticColumns.map((column) => column.name)).toEqual(STATISTIC_NAMES.map((name) => STATISTIC_FIELDS[name].csv));
  });
});
