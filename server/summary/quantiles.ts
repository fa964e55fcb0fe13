import type { Quantiles } from '../../shared/contracts.js';

/**
 * Sample quantile by linear interpolation between order statistics (Hyndman & Fan type 7, the default of
 * numpy.quantile and of R's quantile()).
 *
 * Formula: with the n values sorted ascending x[0] <= ... <= x[n-1], h = (n - 1) * p, lo = floor(h):
 * Q(p) = x[lo] + (h - lo) * (x[lo + 1] - x[lo]) (and x[n-1] when lo = n - 1). NaN for an empty list.
 * Cost O(1) on sorted input.
 *
 * Reference: R. J. Hyndman and Y. Fan (1996), "Sample quantiles in statistical packages", The American
 * Statistician 50(4):361-365, definition 7.
 */
export function quantileSorted(sorted: ArrayLike<number>, p: number): number {
  const n = sorted.length;
  if (n === 0) return Number.NaN;
  const h = (n - 1) * p;
  const lo = Math.floor(h);
  if (lo >= n - 1) return sorted[n - 1];
  return sorted[lo] + (h - lo) * (sorted[lo + 1] - sorted[lo]);
}

/** The finite values of a list, sorted ascending (NaN and infinities are left out). Cost O(n log n). */
export function sortedFinite(values: ArrayLike<number>): Float64Array {
  const kept: number[] = [];
  for (let index = 0; index < values.length; index++) {
    if (Number.isFinite(values[index])) kept.push(values[index]);
  }
  return Float64Array.from(kept).sort();
}

/** Median (type 7 quantile at 0.5) of the finite values. Cost O(n log n). Reference: as quantileSorted. */
export function median(values: ArrayLike<number>): number {
  return quantileSorted(sortedFinite(values), 0.5);
}

/**
 * Min, 5, 25, 50, 75, 95 % and max of the finite values, type 7 quantiles (see quantileSorted).
 * Every field is NaN when no value is finite. Cost O(n log n).
 */
export function quantiles(values: ArrayLike<number>): Quantiles {
  const sorted = sortedFinite(values);
  return {
    min: quantileSorted(sorted, 0),
    p5: quantileSorted(sorted, 0.05),
    p25: quantileSorted(sorted, 0.25),
    p50: quantileSorted(sorted, 0.5),
    p75: quantileSorted(sorted, 0.75),
    p95: quantileSorted(sorted, 0.95),
    max: quantileSorted(sorted, 1),
  };
}
