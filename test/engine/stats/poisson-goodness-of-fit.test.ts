import { describe, expect, it } from 'vitest';
import {
  classLabel, mergeSmallClasses, poissonFrequencyTable, poissonGoodnessOfFit,
} from '../../../workers/stats/index.js';

const close = (actual: number, expected: number, relative = 1e-9) =>
  expect(Math.abs(actual / expected - 1)).toBeLessThan(relative);

describe('poissonFrequencyTable with unequal coverages', () => {
  // 30 whole cells and 10 half cells, N = 51: E_c = 51 a_c / 35 (1.457143 and 0.728571).
  const counts = [0, 1, 2, 3, 1, 0, 2, 1, 1, 4, 0, 2, 1, 3, 0, 1, 2, 1, 0, 5, 1, 2, 0, 1, 3, 1, 2, 0, 1, 2,
    0, 1, 0, 2, 1, 0, 0, 1, 3, 0];
  const coverage = counts.map((_, c) => (c < 30 ? 1 : 0.5));

  // scipy: E = 51*a/a.sum(); [sum(poisson.pmf(k, E)) for k in range(6)] + [sum(poisson.sf(5, E))]
  //  = [11.813001907322665, 13.697160765295958, 8.698505701472172, 3.9139238715804234, 1.3691283560343657,
  //     0.39074721216888647, 0.11753218612550892]  (sum 40)
  it('expected frequency of class k is sum_c Pois(k; E_c) (scipy)', () => {
    const table = poissonFrequencyTable(counts, coverage, 6);
    const scipy = [11.813001907322665, 13.697160765295958, 8.698505701472172, 3.9139238715804234,
      1.3691283560343657, 0.39074721216888647, 0.11753218612550892];
    table.forEach((entry, k) => close(entry.expected, scipy[k]!, 1e-12));
    expect(table.map((entry) => entry.observed)).toEqual([12, 14, 8, 4, 1, 1, 0]);
    expect(table.reduce((sum, entry) => sum + entry.expected, 0)).toBeCloseTo(40, 12);
  });

  // scipy: o = [12,14,8,6]; e = [11.813001907322665, 13.697160765295958, 8.698505701472172, 5.791331625909184]
  // X2 = sum((o-e)**2/e) = 0.07326564844221692; chi2.sf(X2, 2) = 0.9640300388530707
  it('merges to 0,1,2,>=3 and gives X2 on 2 df (scipy)', () => {
    const fit = poissonGoodnessOfFit(counts, coverage)!;
    expect(fit.classes.map((entry) => entry.label)).toEqual(['0', '1', '2', '>=3']);
    expect(fit.df).toBe(2);
    close(fit.chi2, 0.07326564844221692);
    close(fit.p, 0.9640300388530707);
  });
});

describe('poissonFrequencyTable observed classes', () => {
  // the observed class of a cell is min(count, K): numpy.bincount(numpy.minimum(counts, K), minlength=K + 1)
  const bincount = (counts: number[], top: number): number[] => {
    const out = new Array<number>(top + 1).fill(0);
    for (const count of counts) out[Math.min(count, top)]! += 1;
    return out;
  };
  it('tallies 10,003 cells (four lanes and the remainder) like numpy.bincount, with few or with over a thousand classes', () => {
    const counts = Array.from({ length: 10003 }, (_, c) => (c * 7919) % 23);
    const coverage = counts.map((_, c) => (c % 101 === 0 ? 0.5 : 1));
    for (const top of [5, 23, 2000]) {
      const table = poissonFrequencyTable(counts, coverage, top);
      expect(table.map((entry) => entry.observed)).toEqual(bincount(counts, top));
    }
    // one cell with a count above a thousand: the open class starts past it (no lanes)
    const spiked = [...counts.slice(0, 9), 1500];
    expect(poissonFrequencyTable(spiked, spiked.map(() => 1), 1501).map((entry) => entry.observed)).toEqual(bincount(spiked, 1501));
  });
});

