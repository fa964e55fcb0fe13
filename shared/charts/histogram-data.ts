import type { MonteCarloResult } from '../contracts.js';

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

/** Where an observed value is drawn: at its value, or (off the scale) at the axis end it lies beyond. */
export interface ObservedMark {
  value: number;
  shownAt: number;
  /** 'above' / 'below' when the value lies far outside the simulated values and is drawn at the axis end */
  offScale: 'above' | 'below' | null;
}

/** The Monte Carlo histograms: simulated medians and maxima of chi2/df on common edges that resolve both. */
export interface MonteCarloHistograms {
  edges: number[];
  medians: number[];
  maxima: number[];
  observedMedian: number;
  observedMax: number;
  median: ObservedMark;
  max: ObservedMark;
  /** the x axis: the edges, plus room for an off-scale marker */
  axisMin: number;
  axisMax: number;
}

/**
 * An observed value further beyond the simulated values than this share of their range is drawn off the scale
 * (at the axis end, with its number) instead of stretching the axis until every simulated value shares one bin.
 */
export const FAR_OUTSIDE_SHARE = 0.5;
/** Bins across the narrower of the two simulated distributions, at least (so that its shape shows). */
export const BINS_PER_SPREAD = 5;
/** Most bins of the histogram. */
export const MAX_BINS = 120;
/** Room at the axis end for an off-scale marker, as a share of the binned range. */
const OFF_SCALE_ROOM = 0.12;

function spread(values: readonly number[]): number {
  return values.length === 0 ? 0 : Math.max(...values) - Math.min(...values);
}

/**
 * Common edges over the simulated medians and maxima (and the observed values that lie near them): equal bins,
 * at least max(Sturges, 5), and enough that the narrower simulated distribution spans BINS_PER_SPREAD bins (at most
 * MAX_BINS). Observed values far outside are marked at the axis end with their number.
 */
export function monteCarloHistograms(result: MonteCarloResult): MonteCarloHistograms {
  const medians = result.simulatedMedians.filter(Number.isFinite);
  const maxima = result.simulatedMaxima.filter(Number.isFinite);
  const simulated = [...medians, ...maxima];
  const observed = [result.observedMedian, result.observedMax].filter(Number.isFinite);
  const pool = simulated.length > 0 ? simulated : observed;
  const simLo = Math.min(...pool);
  const simHi = Math.max(...pool);
  const range = simHi > simLo ? simHi - simLo : Math.max(Math.abs(simLo) * 0.1, 0.5);
  const near = (value: number) => value >= simLo - FAR_OUTSIDE_SHARE * range && value <= simHi + FAR_OUTSIDE_SHARE * range;
  const shown = observed.filter(near);
  const lo = Math.min(simLo, ...shown);
  const hi = Math.max(simHi, ...shown);
  const narrowest = Math.min(...[spread(medians), spread(maxima)].filter((width) => width > 0));
  const resolving = Number.isFinite(narrowest) ? Math.ceil((BINS_PER_SPREAD * (hi - lo)) / narrowest) : 0;
  const bins = Math.min(MAX_BINS, Math.max(sturgesBins(medians.length), 5, resolving));
  const edges = equalEdges(lo, hi, bins);
  const first = edges[0]!;
  const last = edges[edges.length - 1]!;
  const room = (last - first) * OFF_SCALE_ROOM;
  const mark = (value: number): ObservedMark => {
    if (!Number.isFinite(value) || near(value)) return { value, shownAt: value, offScale: null };
    return value > last ? { value, shownAt: last + room, offScale: 'above' } : { value, shownAt: first - room, offScale: 'below' };
  };
  const median = mark(result.observedMedian);
  const max = mark(result.observedMax);
  const offScale = [median, max].filter((m) => m.offScale !== null);
  return {
    edges,
    medians: histogram(medians, edges).counts,
    maxima: histogram(maxima, edges).counts,
    observedMedian: result.observedMedian,
    observedMax: result.observedMax,
    median,
    max,
    axisMin: offScale.some((m) => m.offScale === 'below') ? first - 2 * room : first,
    axisMax: offScale.some((m) => m.offScale === 'above') ? last + 2 * room : last,
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
