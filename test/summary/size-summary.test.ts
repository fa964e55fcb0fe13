import type { OverallTest } from '../../shared/contracts.js';
import { describe, it, expect } from 'vitest';
import type { MonteCarloResult } from '../../shared/contracts.js';
import { overallConclusion, sizeConclusion, formatShare } from '../../server/summary/conclusion.js';
import { referenceRank, extremeIndices } from '../../server/summary/reference-rank.js';
import { summarizeSize } from '../../server/summary/size-summary.js';
import { verdictShares } from '../../server/summary/verdict-shares.js';
import { placementRow } from './placement-row-fixture.js';

function monteCarlo(pMedianClustered: number, pMaxClustered: number, sims = 99): MonteCarloResult {
  return {
    sims,
    pMedianClustered,
    pMedianRegular: 1,
    pMaxClustered,
    pMinRegular: 1,
    observedMedian: 2,
    observedMax: 3,
    observedMin: 1.5,
    simulatedMedians: [],
    simulatedMaxima: [],
    envelope: { lo: 0.7, hi: 1.3 },
    observedShareSignificant: 0.97,
    simulatedShareSignificant: [],
  };
}

describe('verdictShares', () => {
  it('counts shares, the most common verdict and the agreement (hand-counted)', () => {
    const result = verdictShares(['clustered', 'csr', 'clustered', 'clustered', 'regular']);
    expect(result.shares).toEqual({ clustered: 0.6, regular: 0.2, csr: 0.2 });
    expect(result.mostCommon).toBe('clustered');
    expect(result.agreement).toBe(0.6);
  });
});

describe('referenceRank (mid-ranks, Kruskal & Wallis 1952)', () => {
  it('counts the other placements below the reference, ties half', () => {
    // reference 2 among others [1, 2, 3, 4]: 1 below, 1 tie -> (1 + 0.5) / 4
    expect(referenceRank([2, 1, 2, 3, 4], 0)).toEqual({ rank: 0.375, inTail: false });
  });

  it('flags the reference in the 5 % tails', () => {
    const values = [0.1, ...Array.from({ length: 40 }, (_, i) => 1 + i)];
    expect(referenceRank(values, 0)).toEqual({ rank: 0, inTail: true });
    expect(referenceRank([100, ...values.slice(1)], 0).inTail).toBe(true);
  });

  it('finds the lowest and highest finite values', () => {
    expect(extremeIndices([3, Number.NaN, 1, 9, 1])).toEqual({ lowest: 2, highest: 3 });
  });
});

describe('summarizeSize', () => {
  it('builds quantiles, shares, reference rank, extremes and the conclusion', () => {
    const rows = [
      placementRow(0, 1.5, 'clustered'),
      placementRow(1, 2.5, 'clustered'),
      placementRow(2, 0.9, 'csr'),
      placementRow(3, 2.0, 'clustered'),
    ];
    const summary = summarizeSize(rows, monteCarlo(0.01, 0.02));
    // numpy.quantile([1.5, 2.5, 0.9, 2.0], 0.5) = 1.75
    expect(summary.vmr.p50).toBeCloseTo(1.75, 12);
    expect(summary.chi2PerDf.max).toBe(2.5);
    expect(summary.verdictShares.clustered).toBe(0.75);
    expect(summary.agreement).toBe(0.75);
    expect(summary.reference.placementIndex).toBe(0);
    // reference vmr 1.5 has 1 of 3 others below
    expect(summary.referenceRank).toBeCloseTo(1 / 3, 15);
    expect(summary.lowestVmr.placementIndex).toBe(2);
    expect(summary.highestVmr.placementIndex).toBe(1);
    expect(summary.conclusion).toBe(
      '100 m cells: clustered in 75 % of 4 placements (no departure from CSR in 25 %); ' +
        'Monte Carlo p = 0.01 on the median chi2/df, 0.02 on the maximum (R = 99, this size only)',
    );
  });

  it('writes the plain-words sentence of the issue for 97 % of 512 placements', () => {
    const rows = Array.from({ length: 512 }, (_, j) => placementRow(j, 2, j < 497 ? 'clustered' : 'csr', 0, 250));
    const summary = summarizeSize(rows, monteCarlo(0.01, 0.01));
    expect(summary.conclusion.startsWith('250 m cells: clustered in 97 % of 512 placements')).toBe(true);
    expect(summary.conclusion).toContain('Monte Carlo p = 0.01');
  });

  it('refuses rows without the reference placement', () => {
    expect(() => summarizeSize([placementRow(3, 1, 'csr')], null)).toThrow(/reference placement/);
  });
});

describe('conclusions', () => {
  it('never rounds a partial share to 0 % or 100 %', () => {
    expect(formatShare(0.999)).toBe('99 %');
    expect(formatShare(0.001)).toBe('1 %');
    expect(formatShare(1)).toBe('100 %');
  });

  it('states the one overall test across sizes and tails, and where the verdict is unstable', () => {
    const stable = summarizeSize([placementRow(0, 2, 'clustered'), placementRow(1, 2, 'clustered')], monteCarlo(0.01, 0.01));
    const unstable = summarizeSize([placementRow(0, 1, 'csr', 1, 50), placementRow(1, 2, 'clustered', 1, 50)], monteCarlo(0.3, 0.1));
    const overall: OverallTest = { method: 'monte-carlo-max-standardized-median', statistic: 3.1, p: 0.01, sims: 99, alpha: 0.05,
      canReject: true, rejects: true, direction: 'clustered', strongestCellSize: 100 };
    expect(overallConclusion([stable, unstable], 0.05, overall)).toBe(
      'The overall Monte Carlo test across all 2 cell sizes and both tails finds a departure from CSR at alpha 0.05 ' +
        '(p = 0.01, R = 99): clustering beyond complete spatial randomness, most marked at 100 m cells. ' +
        'The verdict depends on where the grid falls at 1 of 2 cell sizes (agreement below 90 %).',
    );
    expect(overallConclusion([stable], 0.05, { ...overall, p: 0.3, rejects: false, direction: 'csr' })).toMatch(
      /^The overall Monte Carlo test across the 1 cell size and both tails finds no departure from CSR at alpha 0.05 \(p = 0.3, R = 99\)/,
    );
    // without sims: labelled as per-placement evidence, not a test
    expect(overallConclusion([stable, unstable], 0.05, null)).toMatch(/^Per-placement evidence only, not a test \(sims = 0\)/);
    expect(sizeConclusion({ ...stable, monteCarlo: null })).toContain('no Monte Carlo test (sims = 0)');
  });
});
