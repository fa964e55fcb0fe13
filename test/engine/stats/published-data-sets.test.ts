import { describe, expect, it } from 'vitest';
import {
  frequencyChiSquare, mergeSmallClasses, placementStatistics, poissonFrequencyTable,
} from '../../../workers/stats/index.js';

/** Expand a frequency table (frequencies[k] cells hold k points; extra [count, cells] pairs) into cell counts. */
function expandFrequencies(frequencies: readonly number[], extra: ReadonlyArray<readonly [number, number]> = []) {
  const counts: number[] = [];
  frequencies.forEach((cells, k) => { for (let c = 0; c < cells; c++) counts.push(k); });
  for (const [count, cells] of extra) for (let c = 0; c < cells; c++) counts.push(count);
  return Float64Array.from(counts);
}

const close = (actual: number, expected: number, relative: number) =>
  expect(Math.abs(actual / expected - 1)).toBeLessThan(relative);

// R. D. Clarke (1946), "An application of the Poisson distribution", Journal of the Institute of Actuaries 72:481:
// 576 squares of 1/4 km^2, hits 0..4 in 229, 211, 93, 35, 7 squares and one square of "5 and over"; the classes 0-4
// hold 530 of the 537 hits, so that square held 7 (derived, shared/reference-values.md).
const clarkeCounts = expandFrequencies([229, 211, 93, 35, 7], [[7, 1]]);
const wholeCells = (m: number) => new Float64Array(m).fill(1);

describe('Clarke (1946) flying-bomb hits, 576 squares', () => {
  const stats = placementStatistics(clarkeCounts, wholeCells(576), 0.05);

  it('has 537 hits in 576 squares: mean 537/576 (not 535/576)', () => {
    expect(stats.cells).toBe(576);
    expect(stats.points).toBe(537);
    expect(stats.mean).toBe(537 / 576);
  });

  // scipy/numpy: c = [0]*229+[1]*211+[2]*93+[3]*35+[4]*7+[7]; c.var(ddof=1) = 0.9710597826086956,
  // vmr = 1.0415836774350256, X2 = 598.9106145251397, chi2.sf(X2, 575) = 0.23726251411837695
  it('reproduces variance, VMR, X2 on 575 df and the upper p (scipy)', () => {
    close(stats.variance, 0.9710597826086956, 1e-12);
    close(stats.vmr, 1.0415836774350256, 1e-12);
    close(stats.chi2, 598.9106145251397, 1e-12);
    expect(stats.df).toBe(575);
    close(stats.pClustered, 0.23726251411837695, 1e-9);
    close(stats.pRegular, 0.762737485881623, 1e-9);
    expect(stats.verdict).toBe('csr');
  });

  // shared/reference-values.md (scipy/numpy): Morisita 1.044609, Ip 0.174941, Lloyd 0.973875 and 1.044604,
  // Green 7.758e-05, NB k 22.4197; full precision from the same formulas in numpy:
  // I = 1.0446093554573501, Ip = 0.17494076154882193, m* = 0.9738753441016921, patchiness = 1.0446037210476251,
  // green = 7.758148775191335e-05, k = 22.419654156931454
  it('reproduces Morisita, standardized Morisita, Lloyd, Green and NB k', () => {
    close(stats.morisita, 1.0446093554573501, 1e-12);
    expect(stats.morisita).toBeCloseTo(1.044609, 6);
    close(stats.morisitaStandardized, 0.17494076154882193, 1e-9);
    expect(stats.morisitaStandardized).toBeCloseTo(0.174941, 6);
    close(stats.meanCrowding, 0.9738753441016921, 1e-12);
    close(stats.patchiness, 1.0446037210476251, 1e-12);
    close(stats.green, 7.758148775191335e-5, 1e-9);
    close(stats.negativeBinomialK!, 22.419654156931454, 1e-9);
    expect(stats.negativeBinomialK!).toBeCloseTo(22.4197, 4);
  });

  // scipy: e = [576*poisson.pmf(k, 537/576) for k in range(5)] + [576*poisson.sf(4, 537/576)];
  // X2 = sum((o-e)**2/e) with o = [229,211,93,35,7,1] -> 1.1691546751814386, chi2.sf(X2, 4) = 0.883150518919159
  // Clarke's printed expected: 226.74, 211.39, 98.54, 30.62, 7.14, 1.57
  it('reproduces the Poisson fit with the classes as printed (0..4, >=5; df 4)', () => {
    const table = poissonFrequencyTable(clarkeCounts, wholeCells(576), 5);
    const printedExpected = [226.74, 211.39, 98.54, 30.62, 7.14, 1.57];
    table.forEach((entry, k) => expect(Math.abs(entry.expected - printedExpected[k]!)).toBeLessThan(0.005));
    expect(table.map((entry) => entry.observed)).toEqual([229, 211, 93, 35, 7, 1]);
    const fit = frequencyChiSquare(table, 1);
    expect(fit.df).toBe(4);
    close(fit.chi2, 1.1691546751814386, 1e-9);
    close(fit.p, 0.883150518919159, 1e-9);
    expect(fit.classes.map((entry) => entry.label)).toEqual(['0', '1', '2', '3', '4', '>=5']);
  });

  // scipy: same with o = [229,211,93,35,8] and e[4] = 576*poisson.sf(3, 537/576) = 8.705916
  // -> X2 = 1.0175894136798682, chi2.sf(X2, 3) = 0.7969959425043196 (reference-values.md: 1.017589, 0.796996)
  it('reproduces the merged Poisson fit (0,1,2,3,>=4; df 3)', () => {
    const fit = stats.poissonFit!;
    expect(fit.classes.map((entry) => entry.label)).toEqual(['0', '1', '2', '3', '>=4']);
    expect(fit.classes.map((entry) => entry.observed)).toEqual([229, 211, 93, 35, 8]);
    expect(fit.classes[4]!.expected).toBeCloseTo(8.705916, 6);
    expect(fit.df).toBe(3);
    close(fit.chi2, 1.0175894136798682, 1e-9);
    close(fit.p, 0.7969959425043196, 1e-9);
    const expectedTotal = fit.classes.reduce((sum, entry) => sum + entry.expected, 0);
    expect(expectedTotal).toBeCloseTo(576, 9);
  });

  it('merges the printed table to the same classes with mergeSmallClasses', () => {
    const merged = mergeSmallClasses(poissonFrequencyTable(clarkeCounts, wholeCells(576), 5));
    close(frequencyChiSquare(merged).chi2, 1.0175894136798682, 1e-9);
  });
});