describe('mergeSmallClasses: adjacent pooling until every expected count is >= 5', () => {
  // 30 whole cells with mean 245/30 = 8.1667: small classes at both ends and in the middle.
  // scipy: e = [30*poisson.pmf(k, lam) for k in range(14)] + [30*poisson.sf(13, lam)], pooled from the top:
  // groups 0-6, 7-8, 9-10, >=11 with o = [7, 10, 8, 5], e = [8.803339275378095, 8.27554784332872,
  // 6.8912605018764195, 6.029852379416765]; X2 = 1.083025658519057, chi2.sf(X2, 2) = 0.5818673202847915
  const counts = [8, 6, 9, 12, 7, 5, 10, 8, 4, 9, 11, 7, 6, 8, 13, 9, 7, 10, 5, 8, 9, 6, 12, 8, 7, 10, 9, 3, 8, 11];
  it('pools from the upper tail downward and the remainder at 0 upward (scipy)', () => {
    const fit = poissonGoodnessOfFit(counts, new Array<number>(30).fill(1))!;
    expect(fit.classes.map((entry) => entry.label)).toEqual(['0-6', '7-8', '9-10', '>=11']);
    expect(fit.classes.map((entry) => entry.observed)).toEqual([7, 10, 8, 5]);
    const scipy = [8.803339275378095, 8.27554784332872, 6.8912605018764195, 6.029852379416765];
    fit.classes.forEach((entry, k) => close(entry.expected, scipy[k]!, 1e-11));
    expect(fit.df).toBe(2);
    close(fit.chi2, 1.083025658519057);
    close(fit.p, 0.5818673202847915);
  });

  it('keeps totals and leaves no class below 5', () => {
    const table = poissonFrequencyTable(counts, new Array<number>(30).fill(1), 14);
    const merged = mergeSmallClasses(table);
    expect(merged.every((entry) => entry.expected >= 5)).toBe(true);
    expect(merged.reduce((sum, entry) => sum + entry.observed, 0)).toBe(30);
    expect(merged.reduce((sum, entry) => sum + entry.expected, 0)).toBeCloseTo(30, 12);
  });

  it('labels single, range and open classes', () => {
    expect(classLabel({ lowest: 1, highest: 1, observed: 0, expected: 0 })).toBe('1');
    expect(classLabel({ lowest: 2, highest: 3, observed: 0, expected: 0 })).toBe('2-3');
    expect(classLabel({ lowest: 4, highest: Number.POSITIVE_INFINITY, observed: 0, expected: 0 })).toBe('>=4');
  });

  it('returns null when fewer than 3 classes remain or there are no points', () => {
    // mean 0.5 in 10 cells: expected 6.07 (k = 0) and 3.93 (k >= 1) -> one class after merging
    expect(poissonGoodnessOfFit([0, 1, 0, 1, 0, 1, 0, 1, 0, 1], new Array<number>(10).fill(1))).toBeNull();
    expect(poissonGoodnessOfFit([0, 0, 0], [1, 1, 1])).toBeNull();
  });
});

describe('poissonFrequencyTable class probabilities against scipy', () => {
  // For X ~ Poisson(lambda), P(X >= K) = P(K, lambda), the regularized lower incomplete gamma (Abramowitz & Stegun
  // 1964, 26.4.21). Rows: lambda as given, open class K, then for lambda' = round(4 lambda) / 4 (the mean the table
  // sees): scipy.special.gammainc(K, lambda') and [k, scipy.stats.poisson.pmf(k, lambda')] (scipy 1.17.1).
  const cases: [number, number, number, [number, number][]][] = [
    [0.3, 2, 0.026499021160743912, [[0, 0.7788007830714049], [1, 0.19470019576785122]]],
    [0.93, 6, 0.000594184817581693, [[0, 0.36787944117144233], [1, 0.36787944117144233], [3, 0.06131324019524039], [5, 0.00306566200976202]]],
    [5, 12, 0.0054530919130093445, [[0, 0.006737946999085467], [1, 0.03368973499542734], [6, 0.1462228081398754], [11, 0.008242176685373562]]],
    [5, 40, 8.550023756842979e-23, [[0, 0.006737946999085467], [1, 0.03368973499542734], [20, 2.6412107749256406e-07], [39, 6.00859155092766e-22]]],
    [42.5, 60, 0.006535433114423364, [[0, 3.4872615319944465e-19], [1, 1.482086151097645e-17], [30, 0.009343129011391867], [59, 0.0029881871447605107]]],
    [750, 800, 0.03639450911525607, [[400, 3.142170532905943e-45], [799, 0.0029450574553310277]]],
    [750, 900, 5.882923399369864e-08, [[450, 6.573794753163675e-33], [899, 1.2133348933795047e-08]]],
  ];
  for (const [lambda, openClassFrom, openReference, points] of cases) {
    it(`lambda ${lambda}, open class >= ${openClassFrom}: every class within 1e-12 relative of scipy`, () => {
      // m whole cells with N = m * lambda points: every cell's expected count is lambda
      const m = 4;
      const counts = [Math.round(lambda * m), 0, 0, 0];
      const table = poissonFrequencyTable(counts, [1, 1, 1, 1], openClassFrom);
      const open = table[openClassFrom]!.expected / m;
      expect(Math.abs(open - openReference)).toBeLessThanOrEqual(1e-12 * openReference + 1e-300);
      for (const [k, pmf] of points) {
        const pointProbability = table[k]!.expected / m;
        expect(Math.abs(pointProbability - pmf)).toBeLessThanOrEqual(1e-9 * pmf + 1e-15);
      }
    });
  }
});
