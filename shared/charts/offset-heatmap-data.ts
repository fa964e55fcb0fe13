import type { PlacementRow } from '../contracts.js';
import { sequentialColour } from './palette.js';

/** One bin of the offset heat map: offsets u in [uFrom, uTo), v in [vFrom, vTo). */
export interface OffsetBin {
  uBin: number;
  vBin: number;
  uFrom: number;
  uTo: number;
  vFrom: number;
  vTo: number;
  /** mean VMR of the placements in the bin; null when the bin is empty */
  meanVmr: number | null;
  count: number;
  /** the placement nearest the bin centre, for clicking; null when empty */
  nearestPlacement: number | null;
  colour: string;
}

export interface OffsetHeatmap {
  bins: number;
  /** bins[vBin * bins + uBin] */
  cells: OffsetBin[];
  min: number | null;
  max: number | null;
  /** the VMR values at the two ends of the colour ramp */
  colourLow: number | null;
  colourHigh: number | null;
  /** true when the bin means lie so close together that the ramp was widened around them (not stretched) */
  widened: boolean;
  /** one sentence stating the colour range, and why it was widened when it was */
  rangeNote: string;
}

/**
 * Narrowest colour range, as a share of the middle of the bin means: a spread below 20 % of the level (e.g. VMR
 * 13.0 to 13.6) is drawn on a ramp of +-10 % around the middle, so that near-equal values look near-equal instead of
 * being stretched to full contrast. The 20 % is our choice for legibility, not a published rule.
 */
export const MIN_RELATIVE_COLOUR_SPAN = 0.2;

function threeDigits(value: number): string {
  return String(Number(value.toPrecision(3)));
}

/** The colour ramp's ends for bin means from min to max, and whether it had to be widened. */
export function colourRange(min: number | null, max: number | null): Pick<OffsetHeatmap, 'colourLow' | 'colourHigh' | 'widened' | 'rangeNote'> {
  if (min === null || max === null) return { colourLow: null, colourHigh: null, widened: false, rangeNote: 'no placements' };
  const middle = (min + max) / 2;
  const narrowest = MIN_RELATIVE_COLOUR_SPAN * Math.abs(middle);
  if (max - min >= narrowest || narrowest === 0) {
    return { colourLow: min, colourHigh: max, widened: false, rangeNote: `colours span mean VMR ${threeDigits(min)} (dark) to ${threeDigits(max)} (light), the range of the bins` };
  }
  const low = Math.max(0, middle - narrowest / 2);
  const high = low + narrowest;
  const percent = middle !== 0 ? ((max - min) / Math.abs(middle)) * 100 : 0;
  return {
    colourLow: low,
    colourHigh: high,
    widened: true,
    rangeNote:
      `colours span mean VMR ${threeDigits(low)} (dark) to ${threeDigits(high)} (light): the bins range only from ` +
      `${threeDigits(min)} to ${threeDigits(max)} (${percent.toPrecision(2)} % of the level), so the offset barely matters; ` +
      'the colours are not stretched to full contrast',
  };
}

/** Default number of bins per axis: about two placements per bin, between 2 and 10 (a readable grid). */
export function defaultOffsetBins(placements: number): number {
  return Math.min(10, Math.max(2, Math.round(Math.sqrt(placements / 2))));
}

/**
 * Heat map of VMR over the grid offsets (u, v) of one cell size: the unit square of offsets cut into bins x bins
 * equal squares, each holding the mean VMR of the placements whose offset falls in it (all angles pooled).
 * Colour: position of the mean on the sequential ramp between the ends given by colourRange (the smallest and
 * largest bin mean, widened when they lie within MIN_RELATIVE_COLOUR_SPAN of each other).
 * Cost O(placements + bins^2).
 */
export function offsetHeatmap(rows: readonly PlacementRow[], sizeIndex: number, bins: number): OffsetHeatmap {
  const ofSize = rows.filter((row) => row.sizeIndex === sizeIndex && Number.isFinite(row.vmr));
  const sums = new Float64Array(bins * bins);
  const counts = new Uint32Array(bins * bins);
  const nearest: (PlacementRow | null)[] = new Array(bins * bins).fill(null);
  const binOf = (offset: number) => Math.min(bins - 1, Math.max(0, Math.floor(offset * bins)));
  const distance = (row: PlacementRow, uBin: number, vBin: number) =>
    Math.hypot(row.u - (uBin + 0.5) / bins, row.v - (vBin + 0.5) / bins);
  for (const row of ofSize) {
    const uBin = binOf(row.u);
    const vBin = binOf(row.v);
    const key = vBin * bins + uBin;
    sums[key] += row.vmr;
    counts[key] += 1;
    const current = nearest[key];
    if (current === null || distance(row, uBin, vBin) < distance(current, uBin, vBin)) nearest[key] = row;
  }
  const means = Array.from(sums, (sum, key) => (counts[key] > 0 ? sum / counts[key] : null));
  const filled = means.filter((mean): mean is number => mean !== null);
  const min = filled.length > 0 ? Math.min(...filled) : null;
  const max = filled.length > 0 ? Math.max(...filled) : null;
  const range = colourRange(min, max);
  const position = (mean: number | null) => {
    if (mean === null || range.colourLow === null || range.colourHigh === null) return Number.NaN;
    const { colourLow: low, colourHigh: high } = range;
    return high > low ? (mean - low) / (high - low) : 0.5;
  };
  const cells: OffsetBin[] = means.map((meanVmr, key) => {
    const uBin = key % bins;
    const vBin = Math.floor(key / bins);
    return {
      uBin,
      vBin,
      uFrom: uBin / bins,
      uTo: (uBin + 1) / bins,
      vFrom: vBin / bins,
      vTo: (vBin + 1) / bins,
      meanVmr,
      count: counts[key],
      nearestPlacement: nearest[key]?.placementIndex ?? null,
      colour: sequentialColour(position(meanVmr)),
    };
  });
  return { bins, cells, min, max, ...range };
}
