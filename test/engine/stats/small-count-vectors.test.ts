import { describe, expect, it } from 'vitest';
import { placementStatistics } from '../../../workers/stats/index.js';

const whole = (m: number) => new Float64Array(m).fill(1);
const statsOf = (counts: readonly number[]) => placementStatistics(Float64Array.from(counts), whole(counts.length), 0.05);

// shared/reference-values.md, "Small count vectors" (numpy/scipy), with the full-precision numpy values of the same
// formulas: [counts, VMR, X2, df, upper p, Morisita I, Ip (alpha .05), Green, NB k (null: not aggregated)]
// numpy: c.var(ddof=1)/c.mean(); ((c-c.mean())**2/c.mean()).sum(); chi2.sf(X2, m-1); m*(c*(c-1)).sum()/(N*(N-1))
const TABLE: ReadonlyArray<readonly [number[], number, number, number, number, number, number, number, number | null]> = [
  // printed: 1.25 | 5.0 (4), p 0.287297 | 1.111111 | 0.069996 | 0.027778 | 8
  [[0, 1, 2, 3, 4], 1.25, 5, 4, 0.2872974951836458, 1.1111111111111112, 0.06999578979083944, 0.027777777777777776, 8],
  // printed: 0 | 0 (4) | 0.555556 | -0.544163 | -0.111111 | undefined (not aggregated)
  [[2, 2, 2, 2, 2], 0, 0, 4, 1, 0.5555555555555556, -0.5441631644307927, -0.1111111111111111, null],
  // printed: 10 | 40 (4) | 5 | 1 | 1 | 0.222222; scipy: chi2.sf(40, 4) = 4.328422607120966e-08
  [[10, 0, 0, 0, 0], 10, 40, 4, 4.328422607120966e-8, 5, 1, 1, 0.2222222222222222],
  // printed: 2.421053 | 46.0 (19), p 0.000496 | 2.421053 | 0.518937 | 0.074792 | 0.703704
  [[0, 0, 1, 0, 3, 0, 0, 5, 1, 0, 0, 2, 0, 0, 0, 4, 0, 1, 0, 3], 2.4210526315789473, 46, 19, 0.0004956393839228825,
    2.4210526315789473, 0.5189367150576197, 0.07479224376731301, 0.7037037037037037],
];

const near = (actual: number, expected: number, tolerance = 1e-9) =>
  expect(Math.abs(actual - expected)).toBeLessThanOrEqual(tolerance * Math.max(1, Math.abs(expected)));

describe('small count vectors (hand-checkable, numpy/scipy)', () => {
  it.each(TABLE)('%j: every column', (counts, vmr, chi2, df, p, morisita, ip, green, k) => {
    const stats = statsOf(counts);
    near(stats.vmr, vmr);
    near(stats.chi2, chi2);
    expect(stats.df).toBe(df);
    near(stats.pClustered, p);
    near(stats.morisita, morisita);
    near(stats.morisitaStandardized, ip);
    near(stats.green, green);
    if (k === null) expect(stats.negativeBinomialK).toBeNull();
    else near(stats.negativeBinomialK!, k);
  });

  it('[10,0,0,0,0] and the 20-cell vector are clustered at 5 %; [2,2,2,2,2] is regular', () => {
    expect(statsOf([10, 0, 0, 0, 0]).verdict).toBe('clustered');
    expect(statsOf(TABLE[3]![0]).verdict).toBe('clustered');
    // scipy: chi2.cdf(0, 4) = 0 < 0.025
    expect(statsOf([2, 2, 2, 2, 2]).verdict).toBe('regular');
    expect(statsOf([0, 1, 2, 3, 4]).verdict).toBe('csr');
  });

  // Morisita (1959) identity: I * (N - 1) + m - N = X2 (shared/reference-values.md)
  it('satisfies the identity I*(N-1) + m - N = X2', () => {
    for (const [counts] of TABLE) {
      const stats = statsOf(counts);
      near(stats.morisita * (stats.points - 1) + stats.cells - stats.points, stats.chi2, 1e-12);
    }
  });

  // |Ip| > 0.5 exactly when the two-sided 5 % test rejects (Smith-Gill 1975, as in Krebs 1999, from memory)
  it('|Ip| > 0.5 exactly when the verdict departs from csr', () => {
    for (const [counts] of TABLE) {
      const stats = statsOf(counts);
      expect(Math.abs(stats.morisitaStandardized) > 0.5).toBe(stats.verdict !== 'csr');
    }
  });
});

// shared/reference-values.md, "Facts a test may assert" (derived): adding empty cells to
// [5,0,3,1,0,2,7,0,1,1] raises X2 by sum(x^2)/N = 90/20 = 4.5 each and VMR by (N^2 - sum x^2)/(N m (m-1)).
describe('counting empty cells by mistake (derived facts)', () => {
  const base = [5, 0, 3, 1, 0, 2, 7, 0, 1, 1];
  const printed: ReadonlyArray<readonly [number, number]> = [
    [2.777778, 25], [2.95, 29.5], [3.090909, 34], [3.208333, 38.5],
  ];
  it.each(printed.map((row, zeros) => [zeros, ...row] as const))('%i zeros added: VMR %d, X2 %d',
    (zeros, vmr, chi2) => {
      const counts = [...base, ...new Array<number>(zeros).fill(0)];
      const stats = statsOf(counts);
      expect(Math.abs(stats.vmr - vmr)).toBeLessThan(5e-7);
      near(stats.chi2, chi2, 1e-12);
      expect(stats.mean).toBeCloseTo(20 / counts.length, 14);
      const m = counts.length - 1; // cells before the last empty one
      if (zeros > 0) {
        const previous = statsOf(counts.slice(0, -1));
        near(stats.vmr - previous.vmr, (20 * 20 - 90) / (20 * m * (m - 1)), 1e-12);
        near(stats.chi2 - previous.chi2, 90 / 20, 1e-12);
      }
    });
});
