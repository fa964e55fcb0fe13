/**
 * The per-placement tests of the stability surface against general-purpose reference libraries: exact Poisson tails
 * against scipy.stats.poisson (scipy 1.17.1: poisson.sf(k - 1, lam) for P(X >= k), poisson.cdf(k, lam) for
 * P(X <= k)), Benjamini-Hochberg against scipy.stats.false_discovery_control(p, method='bh') (adjusted p <= alpha),
 * and the critical counts against the tails themselves.
 */
import { describe, expect, it } from 'vitest';
import { seededRandom } from '../fixtures/seeded-random.js';
import { poissonLowerTail, poissonUpperTail } from '../../workers/stats/poisson-tails.js';
import { benjaminiHochberg } from '../../workers/stability/benjamini-hochberg.js';
import { createCellFlagScratch, criticalLower, criticalUpper, flagCells, summarizeWeights } from '../../workers/stability/cell-flags.js';
import { gatheredDispersionChiSquare, type ExtremeCells } from '../../workers/stats/dispersion-chi-square.js';

// [k, lambda, scipy poisson.sf(k - 1, lam), scipy poisson.cdf(k, lam)]
const POISSON: [number, number, number, number][] = [
  [0, 3.0, 1.0, 0.04978706836786395],
  [1, 0.2, 0.18126924692201815, 0.9824769036935782],
  [5, 1.5, 0.018575936222140675, 0.9955440192247521],
  [12, 4.0, 0.0009152291472700608, 0.9997262831771445],
  [30, 12.5, 1.8774147181836048e-05, 0.9999925748971255],
  [150, 100.0, 1.8842104660386844e-06, 0.9999987669055809],
  [2, 9.0, 0.9987659019591332, 0.006232195106377317],
  [60, 100.0, 0.9999936584965726, 1.0812218170244006e-05],
  [1000, 1100.0, 0.9989406767460701, 0.001175230568136558],
];

describe('exact Poisson tails (scipy.stats.poisson)', () => {
  it.each(POISSON)('k = %d, lambda = %d', (k, lambda, upper, lower) => {
    expect(Math.abs(poissonUpperTail(k, lambda) - upper) / upper).toBeLessThan(1e-12);
    expect(Math.abs(poissonLowerTail(k, lambda) - lower) / lower).toBeLessThan(1e-12);
  });
});

describe('Benjamini-Hochberg (Benjamini & Hochberg 1995)', () => {
  it('rejects what scipy.stats.false_discovery_control(p, method="bh") adjusts to <= alpha', () => {
    // adjusted: [0.032, 0.064, 0.06, 0.032, 0.2667, 0.5714, 0.032, 0.9]
    const p = Float64Array.from([0.01, 0.04, 0.03, 0.005, 0.2, 0.5, 0.012, 0.9]);
    const reject = new Uint8Array(8);
    expect(benjaminiHochberg(p, 8, 0.05, reject)).toBe(3);
    expect(Array.from(reject)).toEqual([1, 0, 0, 1, 0, 0, 1, 0]);
    // at 0.07 the adjusted 0.064 and 0.06 pass too
    expect(benjaminiHochberg(p, 8, 0.07, reject)).toBe(5);
    expect(Array.from(reject)).toEqual([1, 1, 1, 1, 0, 0, 1, 0]);
  });

  it('given only the p-values below alpha and the family size, the same rejections as over the whole family', () => {
    // the scipy example above without its p-values above alpha (0.2, 0.5, 0.9), family size 8
    const p = Float64Array.from([0.01, 0.04, 0.03, 0.005, 0.012]);
    const reject = new Uint8Array(5);
    expect(benjaminiHochberg(p, 5, 0.05, reject, undefined, 8)).toBe(3);
    expect(Array.from(reject)).toEqual([1, 0, 0, 1, 1]);
  });

  it('the step-up rejects every p-value when the largest is below alpha', () => {
    const p = Float64Array.from([0.04, 0.045, 0.049]);
    const reject = new Uint8Array(3);
    expect(benjaminiHochberg(p, 3, 0.05, reject)).toBe(3);
  });

  it('rejects nothing when no p-value is below its threshold', () => {
    const p = Float64Array.from([0.02, 0.3, 0.4, 0.5]);
    const reject = new Uint8Array(4);
    expect(benjaminiHochberg(p, 4, 0.05, reject)).toBe(0); // 0.02 > 0.05 / 4
    expect(Array.from(reject)).toEqual([0, 0, 0, 0]);
  });
});

