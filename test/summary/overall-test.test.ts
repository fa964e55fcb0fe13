import { describe, expect, it } from 'vitest';
import { overallMonteCarloTest, type OverallTestSize } from '../../server/summary/overall-test.js';
import { seededRandom } from '../fixtures/seeded-random.js';
import { smallestWorkingSims, simsCanReject, tooFewSimsMessage } from '../../shared/monte-carlo-rule.js';

/** Standard normal by Box-Muller from a seeded uniform generator. */
function normal(random: () => number): number {
  return Math.sqrt(-2 * Math.log(1 - random())) * Math.cos(2 * Math.PI * random());
}

/**
 * K sizes of R + 1 exchangeable patterns: pattern k's median at size s is a shared pattern effect plus noise
 * (sizes correlate, as medians of one pattern at nearby cell sizes do); pattern 0 is the observed one.
 */
function nullSizes(random: () => number, sizes: number, sims: number, shift = 0, shiftSize = 0): OverallTestSize[] {
  const effects = Array.from({ length: sims + 1 }, () => normal(random));
  return Array.from({ length: sizes }, (_, s) => {
    const medians = effects.map((effect) => 1 + 0.1 * (0.7 * effect + 0.7 * normal(random)));
    if (s === shiftSize) medians[0] += shift;
    return { cellSize: 100 + 50 * s, monteCarlo: { observedMedian: medians[0]!, simulatedMedians: medians.slice(1) } };
  });
}

describe('overallMonteCarloTest', () => {
  // Besag & Diggle (1977): with exchangeable patterns P(p <= k/(R+1)) = k/(R+1). Exchangeable null draws, 3 sizes,
  // R = 19: the rejection rate at alpha 0.05 stays within binomial error of 5 % (4000 replicates, sd 0.34 %).
  it('rejects exchangeable null data at most at rate alpha (3 sizes, both tails, R = 19)', () => {
    const random = seededRandom(2024);
    let rejections = 0;
    const replicates = 4000;
    for (let k = 0; k < replicates; k++) if (overallMonteCarloTest(nullSizes(random, 3, 19), 0.05)!.rejects) rejections += 1;
    const rate = rejections / replicates;
    expect(rate).toBeLessThanOrEqual(0.05 + 3 * Math.sqrt((0.05 * 0.95) / replicates));
    expect(rate).toBeGreaterThan(0.03); // and it is not trivially conservative
  });

  it('finds a marked departure at one size and names the size and the direction', () => {
    const random = seededRandom(5);
    const up = overallMonteCarloTest(nullSizes(random, 3, 99, 2, 1), 0.05)!;
    expect(up.p).toBeCloseTo(1 / 100, 12);
    expect(up.rejects).toBe(true);
    expect(up.direction).toBe('clustered');
    expect(up.strongestCellSize).toBe(150);
    const down = overallMonteCarloTest(nullSizes(random, 3, 99, -2, 2), 0.05)!;
    expect(down.direction).toBe('regular');
    expect(down.strongestCellSize).toBe(200);
  });

  it('counts a simulated median that is not a number as at least as extreme (conservative)', () => {
    const sizes: OverallTestSize[] = [{ cellSize: 100, monteCarlo: { observedMedian: 5, simulatedMedians: [1, 1.1, Number.NaN, 0.9] } }];
    expect(overallMonteCarloTest(sizes, 0.5)!.p).toBeCloseTo(2 / 5, 12);
  });

  it('returns null without simulations', () => {
    expect(overallMonteCarloTest([{ cellSize: 1, monteCarlo: { observedMedian: 1, simulatedMedians: [] } }], 0.05)).toBeNull();
    expect(overallMonteCarloTest([], 0.05)).toBeNull();
  });
});

describe('Monte Carlo rule (shared/monte-carlo-rule.ts)', () => {
  // 1/(R+1) <= alpha  <=>  R >= ceil(1/alpha) - 1 (Besag & Diggle 1977: the smallest attainable p is 1/(R+1))
  it('needs R >= ceil(1/alpha) - 1', () => {
    expect(smallestWorkingSims(0.05)).toBe(19);
    expect(smallestWorkingSims(0.01)).toBe(99);
    expect(smallestWorkingSims(0.1)).toBe(9);
    expect(smallestWorkingSims(0.03)).toBe(33);
    expect(smallestWorkingSims(0.5)).toBe(1);
    expect(simsCanReject(9, 0.05)).toBe(false);
    expect(simsCanReject(19, 0.05)).toBe(true);
    for (const alpha of [0.5, 0.2, 0.1, 0.05, 0.03, 0.02, 0.01, 0.001]) {
      const least = smallestWorkingSims(alpha);
      expect(1 / (least + 1)).toBeLessThanOrEqual(alpha * (1 + 1e-12));
      if (least > 1) expect(1 / least).toBeGreaterThan(alpha);
    }
  });

  it('refuses too few sims and names the least that works; sims 0 is allowed', () => {
    expect(tooFewSimsMessage(9, 0.05)).toMatch(/use sims of at least 19/);
    expect(tooFewSimsMessage(0, 0.05)).toBeNull();
    expect(tooFewSimsMessage(19, 0.05)).toBeNull();
  });
});
