import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  cellSizeForExpected, criticalValues, dispersionChiSquare, dispersionVerdict, expectedPointsPerCell,
  gatheredDispersionChiSquare, isSignificant, varianceToMeanRatio, verdictByCriticalValues,
} from '../../../workers/stats/index.js';

describe('dispersionChiSquare(counts, coverage)', () => {
  // Hand computation in exact fractions: counts [3,1,4,0], coverage [1, 1/2, 1, 1/4], N = 8, sum(a) = 11/4,
  // E = 8 a / (11/4) = [32/11, 16/11, 32/11, 8/11];
  // X2 = (1/11)^2/(32/11) + (5/11)^2/(16/11) + (12/11)^2/(32/11) + (8/11)^2/(8/11)
  //    = 1/352 + 25/176 + 144/352 + 8/11 = (1 + 50 + 144 + 256)/352 = 451/352
  it('weights expected counts by coverage (hand computation, 451/352)', () => {
    const result = dispersionChiSquare(Float64Array.of(3, 1, 4, 0), Float64Array.of(1, 0.5, 1, 0.25));
    expect(result.chi2).toBeCloseTo(451 / 352, 14);
    expect(result.df).toBe(3);
    expect(result.points).toBe(8);
  });

  // numpy: c = 30 whole cells + 10 half cells (counts below); E = N*a/sum(a); ((c-E)**2/E).sum() = 44.3921568627451
  it('matches numpy on a mixed whole/half-cell placement', () => {
    const counts = [0, 1, 2, 3, 1, 0, 2, 1, 1, 4, 0, 2, 1, 3, 0, 1, 2, 1, 0, 5, 1, 2, 0, 1, 3, 1, 2, 0, 1, 2,
      0, 1, 0, 2, 1, 0, 0, 1, 3, 0];
    const coverage = counts.map((_, c) => (c < 30 ? 1 : 0.5));
    expect(dispersionChiSquare(counts, coverage).chi2).toBeCloseTo(44.3921568627451, 11);
  });

  it('is unchanged when every coverage is scaled by the same factor', () => {
    const counts = [4, 0, 2, 7, 1];
    const a = dispersionChiSquare(counts, [1, 0.5, 0.8, 1, 0.3]).chi2;
    const b = dispersionChiSquare(counts, [0.5, 0.25, 0.4, 0.5, 0.15]).chi2;
    expect(b).toBeCloseTo(a, 12);
  });

  it('is NaN (undefined) with no points', () => {
    expect(dispersionChiSquare([0, 0, 0], [1, 1, 1]).chi2).toBeNaN();
  });

  // Fisher, Thornton and Mackenzie (1922): with whole cells the index of dispersion is (m - 1) * vmr
  it('equals (m - 1) * vmr when all coverages are 1 (property)', () => {
    fc.assert(
      fc.property(fc.array(fc.nat({ max: 60 }), { minLength: 2, maxLength: 300 }), (list) => {
        fc.pre(list.some((x) => x > 0));
        const counts = Float64Array.from(list);
        const { chi2, df } = dispersionChiSquare(counts, new Float64Array(list.length).fill(1));
        const expected = (list.length - 1) * varianceToMeanRatio(counts);
        return df === list.length - 1 && Math.abs(chi2 - expected) <= 1e-9 * Math.max(1, expected);
      }),
      { seed: 20240611, numRuns: 500 },
    );
  });
});

