import { describe, expect, it } from 'vitest';
import { dispersionChiSquare, placementStatistics } from '../../../workers/stats/index.js';

describe('placementStatistics(counts, coverage, alpha)', () => {
  it('throws a RangeError with a clear message for fewer than 2 cells or mismatched arrays', () => {
    expect(() => placementStatistics([3], [1], 0.05)).toThrow(RangeError);
    expect(() => placementStatistics([3], [1], 0.05)).toThrow('requires at least 2 kept cells, got 1');
    expect(() => placementStatistics([3, 1], [1], 0.05)).toThrow('2 counts, 1 coverages');
    expect(() => placementStatistics([3, 1], [1, 1], 0)).toThrow('alpha in (0, 1)');
    expect(() => placementStatistics([3, 1.5], [1, 1], 0.05)).toThrow('cell 1 holds 1.5');
    expect(() => placementStatistics([3, -1], [1, 1], 0.05)).toThrow('cell 1 holds -1');
    expect(() => placementStatistics([3, 1], [0, 1], 0.05)).toThrow('cell 0 has 0');
    expect(() => placementStatistics([3, 1], [1, Number.NaN], 0.05)).toThrow('cell 1 has NaN');
  });

  it('with N = 0: ratio statistics NaN (undefined), verdict csr, no NB k, no Poisson fit', () => {
    const stats = placementStatistics([0, 0, 0, 0], [1, 1, 1, 0.5], 0.05);
    expect(stats.points).toBe(0);
    expect(stats.mean).toBe(0);
    expect(stats.variance).toBe(0);
    for (const value of [stats.vmr, stats.chi2, stats.pClustered, stats.pRegular, stats.morisita,
      stats.morisitaStandardized, stats.meanCrowding, stats.patchiness, stats.green]) expect(value).toBeNaN();
    expect(stats.verdict).toBe('csr');
    expect(stats.negativeBinomialK).toBeNull();
    expect(stats.poissonFit).toBeNull();
    expect(stats.expectedPerCell).toBe(0);
    expect(stats.meetsRuleOf1_6).toBe(false);
  });

  it('with N = 1: Morisita, Ip and Green undefined, the chi-square still defined', () => {
    const stats = placementStatistics([1, 0, 0], [1, 1, 1], 0.05);
    expect(stats.morisita).toBeNaN();
    expect(stats.morisitaStandardized).toBeNaN();
    expect(stats.green).toBeNaN();
    // whole cells: X2 = (m - 1) * vmr = 2 * (1/3) / (1/3) = 2
    expect(stats.chi2).toBeCloseTo(2, 14);
  });

  // hand computation (see dispersion.test.ts): counts [3,1,4,0], coverage [1, 1/2, 1, 1/4] -> X2 = 451/352;
  // expected per whole cell 8 / 2.75; raw-count mean 2 and sample variance 10/3
  it('uses the area-weighted chi-square, raw-count moments and N / sum(coverage)', () => {
    const stats = placementStatistics([3, 1, 4, 0], [1, 0.5, 1, 0.25], 0.05);
    expect(stats.chi2).toBeCloseTo(451 / 352, 14);
    expect(stats.chi2PerDf).toBeCloseTo(451 / 352 / 3, 14);
    expect(stats.mean).toBe(2);
    expect(stats.variance).toBeCloseTo(10 / 3, 14);
    expect(stats.expectedPerCell).toBeCloseTo(8 / 2.75, 14);
    expect(stats.meetsRuleOf5).toBe(false);
    expect(stats.meetsRuleOf1_6).toBe(true);
    expect(stats.chi2).toBe(dispersionChiSquare([3, 1, 4, 0], [1, 0.5, 1, 0.25]).chi2);
  });

  it('uses alpha for the verdict: chi2 = 25 on 9 df (scipy: chi2.sf(25, 9) = 0.002971180485917624)', () => {
    const counts = [5, 0, 3, 1, 0, 2, 7, 0, 1, 1];
    const whole = new Array<number>(10).fill(1);
    expect(placementStatistics(counts, whole, 0.01).verdict).toBe('clustered');
    expect(placementStatistics(counts, whole, 0.005).verdict).toBe('csr');
    expect(placementStatistics(counts, whole, 0.01).pClustered).toBeCloseTo(0.002971180485917624, 14);
  });
});