describe('critical counts and cell flags', () => {
  it.each([0.3, 2, 7.5, 40, 900])('mean %d: the critical counts are the first counts past alpha', (mean) => {
    const upper = criticalUpper(mean, 0.05);
    expect(poissonUpperTail(upper, mean)).toBeLessThanOrEqual(0.05);
    if (upper > 1) expect(poissonUpperTail(upper - 1, mean)).toBeGreaterThan(0.05);
    const lower = criticalLower(mean, 0.05);
    if (lower >= 0) expect(poissonLowerTail(lower, mean)).toBeLessThanOrEqual(0.05);
    expect(poissonLowerTail(lower + 1, mean)).toBeGreaterThan(0.05);
  });

  it('flags the cell far above and the cell far below their expected counts, each family by BH', () => {
    // 10 whole cells, N = 200, E = 20: a count of 45 (P(X >= 45) = 1.06e-6 by scipy poisson.sf(44, 20)) and a count of 3
    // (P(X <= 3) = 3.2e-6 by scipy poisson.cdf(3, 20)) are below alpha / 10; the rest are near 20
    const counts = Float64Array.from([45, 3, 20, 19, 21, 18, 22, 17, 16, 19]);
    const coverage = new Float64Array(10).fill(1);
    const scratch = createCellFlagScratch();
    expect(flagCells(counts, coverage, 0.05, scratch)).toEqual({ excess: 1, deficit: 1 });
    expect(scratch.excess[0]).toBe(0); // the cell holding 45
    expect(scratch.deficit[0]).toBe(1); // the cell holding 3
  });

  it('a listing of extreme cells whose bounds miss a candidate is not used: every cell is visited', () => {
    // as above (scipy: P(X >= 45; 20) = 1.06e-6); the listing starts at 46, above the critical count of the rate
    const counts = Int32Array.from([45, 3, 20, 19, 21, 18, 22, 17, 16, 19]);
    const coverage = new Float64Array(10).fill(1);
    const keptIndex = Int32Array.from(counts.keys());
    const extremes: ExtremeCells = { from: 46, to: 3, cells: new Int32Array(10), count: 0 };
    const { points } = gatheredDispersionChiSquare(Float64Array.from(counts), keptIndex, coverage, extremes);
    expect(Array.from(extremes.cells.subarray(0, extremes.count))).toEqual([1]);
    const scratch = createCellFlagScratch();
    const known = { total: points, weights: summarizeWeights(coverage), extremes };
    expect(flagCells(counts, coverage, 0.05, scratch, known)).toEqual({ excess: 1, deficit: 1 });
    expect(scratch.excess[0]).toBe(0);
    // a listing whose lower bound misses the deficit cell (count 3; the critical count below 20 is higher): not used either
    const lowTo: ExtremeCells = { from: criticalUpper(20, 0.05), to: 2, cells: new Int32Array(10), count: 0 };
    gatheredDispersionChiSquare(Float64Array.from(counts), keptIndex, coverage, lowTo);
    expect(Array.from(lowTo.cells.subarray(0, lowTo.count))).toEqual([0]);
    expect(flagCells(counts, coverage, 0.05, scratch, { ...known, extremes: lowTo })).toEqual({ excess: 1, deficit: 1 });
    // bounds that hold: the same answer from the listed cells alone
    const holding: ExtremeCells = { from: criticalUpper(20, 0.05), to: criticalLower(20, 0.05), cells: new Int32Array(10), count: 0 };
    gatheredDispersionChiSquare(Float64Array.from(counts), keptIndex, coverage, holding);
    expect(holding.count).toBeLessThan(10);
    expect(flagCells(counts, coverage, 0.05, scratch, { ...known, extremes: holding })).toEqual({ excess: 1, deficit: 1 });
  });

  it('a partial cell is tested against its own expected count', () => {
    // N = 60 over coverage 3.25: rate 18.46 per whole cell, the quarter cell expects 4.6 and holds 15
    // (P(X >= 15; 4.615) = 9.7e-5 < 0.05 / 4 by scipy poisson.sf(14, 60 / 3.25 * 0.25))
    const counts = Float64Array.from([15, 15, 15, 15]);
    const coverage = Float64Array.from([0.25, 1, 1, 1]);
    const scratch = createCellFlagScratch();
    expect(flagCells(counts, coverage, 0.05, scratch).excess).toBe(1);
    expect(scratch.excess[0]).toBe(0);
  });
});