describe('gatheredDispersionChiSquare(gridCounts, keptIndex, coverage)', () => {
  it('gives the hand computation 451/352 from counts still in grid order (kept cells 1, 2, 4, 6 of 7)', () => {
    // the kept counts [3, 1, 4, 0] and coverages [1, 1/2, 1, 1/4] of the hand computation above, among left-out cells
    const grid = Float64Array.of(9, 3, 1, 8, 4, 7, 0);
    const result = gatheredDispersionChiSquare(grid, Int32Array.of(1, 2, 4, 6), Float64Array.of(1, 0.5, 1, 0.25));
    expect(result.chi2).toBeCloseTo(451 / 352, 14);
    expect([result.df, result.points]).toEqual([3, 8]);
    expect(Array.from(grid.subarray(0, 4))).toEqual([3, 1, 4, 0]);
  });

  it('gives dispersionChiSquare of the gathered counts to the last bit and leaves them over the start of the grid (property)', () => {
    fc.assert(
      fc.property(
        fc.array(fc.record({ count: fc.nat(40), kept: fc.boolean(), whole: fc.boolean(), share: fc.double({ min: 1e-6, max: 1, noNaN: true }) }), { minLength: 2, maxLength: 300 }),
        (cells) => {
          const grid = Float64Array.from(cells, (cell) => cell.count);
          const keptIndex = Int32Array.from(cells.flatMap((cell, k) => (cell.kept ? [k] : [])));
          const coverage = Float64Array.from(keptIndex, (k) => (cells[k]!.whole ? 1 : cells[k]!.share));
          const gathered = Float64Array.from(keptIndex, (k) => grid[k]!);
          const expected = dispersionChiSquare(gathered, coverage);
          const result = gatheredDispersionChiSquare(grid, keptIndex, coverage);
          expect(Object.is(result.chi2, expected.chi2)).toBe(true);
          expect([result.df, result.points]).toEqual([expected.df, expected.points]);
          expect(Array.from(grid.subarray(0, keptIndex.length))).toEqual(Array.from(gathered));
          // the same pass lists the extreme cells: counts >= from or <= to, or coverage not 1
          const again = Float64Array.from(cells, (cell) => cell.count);
          const extremes = { from: 7, to: 1, cells: new Int32Array(keptIndex.length), count: 0 };
          const listed = gatheredDispersionChiSquare(again, keptIndex, coverage, extremes);
          expect(Object.is(listed.chi2, expected.chi2)).toBe(true);
          const wanted = [...gathered.keys()].filter((c) => gathered[c]! >= 7 || gathered[c]! <= 1 || coverage[c] !== 1);
          expect(Array.from(extremes.cells.subarray(0, extremes.count))).toEqual(wanted);
        },
      ),
      { numRuns: 300 },
    );
  });
});

describe('isSignificant and verdictByCriticalValues agree with dispersionVerdict', () => {
  it('on random (chi2, df, alpha) (property)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 3000 }), fc.double({ min: 0, max: 3, noNaN: true }),
        fc.constantFrom(0.001, 0.01, 0.05, 0.1, 0.2), (df, ratio, alpha) => {
          const chi2 = ratio * df;
          const { verdict } = dispersionVerdict(chi2, df, alpha);
          return verdictByCriticalValues(chi2, df, alpha) === verdict
            && isSignificant(chi2, df, alpha) === (verdict !== 'csr');
        }),
      { seed: 7, numRuns: 3000 },
    );
  });

  it('just inside and just outside both critical values', () => {
    for (const df of [1, 4, 19, 575]) {
      const { lower, upper } = criticalValues(df, 0.05);
      for (const chi2 of [lower * (1 - 1e-7), lower * (1 + 1e-7), upper * (1 - 1e-7), upper * (1 + 1e-7)]) {
        expect(verdictByCriticalValues(chi2, df, 0.05)).toBe(dispersionVerdict(chi2, df, 0.05).verdict);
      }
    }
  });

  // NIST e-Handbook 1.3.6.7.4 / scipy: chi2.ppf(0.025, 10) = 3.2469727802368413, chi2.isf(0.025, 10) = 20.483177350807388
  it('caches the two-sided critical values per (df, alpha)', () => {
    const values = criticalValues(10, 0.05);
    expect(values.lower).toBeCloseTo(3.2469727802368413, 12);
    expect(values.upper).toBeCloseTo(20.483177350807388, 12);
    expect(criticalValues(10, 0.05)).toBe(values);
  });

  it('gives csr and NaN p-values for a NaN chi2 (no points)', () => {
    const result = dispersionVerdict(Number.NaN, 4, 0.05);
    expect(result.verdict).toBe('csr');
    expect(result.pClustered).toBeNaN();
    expect(isSignificant(Number.NaN, 4, 0.05)).toBe(false);
  });
});

describe('expected points per cell and cell size (rules of thumb, common practice)', () => {
  it('expected per whole cell = N / sum(coverage)', () => {
    expect(expectedPointsPerCell(8, [1, 0.5, 1, 0.25])).toBeCloseTo(8 / 2.75, 14);
  });

  // side = sqrt(k A / n): 5 expected points per cell, 1 km^2 valid area, 500 points -> sqrt(10000) = 100 m
  it('cellSizeForExpected(k, validArea, n) = sqrt(k * validArea / n)', () => {
    expect(cellSizeForExpected(5, 1e6, 500)).toBeCloseTo(100, 12);
    expect(cellSizeForExpected(1.6, 144e6, 537)).toBeCloseTo(Math.sqrt((1.6 * 144e6) / 537), 9);
    expect(cellSizeForExpected(5, 1e6, 0)).toBeNaN();
  });
});
