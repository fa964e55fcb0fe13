import { describe, it, expect } from 'vitest';
import { median, quantileSorted, quantiles } from '../../server/summary/quantiles.js';

describe('quantiles (Hyndman & Fan 1996 type 7, numpy default)', () => {
  it('quantiles(values) matches numpy.quantile', () => {
    // python3 -c "import numpy as np; print(np.quantile([3.5,1.0,2.25,10.0,4.0,0.5,7.0],[0,.05,.25,.5,.75,.95,1]).tolist())"
    // -> [0.5, 0.65, 1.625, 3.5, 5.5, 9.099999999999998, 10.0]
    const q = quantiles([3.5, 1.0, 2.25, 10.0, 4.0, 0.5, 7.0]);
    expect(q.min).toBe(0.5);
    expect(q.p5).toBeCloseTo(0.65, 12);
    expect(q.p25).toBeCloseTo(1.625, 12);
    expect(q.p50).toBe(3.5);
    expect(q.p75).toBeCloseTo(5.5, 12);
    expect(q.p95).toBeCloseTo(9.1, 12);
    expect(q.max).toBe(10);
  });

  it('median of an even count interpolates halfway (numpy.median([4,1,3,2]) = 2.5)', () => {
    expect(median([4, 1, 3, 2])).toBe(2.5);
  });

  it('leaves NaN out and gives NaN for no finite value', () => {
    expect(median([Number.NaN, 2, 1, 3])).toBe(2);
    expect(Number.isNaN(quantiles([Number.NaN]).p50)).toBe(true);
    expect(Number.isNaN(quantileSorted([], 0.5))).toBe(true);
  });

  it('quantileSorted at p = 1 is the maximum and a single value is every quantile', () => {
    expect(quantileSorted([1, 2, 9], 1)).toBe(9);
    expect(quantiles([7])).toEqual({ min: 7, p5: 7, p25: 7, p50: 7, p75: 7, p95: 7, max: 7 });
  });
});