// L. von Bortkiewicz (1898), Das Gesetz der kleinen Zahlen, Leipzig: Teubner: deaths by horse kick.
describe('Bortkiewicz (1898) horse-kick deaths', () => {
  // 10 corps x 20 years: 0..4 deaths in 109, 65, 22, 3, 1 corps-years
  const tenCorps = expandFrequencies([109, 65, 22, 3, 1]);
  const ten = placementStatistics(tenCorps, wholeCells(200), 0.05);

  // numpy/scipy: mean 0.61, var(ddof=1) = 0.6109547738693468, vmr = 1.001565203064503, X2 = 199.31147540983608,
  // chi2.sf(X2, 199) = 0.48044953149214153 (reference-values.md: 0.610955, 1.001565, 199.311, 0.48045)
  it('10 corps: mean, variance, VMR, X2 on 199 df and upper p', () => {
    expect(ten.points).toBe(122);
    expect(ten.mean).toBeCloseTo(0.61, 14);
    close(ten.variance, 0.6109547738693468, 1e-12);
    close(ten.vmr, 1.001565203064503, 1e-12);
    close(ten.chi2, 199.31147540983608, 1e-12);
    expect(ten.df).toBe(199);
    close(ten.pClustered, 0.48044953149214153, 1e-9);
    expect(ten.verdict).toBe('csr');
  });

  // scipy: o = [109,65,26]; e = [200*poisson.pmf(0,.61), 200*poisson.pmf(1,.61), 200*poisson.sf(1,.61)]
  // -> X2 = 0.06278383104696776, chi2.sf(X2, 1) = 0.8021488833416083 (reference-values.md: 0.062784, 0.802149)
  it('10 corps: merged Poisson fit (0, 1, >=2; df 1)', () => {
    const fit = ten.poissonFit!;
    expect(fit.classes.map((entry) => entry.label)).toEqual(['0', '1', '>=2']);
    expect(fit.classes.map((entry) => entry.observed)).toEqual([109, 65, 26]);
    expect(fit.df).toBe(1);
    close(fit.chi2, 0.06278383104696776, 1e-9);
    close(fit.p, 0.8021488833416083, 1e-9);
  });

  // all 14 corps (280 units: 144, 91, 32, 11, 2): numpy/scipy mean 0.7, vmr = 1.0896057347670252, X2 = 304.0,
  // chi2.sf(304, 279) = 0.1454152397897825 (reference-values.md: 1.089606, 304.000, 0.145415)
  it('14 corps: mean, VMR, X2 on 279 df and upper p', () => {
    const all = placementStatistics(expandFrequencies([144, 91, 32, 11, 2]), wholeCells(280), 0.05);
    expect(all.mean).toBeCloseTo(0.7, 14);
    close(all.vmr, 1.0896057347670252, 1e-12);
    close(all.chi2, 304, 1e-12);
    expect(all.df).toBe(279);
    close(all.pClustered, 0.1454152397897825, 1e-9);
    // scipy: o = [144,91,32,13]; e = 280*[pmf(0), pmf(1), pmf(2), sf(2)] at 0.7 -> X2 = 1.9518228705146854,
    // chi2.sf(X2, 2) = 0.37684872377525974 (classes 0,1,2,>=3: the class >=4 expects 1.61 and is merged)
    const fit = all.poissonFit!;
    expect(fit.classes.map((entry) => entry.label)).toEqual(['0', '1', '2', '>=3']);
    expect(fit.df).toBe(2);
    close(fit.chi2, 1.9518228705146854, 1e-9);
    close(fit.p, 0.37684872377525974, 1e-9);
  });
});
