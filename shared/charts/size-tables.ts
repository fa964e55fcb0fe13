/**
 * The two result tables of a sweep, one row per (cell size, shape) entry: the spread, verdict shares and the
 * Monte Carlo p per entry, the placement-robust Monte Carlo test in full and, against a baseline, the area-only and
 * baseline verdicts side by side. Built once here and drawn by the page
 * (results panel) and the report (server/report/report-sections.ts), so both always show the same numbers.
 */
import type { SweepSummary } from '../contracts.js';
import { nullName } from '../null-hypothesis.js';
import { formatNumber, formatP, formatPercent } from '../format.js';
import { orderSizes, sideLabel } from './size-label.js';

export interface TableData {
  caption: string;
  head: string[];
  rows: string[][];
}

/** Per entry: expected points, spread of chi2/df and VMR, verdict shares, agreement, reference rank, Monte Carlo p. */
export function sizeTableData(summary: SweepSummary): TableData {
  const rows = orderSizes(summary.sizes).map((size) => [
    sideLabel(size),
    formatNumber(size.expectedPerCell),
    String(size.placements),
    formatNumber(size.chi2PerDf.p50),
    `${formatNumber(size.chi2PerDf.p5)} to ${formatNumber(size.chi2PerDf.p95)}`,
    formatNumber(size.vmr.p50),
    formatPercent(size.verdictShares.clustered),
    formatPercent(size.verdictShares.csr),
    formatPercent(size.verdictShares.regular),
    formatPercent(size.agreement),
    `${formatNumber(size.reference.vmr)} (${formatPercent(size.referenceRank)})`,
    formatP(size.monteCarlo?.pMedianClustered),
  ]);
  const head = ['cell side', 'expected per cell', 'placements', 'median chi2/df', 'chi2/df 5-95 %', 'median VMR', 'clustered', 'CSR', 'regular', 'agreement', 'reference VMR (rank)', 'Monte Carlo p (median)'];
  return { caption: 'Results per cell size', head, rows };
}

/** The Monte Carlo test per simulated entry; null when the sweep ran no simulations. */
export function monteCarloTableData(summary: SweepSummary): TableData | null {
  const simulated = summary.sizes.filter((size) => size.monteCarlo && size.monteCarlo.sims > 0);
  if (simulated.length === 0) return null;
  const rows = orderSizes(simulated).map((size) => {
    const result = size.monteCarlo!;
    const meanShare = result.simulatedShareSignificant.reduce((sum, share) => sum + share, 0) / Math.max(1, result.simulatedShareSignificant.length);
    return [
      sideLabel(size),
      String(result.sims),
      formatNumber(result.observedMedian),
      `${formatNumber(result.envelope.lo)} to ${formatNumber(result.envelope.hi)}`,
      formatP(result.pMedianClustered),
      formatP(result.pMedianRegular),
      formatNumber(result.observedMax),
      formatP(result.pMaxClustered),
      formatP(result.pMinRegular),
      `${formatPercent(result.observedShareSignificant)} (CSR: ${formatPercent(meanShare)})`,
    ];
  });
  const head = ['cell side', 'sims', 'observed median chi2/df', 'CSR envelope', 'p clustered (median)', 'p regular (median)', 'observed maximum', 'p clustered (maximum)', 'p regular (minimum)', 'placements significant'];
  return { caption: 'Placement-robust Monte Carlo p-values', head, rows };
}

/**
 * Against a baseline (issue 15): per entry, the area-only verdict of the same placements (per-placement chi-square
 * against area, no Monte Carlo) beside the baseline verdict, so a reader sees how much of the "clustering" the
 * population explains. Null without a baseline. `note` says what the columns are, in words.
 */
export function baselineComparisonTableData(summary: SweepSummary): (TableData & { note: string }) | null {
  const baseline = summary.baseline ?? summary.dataset.baseline;
  if (baseline === undefined) return null;
  const words = (verdict: string, share: number) => `${verdict === 'csr' ? 'no departure' : verdict} in ${formatPercent(share)}`;
  const rows = orderSizes(summary.sizes).map((size) => [
    sideLabel(size),
    size.areaOnly === undefined ? 'n/a' : words(size.areaOnly.mostCommon, size.areaOnly.verdictShares[size.areaOnly.mostCommon]),
    size.areaOnly === undefined ? 'n/a' : formatNumber(size.areaOnly.chi2PerDfMedian),
    words(size.mostCommon, size.verdictShares[size.mostCommon]),
    formatNumber(size.chi2PerDf.p50),
    formatP(size.monteCarlo?.pMedianClustered),
  ]);
  const head = ['cell side', 'against area: verdict of placements', 'median chi2/df (area)', 'against the baseline: verdict of placements', 'median chi2/df (baseline)', 'Monte Carlo p (baseline, median)'];
  const note =
    `Against area the null is complete spatial randomness; against the baseline it is ${nullName(baseline)}. ` +
    'The area-only columns are per-placement chi-square verdicts (no Monte Carlo); the difference between the two shows how ' +
    'much of the apparent clustering the population at risk explains.';
  return { caption: 'Area-only and baseline verdicts per cell size', head, rows, note };
}
