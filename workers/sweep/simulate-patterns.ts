/**
 * Simulated CSR patterns for the Monte Carlo reference: pattern r holds n points uniform in the valid region,
 * drawn with the generator seeded by deriveSeed(seed, r) (and Morton-sorted when large), so that every pattern
 * is the same whatever the thread that drew it.
 */
import { mortonSort } from '../placement/index.js';
import { createRandom, deriveSeed, type CsrSampler } from '../random/index.js';
import type { PatternSampler } from '../baseline/baseline-sampler.js';

/** Patterns from this many points are Morton-sorted; smaller count arrays stay in cache anyway. */
export const MORTON_FROM_POINTS = 65536;

/**
 * Writes patterns first .. first + count - 1 into `out` (pattern r at r * n * 2, interleaved x, y).
 * The sampler (workers/random createCsrSampler) is built once per region by the caller.
 * Cost O(count n) (sampling plus, for large patterns, the radix Morton sort).
 * Reference: J. Besag and P. J. Diggle (1977), Applied Statistics 26:327-333 (CSR patterns given n).
 */
export function simulatePatterns(sampler: CsrSampler | PatternSampler, pointCount: number, seed: number, first: number, count: number, out: Float64Array): void {
  const length = pointCount * 2;
  for (let r = first; r < first + count; r++) {
    const xy = sampler.sample(pointCount, createRandom(deriveSeed(seed, r)));
    if (pointCount >= MORTON_FROM_POINTS) mortonSort(xy, out.subarray(r * length, (r + 1) * length));
    else out.set(xy, r * length);
  }
}
