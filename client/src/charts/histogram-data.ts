import type { MonteCarloResult } from '../../../server/contracts.js';

/** Equal-width bins: edges[0..k] and counts[0..k-1]; a value v falls in [edges[i], edges[i+1]), the last bin closed. */
export interface Histogram {
  edges: number[];
  counts: number[];
}

/**
 * Number of bins by Sturges' rule, k = ceil(log2 n) + 1 (Sturges H. A., 1926, "The choice of a class interval",
 * Journal of the American Statistical Association 21:65-66), at least 1.
 */
export function sturgesBins(n: number): number {
  return n <= 1 ? 1 : Math.ceil(Math.log2(n)) + 1;
}

/** Evenly spaced edges from lo to hi in `bins` steps; a zero-width range is widened by 0.5 each side. */
export function equalEdges(lo: number, hi: number, bins: number): number[] {
  const from = hi > lo ? lo : lo - 0.5;
  const to = hi > lo ? hi : hi + 0.5;
  return Array.from({ length: bins + 1 }, (_, k) => (k === bins ? to : from + ((to - from) * k) / bins));
}

/** Counts of `values` in the bins of `edges`; values outside [edges[0], edges[k]] are not counted. Cost O(n). */
export function histogram(values: readonly number[], edges: readonly number[]): Histogram {
  const bins = edges.length - 1;
  const counts = new Array<number>(bins).fill(0);
  const lo = edges[0];
  const hi = edges[bins];
  const width = (hi - lo) / bins;
  for (const value of values) {
    if (!Number.isFinite(value) || value < lo || value > hi) continue;
    let bin = Math.min(bins - 1, Math.floor((value - lo) / width));
    while (bin > 0 && value < edges[bin]) bin -= 1;
    while (bin < bins - 1 && value >= edges[bin + 1]) bin += 1;
    counts[bin] += 1;
  }
  return { edges: [...edges], counts };
}

/** The Monte Carlo histograms: simulated medians and maxima of chi2/df over common edges covering the observed. */
export interface MonteCarloHistograms {
  edges: number[];
  medians: number[];
  maxima: number[];
  observedMedian: number;
  observedMax: number;
}

export function monteCarloHistograms(result: MonteCarloResult): MonteCarloHistograms {
  const all = [...result.simulatedMedians, ...result.simulatedMaxima, result.observedMedian, result.observedMax].filter(
    (value) => Number.isFinite(value),
  );
  const lo = Math.min(...all);
  const hi = Math.max(...all);
  const edges = equalEdges(lo, hi, Math.max(sturgesBins(result.simulatedMedians.length), 5));
  return {
    edges,
    medians: histogram(result.simulatedMedians, edges).counts,
    maxima: histogram(result.simulatedMaxima, edges).counts,
    observedMedian: result.observedMedian,
    observedMax: result.observedMax,
  };
}

/**
 * A histogram's outline as the vertices of a plain polyline: up from the baseline at the first edge, across each
 * bin at its count, down to the baseline after the last: (e0, 0), (e0, c0), (e1, c0), (e1, c1), ..., (ek, c_k-1),
 * (ek, 0). Filled to the origin it draws the bars without relying on a stepped-line mode.
 */
export function stepPoints(edges: readonly number[], counts: readonly number[]): { x: number; y: number }[] {
  const points: { x: number; y: number }[] = [{ x: edges[0], y: 0 }];
  counts.forEach((count, bin) => {
    points.push({ x: edges[bin], y: count }, { x: edges[bin + 1], y: count });
  });
  points.push({ x: edges[edges.length - 1], y: 0 });
  return points;
}
