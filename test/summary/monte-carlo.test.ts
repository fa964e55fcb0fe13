import { describe, it, expect } from 'vitest';
import { monteCarloPValue } from '../../server/summary/monte-carlo-p-value.js';
import { placementRobustTest } from '../../server/summary/placement-robust-test.js';

// Besag & Diggle (1977), Applied Statistics 26:327-333: p = (1 + #{simulated at least as extreme}) / (R + 1).
describe('monteCarloPValue', () => {
  it('counts ties as at least as extreme, in both tails (hand-computed)', () => {
    // simulated [1, 2, 3, 0.5], observed 2: >= 2 are {2, 3} -> 3/5; <= 2 are {1, 2, 0.5} -> 4/5
    expect(monteCarloPValue(2, [1, 2, 3, 0.5], 'upper')).toBeCloseTo(0.6, 15);
    expect(monteCarloPValue(2, [1, 2, 3, 0.5], 'lower')).toBeCloseTo(0.8, 15);
  });

  it('an observed value above every simulated one gets the smallest p, 1/(R+1)', () => {
    const simulated = Array.from({ length: 99 }, (_, r) => r / 100);
    expect(monteCarloPValue(5, simulated, 'upper')).toBe(1 / 100);
    expect(monteCarloPValue(5, simulated, 'lower')).toBe(1);
  });

  it('counts a NaN simulated value as at least as extreme and gives 1 without simulations', () => {
    expect(monteCarloPValue(1, [Number.NaN, 0], 'upper')).toBeCloseTo(2 / 3, 15);
    expect(monteCarloPValue(1, [], 'upper')).toBe(1);
  });
});

describe('placementRobustTest', () => {
  // observed chi2/df at 4 placements, 3 simulated patterns (rows) at the same placements.
  // python3 -c "import numpy as np; s=np.array([[1.0,1.1,0.8,0.95],[1.3,1.6,1.2,1.4],[0.7,0.9,1.0,0.85]]);
  //   print(np.median([1.2,0.9,1.5,1.1]), np.median(s,1), s.max(1), s.min(1), np.quantile(np.median(s,1),[.025,.975]))"
  // -> 1.15 [0.975 1.35 0.875] [1.1 1.6 1.0] [0.8 1.2 0.7] [0.88 1.33125]
  const result = placementRobustTest({
    observed: [1.2, 0.9, 1.5, 1.1],
    observedSignificant: [0, 0, 1, 0],
    simulated: Float64Array.from([1.0, 1.1, 0.8, 0.95, 1.3, 1.6, 1.2, 1.4, 0.7, 0.9, 1.0, 0.85]),
    simulatedSignificant: Uint8Array.from([0, 0, 0, 0, 1, 1, 0, 1, 0, 0, 0, 0]),
    sims: 3,
  });

  it('summarises each pattern across placements', () => {
    expect(result.observedMedian).toBeCloseTo(1.15, 12);
    expect(result.observedMax).toBe(1.5);
    expect(result.observedMin).toBe(0.9);
    expect(result.simulatedMedians.map((v) => Number(v.toFixed(12)))).toEqual([0.975, 1.35, 0.875]);
    expect(result.simulatedMaxima).toEqual([1.1, 1.6, 1.0]);
    expect(result.simulatedMinima).toEqual([0.8, 1.2, 0.7]);
    expect(result.observedShareSignificant).toBe(0.25);
    expect(result.simulatedShareSignificant).toEqual([0, 0.75, 0]);
  });

  it('gives the Besag-Diggle p-values on the median, maximum and minimum (hand-counted)', () => {
    // medians >= 1.15: {1.35} -> 2/4; medians <= 1.15: {0.975, 0.875} -> 3/4
    expect(result.pMedianClustered).toBe(0.5);
    expect(result.pMedianRegular).toBe(0.75);
    // maxima >= 1.5: {1.6} -> 2/4; minima <= 0.9: {0.8, 0.7} -> 3/4
    expect(result.pMaxClustered).toBe(0.5);
    expect(result.pMinRegular).toBe(0.75);
  });

  it('gives the CSR envelope as the 2.5 and 97.5 % type 7 quantiles of the simulated medians', () => {
    expect(result.envelope.lo).toBeCloseTo(0.88, 12);
    expect(result.envelope.hi).toBeCloseTo(1.33125, 12);
  });
});
