import type { SizeSummary } from '../contracts.js';
import type { CellShape } from '../../workers/lattice/cell-shape.js';
import { orderSizes, sideLabel } from './size-label.js';

/** Why the CSR envelope is missing from the chart of `measure`, or null when every size has one. */
export function envelopeNote(sizes: readonly SizeSummary[], measure: SpreadMeasure): string | null {
  const simulated = sizes.filter((size) => size.monteCarlo);
  if (simulated.length === 0) return 'No CSR envelope: this sweep ran no CSR simulations (set CSR simulations above 0 to get one)';
  if (measure === 'vmr') {
    return 'No CSR envelope for VMR: the simulations summarise chi-square / df (equal to VMR only when every kept cell is whole); choose chi-square / df to see it';
  }
  return simulated.length < sizes.length ? 'The CSR envelope is shown for the cell sides that were simulated' : null;
}

/** Which dispersion measure the cell-size chart spreads: chi2/df (index of dispersion per df) or VMR. */
export type SpreadMeasure = 'chi2PerDf' | 'vmr';

/** One series per statistic of the spread across placements, one value per cell size. */
export interface CellSizeSeries {
  measure: SpreadMeasure;
  labels: string[];
  cellSizes: number[];
  /** each entry's cell shape (a sweep of two shapes has two entries per cell side) */
  shapes: CellShape[];
  sizeIndex: number[];
  p5: number[];
  p25: number[];
  median: number[];
  p75: number[];
  p95: number[];
  /** CSR envelope (2.5 and 97.5 % of simulated medians of chi2/df); null without simulations or for VMR */
  envelopeLo: (number | null)[];
  envelopeHi: (number | null)[];
  /** why the chart shows no CSR envelope (or only for some sizes), in words; null when every size has one */
  envelopeNote: string | null;
  /** the reference placement's value (angle 0, offset (0,0)) */
  reference: number[];
  referenceInTail: boolean[];
  referencePlacementIndex: number[];
}

/**
 * Shapes the per-size summaries into the cell-size chart's series. The CSR envelope is computed by the summary
 * on chi2/df only, so it is shown only for that measure.
 */
export function cellSizeSeries(sizes: readonly SizeSummary[], measure: SpreadMeasure): CellSizeSeries {
  const ordered = orderSizes(sizes);
  const quantile = (size: SizeSummary) => (measure === 'vmr' ? size.vmr : size.chi2PerDf);
  const envelope = (size: SizeSummary) =>
    measure === 'chi2PerDf' && size.monteCarlo ? size.monteCarlo.envelope : null;
  return {
    measure,
    labels: ordered.map(sideLabel),
    cellSizes: ordered.map((size) => size.cellSize),
    shapes: ordered.map((size) => size.shape ?? 'square'),
    sizeIndex: ordered.map((size) => size.sizeIndex),
    p5: ordered.map((size) => quantile(size).p5),
    p25: ordered.map((size) => quantile(size).p25),
    median: ordered.map((size) => quantile(size).p50),
    p75: ordered.map((size) => quantile(size).p75),
    p95: ordered.map((size) => quantile(size).p95),
    envelopeLo: ordered.map((size) => envelope(size)?.lo ?? null),
    envelopeHi: ordered.map((size) => envelope(size)?.hi ?? null),
    envelopeNote: envelopeNote(ordered, measure),
    reference: ordered.map((size) => size.reference[measure]),
    referenceInTail: ordered.map((size) => size.referenceInTail),
    referencePlacementIndex: ordered.map((size) => size.reference.placementIndex),
  };
}

export function measureLabel(measure: SpreadMeasure): string {
  return measure === 'vmr' ? 'variance-to-mean ratio (VMR)' : 'chi-square / df';
}
