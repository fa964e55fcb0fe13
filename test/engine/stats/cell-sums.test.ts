/**
 * The one-pass sums of placementStatistics against the direct two-pass definitions: the sample variance
 * (Bessel's correction) and Pearson's area-weighted chi-square sum (O - E)^2 / E, on random counts and coverages.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { cellSums, chiSquareFromSums, dispersionChiSquare, sampleVariance, varianceFromSums } from '../../../workers/stats/index.js';

const cellsArbitrary = fc.array(
  fc.record({ count: fc.integer({ min: 0, max: 60 }), coverage: fc.double({ min: 0.01, max: 1, noNaN: true }) }),
  { minLength: 2, maxLength: 300 },
);

/** Pearson (1900) written out: E_c = N a_c / sum(a), sum (O_c - E_c)^2 / E_c, two passes, no identity used. */
function pearsonDirect(counts: number[], coverage: number[]): number {
  const points = counts.reduce((a, b) => a + b, 0);
  const area = coverage.reduce((a, b) => a + b, 0);
  return counts.reduce((sum, observed, c) => {
    const expected = (points * coverage[c]!) / area;
    return sum + (observed - expected) ** 2 / expected;
  }, 0);
}

describe('cellSums', () => {
  it('gives the sums of a hand-worked case: counts [3, 0, 5], coverages [1, 0.5, 0.25]', () => {
    // N = 8, sum x^2 = 34, sum a = 1.75, sum x^2 / a = 9 + 0 + 100 = 109, largest 5
    const sums = cellSums([3, 0, 5], [1, 0.5, 0.25]);
    expect(sums).toEqual({ cells: 3, points: 8, sumOfSquares: 34, coverageSum: 1.75, weightedSquares: 109, largestCount: 5, firstInvalid: -1 });
    // by hand: E = 8 a / 1.75 = [32/7, 16/7, 8/7]; sum (O-E)^2/E = 121/224 + 16/7 + 729/56 = 3549/224
    expect(chiSquareFromSums(sums)).toBeCloseTo(3549 / 224, 12);
    // observed and simulated patterns are scored with bitwise the same arithmetic
    expect(chiSquareFromSums(sums)).toBe(dispersionChiSquare([3, 0, 5], [1, 0.5, 0.25]).chi2);
  });

  it('names the first cell that is not a non-negative integer count with coverage in (0, 1]', () => {
    expect(cellSums([1, 2.5, -1], [1, 1, 1]).firstInvalid).toBe(1);
    expect(cellSums([1, 2, 3], [1, 0, 1]).firstInvalid).toBe(1);
    expect(cellSums([1, 2, Number.NaN], [1, 1, 1]).firstInvalid).toBe(2);
    expect(cellSums([1, 2, 3], [1, 1, 1.5]).firstInvalid).toBe(2);
  });

  it('variance and chi-square (from the sums and from dispersionChiSquare) equal the two-pass definitions (fast-check, 500 cases)', () => {
    fc.assert(
      fc.property(cellsArbitrary, (cells) => {
        const counts = cells.map((cell) => cell.count);
        const coverage = cells.map((cell) => cell.coverage);
        const sums = cellSums(counts, coverage);
        const direct = sampleVariance(counts);
        expect(Math.abs(varianceFromSums(sums) - direct)).toBeLessThanOrEqual(1e-9 * Math.max(1, direct));
        const points = counts.reduce((a, b) => a + b, 0);
        if (points === 0) {
          expect(chiSquareFromSums(sums)).toBeNaN();
          return;
        }
        const chi2 = pearsonDirect(counts, coverage);
        expect(Math.abs(chiSquareFromSums(sums) - chi2)).toBeLessThanOrEqual(1e-9 * Math.max(1, chi2));
        expect(Math.abs(dispersionChiSquare(counts, coverage).chi2 - chi2)).toBeLessThanOrEqual(1e-9 * Math.max(1, chi2));
      }),
      { numRuns: 500, seed: 20261201 },
    );
  });
});
