import { describe, expect, it } from 'vitest';
import { chiSquareLowerTail, chiSquareQuantile, chiSquareUpperTail } from '../../../workers/stats/index.js';

// NIST/SEMATECH e-Handbook of Statistical Methods (2012), section 1.3.6.7.4, "Critical values of the chi-square
// distribution": rows df, upper 5 %, upper 1 %, lower 5 %, lower 1 % (as listed in shared/reference-values.md).
const NIST_TABLE: ReadonlyArray<readonly [number, number, number, number, number]> = [
  [1, 3.84146, 6.6349, 0.00393, 0.00016],
  [5, 11.0705, 15.08627, 1.14548, 0.5543],
  [10, 18.30704, 23.20925, 3.9403, 2.55821],
  [20, 31.41043, 37.56623, 10.85081, 8.2604],
  [30, 43.77297, 50.89218, 18.49266, 14.95346],
  [50, 67.50481, 76.15389, 34.76425, 29.70668],
  [100, 124.34211, 135.80672, 77.92947, 70.06489],
];

// scipy: [(k, chi2.isf(0.05,k), chi2.isf(0.01,k), chi2.ppf(0.05,k), chi2.ppf(0.01,k)) for k in (1,5,10,20,30,50,100)]
const SCIPY_TABLE: ReadonlyArray<readonly [number, number, number, number, number]> = [
  [1, 3.8414588206941285, 6.634896601021217, 0.003932140000019522, 0.00015708785790970184],
  [5, 11.070497693516355, 15.086272469388991, 1.1454762260617692, 0.5542980767282772],
  [10, 18.30703805327515, 23.20925115895436, 3.9402991361190605, 2.5582121601872063],
  [20, 31.41043284423092, 37.566234786625046, 10.85081139418259, 8.2603983325464],
  [30, 43.77297182574217, 50.892181311517085, 18.49266098195347, 14.953456528455435],
  [50, 67.5048065495412, 76.1538912490127, 34.76425168350175, 29.706682698841284],
  [100, 124.34211340400408, 135.80672317102676, 77.92946516501726, 70.06489492539978],
];

describe('chiSquareQuantile(p, df)', () => {
  it.each(NIST_TABLE)('reproduces the NIST 1.3.6.7.4 row df=%i to 1e-4', (df, upper5, upper1, lower5, lower1) => {
    expect(Math.abs(chiSquareQuantile(0.95, df) - upper5)).toBeLessThan(1e-4);
    expect(Math.abs(chiSquareQuantile(0.99, df) - upper1)).toBeLessThan(1e-4);
    expect(Math.abs(chiSquareQuantile(0.05, df) - lower5)).toBeLessThan(1e-4);
    expect(Math.abs(chiSquareQuantile(0.01, df) - lower1)).toBeLessThan(1e-4);
  });

  it.each(SCIPY_TABLE)('matches scipy chi2.isf / chi2.ppf for df=%i to 1e-12 relative', (df, u5, u1, l5, l1) => {
    expect(chiSquareQuantile(0.95, df)).toBeCloseTo(u5, 10);
    expect(Math.abs(chiSquareQuantile(0.95, df) / u5 - 1)).toBeLessThan(1e-12);
    expect(Math.abs(chiSquareQuantile(0.99, df) / u1 - 1)).toBeLessThan(1e-12);
    expect(Math.abs(chiSquareQuantile(0.05, df) / l5 - 1)).toBeLessThan(1e-12);
    expect(Math.abs(chiSquareQuantile(0.01, df) / l1 - 1)).toBeLessThan(1e-12);
  });

  it('inverts its own tails (round trip) for large df and extreme p', () => {
    for (const df of [2, 7, 575, 10_000]) {
      for (const p of [1e-10, 0.025, 0.5, 0.975]) {
        const x = chiSquareQuantile(p, df);
        expect(Math.abs(chiSquareLowerTail(x, df) / p - 1)).toBeLessThan(1e-11);
      }
      const upper = chiSquareQuantile(1 - 1e-9, df);
      expect(Math.abs(chiSquareUpperTail(upper, df) / 1e-9 - 1)).toBeLessThan(1e-6);
    }
  });

  it('matches scipy in the far lower tail and at two million degrees of freedom', () => {
    // scipy 1.17.1: python3 -c "from scipy.stats import chi2; print(chi2.ppf(p, df))"
    const cases: Array<[number, number, number]> = [
      [1e-100, 99, 0.36976262587770314],
      [1e-100, 3, 5.2093970786779724e-67],
      [1e-30, 1, 1.570796326794893e-60],
      [0.005, 1, 3.9270422220515944e-5],
      [0.025, 2_000_000, 1996081.9666805877],
      [0.975, 2_000_000, 2003921.8219309007],
    ];
    for (const [p, df, expected] of cases) expect(Math.abs(chiSquareQuantile(p, df) / expected - 1)).toBeLessThan(1e-12);
  });

  it('gives 0 at p=0, Infinity at p=1 and NaN outside [0, 1]', () => {
    expect(chiSquareQuantile(0, 4)).toBe(0);
    // the df = 1 quantile of p = 1e-200 is about pi/2 x 1e-400, below the smallest double
    expect(chiSquareQuantile(1e-200, 1)).toBe(0);
    expect(chiSquareQuantile(1, 4)).toBe(Number.POSITIVE_INFINITY);
    expect(chiSquareQuantile(1.5, 4)).toBeNaN();
    expect(chiSquareQuantile(0.5, 0)).toBeNaN();
  });
});