describe('cell flags against the step-up over every cell', () => {
  /** Poisson draws by multiplying uniforms (D. E. Knuth, The Art of Computer Programming 2, 3.4.1, from memory) */
  function poisson(mean: number, random: () => number): number {
    const limit = Math.exp(-mean);
    let k = 0;
    for (let product = random(); product > limit; product *= random()) k += 1;
    return k;
  }
  /** The definition: exact p-values of every cell, Benjamini-Hochberg over all m of each family. */
  function bruteForce(counts: Float64Array, coverage: Float64Array, alpha: number): { excess: number[]; deficit: number[] } {
    const m = counts.length;
    const rate = counts.reduce((sum, c) => sum + c, 0) / coverage.reduce((sum, a) => sum + a, 0);
    const family = (tail: (o: number, mean: number) => number): number[] => {
      const p = Float64Array.from(counts, (o, k) => tail(o, rate * coverage[k]!));
      const reject = new Uint8Array(m);
      benjaminiHochberg(p, m, alpha, reject);
      return [...reject.keys()].filter((k) => reject[k] === 1);
    };
    return { excess: family(poissonUpperTail), deficit: family(poissonLowerTail) };
  }

  /**
   * A sweep's simulated patterns also bring the cells listed while their chi-square was summed (KnownSums.extremes):
   * bounds that hold every candidate (rates 10 % off), or (every third such trial) a `from` above the critical
   * count, which must make flagCells go over every cell instead.
   */
  function listedExtremes(counts: Float64Array, coverage: Float64Array, alpha: number, trial: number): ExtremeCells | undefined {
    if (trial % 4 === 1) return undefined;
    const rate = counts.reduce((sum, c) => sum + c, 0) / coverage.reduce((sum, a) => sum + a, 0);
    const m = counts.length;
    const tooHigh = trial % 3 === 0;
    const extremes: ExtremeCells = {
      from: tooHigh ? criticalUpper(rate, alpha) + 2 : criticalUpper(rate * 0.9, alpha),
      to: criticalLower(rate * 1.1, alpha),
      cells: new Int32Array(m),
      count: 0,
    };
    gatheredDispersionChiSquare(Float64Array.from(counts), Int32Array.from({ length: m }, (_, k) => k), coverage, extremes);
    return extremes;
  }

  it('the same flagged cells as the definition on 400 null and clustered patterns with partial cells or weights', () => {
    const random = seededRandom(20261203);
    const scratch = createCellFlagScratch();
    let flaggedCases = 0;
    for (let trial = 0; trial < 400; trial++) {
      const m = 2 + Math.floor(random() * (trial % 4 === 0 ? 4000 : 300));
      const mean = [0.4, 2, 5, 30][trial % 4]!;
      const alpha = trial % 3 === 0 ? 0.1 : 0.05;
      // coverages in (0.5, 1], or (every fifth trial) baseline weights between 0.2 and 3 (issue 15)
      const weights = trial % 5 === 2;
      const coverage = Float64Array.from({ length: m }, () => (weights ? 0.2 + 2.8 * random() : random() < 0.15 ? 0.5 + random() / 2 : 1));
      // odd trials: about 3 % of the cells hold 4 times their mean, 3 % a twentieth of it
      const factor = (): number => (trial % 2 === 0 ? 1 : [4, 0.05, 1][Math.min(2, Math.floor(random() / 0.03))]!);
      const counts = Float64Array.from(coverage, (a) => poisson(mean * a * factor(), random));
      if (counts.every((c) => c === 0)) continue;
      // every other trial passes the sums as a sweep's simulated patterns do (the total with the chi-square, the
      // coverages' summary once per placement): the same flags either way
      const known = trial % 2 === 0 ? undefined : { total: counts.reduce((sum, c) => sum + c, 0), weights: summarizeWeights(coverage), extremes: listedExtremes(counts, coverage, alpha, trial) };
      const found = flagCells(counts, coverage, alpha, scratch, known);
      const expected = bruteForce(counts, coverage, alpha);
      expect(Array.from(scratch.excess.subarray(0, found.excess))).toEqual(expected.excess);
      expect(Array.from(scratch.deficit.subarray(0, found.deficit))).toEqual(expected.deficit);
      if (found.excess + found.deficit > 0) flaggedCases += 1;
    }
    expect(flaggedCases).toBeGreaterThan(50); // the comparison covers flagged cells, not only empty answers
  });
});
