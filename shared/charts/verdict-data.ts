import type { SizeSummary } from '../contracts.js';
import type { Verdict } from '../../workers/types.js';
import { formatPercent } from '../format.js';
import { orderSizes, sideLabel } from './size-label.js';

/** Verdict shares per cell size, in percent of placements, and the agreement. */
export interface VerdictSeries {
  labels: string[];
  sizeIndex: number[];
  clustered: number[];
  csr: number[];
  regular: number[];
  /** agreement in percent: share of placements with the most common verdict */
  agreement: number[];
  mostCommon: Verdict[];
}

/** Shapes per-size verdict shares (0..1) into percentages ordered by cell size, labels carrying the agreement. */
export function verdictSeries(sizes: readonly SizeSummary[]): VerdictSeries {
  const ordered = orderSizes(sizes);
  return {
    labels: ordered.map((size) => `${sideLabel(size)} (agreement ${formatPercent(size.agreement)})`),
    sizeIndex: ordered.map((size) => size.sizeIndex),
    clustered: ordered.map((size) => 100 * size.verdictShares.clustered),
    csr: ordered.map((size) => 100 * size.verdictShares.csr),
    regular: ordered.map((size) => 100 * size.verdictShares.regular),
    agreement: ordered.map((size) => 100 * size.agreement),
    mostCommon: ordered.map((size) => size.mostCommon),
  };
}