// scipy: [chi2.sf(x, k) for x, k in ((1,1), (18.307,10), (10,5), (25,10), (50,30), (150,100), (575,575), (600,575))]
// (shared/reference-values.md prints them to 6 significant digits: 0.317311, 0.0500006, 0.0752352, 0.00534551,
// 0.0124021, 0.000903932, 0.492157, 0.227719)
const SCIPY_SF: ReadonlyArray<readonly [number, number, number, number]> = [
  [1, 1, 0.31731050786291115, 0.317311],
  [18.307, 10, 0.05000058909139812, 0.0500006],
  [10, 5, 0.07523524614651217, 0.0752352],
  [25, 10, 0.005345505487134069, 0.00534551],
  [50, 30, 0.01240206071890054, 0.0124021],
  [150, 100, 0.0009039320423540184, 0.000903932],
  [575, 575, 0.49215707226398914, 0.492157],
  [600, 575, 0.2277192681731091, 0.227719],
];

describe('chiSquareUpperTail(x, df)', () => {
  it.each(SCIPY_SF)('sf(%d, %i) matches scipy to 1e-9 relative and the printed 6 digits', (x, df, sf, printed) => {
    expect(Math.abs(chiSquareUpperTail(x, df) / sf - 1)).toBeLessThan(1e-9);
    // half a unit in the sixth significant digit of the printed value
    const halfUnit = 0.5 * 10 ** (Math.floor(Math.log10(printed)) - 5);
    expect(Math.abs(chiSquareUpperTail(x, df) - printed)).toBeLessThanOrEqual(halfUnit);
    expect(Math.abs(chiSquareUpperTail(x, df) + chiSquareLowerTail(x, df) - 1)).toBeLessThan(1e-14);
  });

  // scipy: chi2.sf(1200, 100) = 6.390680383682146e-188; chi2.sf(1700, 100) = 4.294041177945265e-289
  it('keeps relative accuracy in the far tail (scipy)', () => {
    expect(Math.abs(chiSquareUpperTail(1200, 100) / 6.390680383682146e-188 - 1)).toBeLessThan(1e-9);
    expect(Math.abs(chiSquareUpperTail(1700, 100) / 4.294041177945265e-289 - 1)).toBeLessThan(1e-9);
  });

  // Independent check: for even df = 2n, P(chi2_2n >= x) = P(Poisson(x/2) <= n - 1)
  // = exp(-x/2) * sum_{k<n} (x/2)^k / k!, a finite sum (e.g. M. Abramowitz and I. A. Stegun (1964), Handbook of
  // Mathematical Functions, 26.4.21), evaluated here in log space with a log-sum-exp.
  function evenDfUpperTailLog(x: number, df: number): number {
    const half = x / 2;
    const terms: number[] = [];
    let logTerm = -half;
    for (let k = 0; k < df / 2; k++) {
      if (k > 0) logTerm += Math.log(half) - Math.log(k);
      terms.push(logTerm);
    }
    const largest = Math.max(...terms);
    return largest + Math.log(terms.reduce((sum, t) => sum + Math.exp(t - largest), 0));
  }

  it('matches the exact Poisson-sum form for even df down to about 1e-300', () => {
    for (const [x, df] of [[300, 100], [800, 100], [1200, 100], [1600, 100], [1750, 100], [1400, 2], [60, 4]]) {
      const p = chiSquareUpperTail(x!, df!);
      expect(p).toBeGreaterThan(0);
      expect(Math.abs(Math.log(p) - evenDfUpperTailLog(x!, df!))).toBeLessThan(1e-10);
    }
  });

  // P(chi2_100 >= 2000) = exp(-1000) * sum_{k<50} 1000^k / k!, about 1e-350: below the smallest double
  // (Number.MIN_VALUE, about 4.9e-324), so the honest floating-point answer is 0, never NaN or negative.
  it('underflows to exactly 0 only below the double range (x = 2000, df = 100)', () => {
    expect(evenDfUpperTailLog(2000, 100)).toBeLessThan(Math.log(Number.MIN_VALUE));
    expect(chiSquareUpperTail(2000, 100)).toBe(0);
    expect(chiSquareLowerTail(2000, 100)).toBe(1);
  });

  it('log p is finite, positive p and strictly decreasing from 1e-3 down to 1e-300 (df 100)', () => {
    let previous = Number.POSITIVE_INFINITY;
    for (let x = 150; x <= 1780; x += 10) {
      const p = chiSquareUpperTail(x, 100);
      expect(p).toBeGreaterThan(0);
      expect(Number.isFinite(Math.log(p))).toBe(true);
      expect(Math.log(p)).toBeLessThan(previous);
      previous = Math.log(p);
    }
    expect(previous).toBeLessThan(Math.log(1e-295));
  });

  it('is 1 at x <= 0 and NaN for df <= 0', () => {
    expect(chiSquareUpperTail(0, 3)).toBe(1);
    expect(chiSquareLowerTail(-1, 3)).toBe(0);
    expect(chiSquareUpperTail(2, 0)).toBeNaN();
  });
});
