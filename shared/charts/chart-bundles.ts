import type { PlacementRow, SweepSummary } from '../contracts.js';
import { angleSeries } from './angle-data.js';
import { angleChartSpec, angleTable } from './angle-chart.js';
import { cellSizeSeries, type SpreadMeasure } from './cell-size-data.js';
import { cellSizeChartSpec, cellSizeTable } from './cell-size-chart.js';
import type { ChartBundle } from './chart-spec.js';
import { sideLabel } from './size-label.js';
import { latticeOf } from '../../workers/lattice/registry.js';
import { monteCarloHistograms } from './histogram-data.js';
import { monteCarloChartSpec, monteCarloTable } from './monte-carlo-chart.js';
import { defaultOffsetBins, offsetHeatmap } from './offset-heatmap-data.js';
import { offsetHeatmapChartSpec, offsetHeatmapTable } from './offset-heatmap-chart.js';
import { verdictSeries } from './verdict-data.js';
import { verdictChartSpec, verdictTable } from './verdict-chart.js';

/** The whole-sweep charts: spread by cell size and verdict shares. */
export function overviewBundles(summary: SweepSummary, measure: SpreadMeasure = 'chi2PerDf'): ChartBundle[] {
  const spread = cellSizeSeries(summary.sizes, measure);
  const verdicts = verdictSeries(summary.sizes);
  return [
    {
      id: 'cell-size',
      title: 'Spread across placements by cell size',
      spec: cellSizeChartSpec(spread, summary.plan.placements),
      table: { caption: 'Spread across placements by cell size', ...cellSizeTable(spread) },
    },
    {
      id: 'verdicts',
      title: 'Verdicts by cell size',
      spec: verdictChartSpec(verdicts, summary.plan.alpha),
      table: { caption: 'Verdict shares by cell size', ...verdictTable(verdicts) },
    },
  ];
}

/** The charts of one cell size: VMR against angle, VMR over offsets, and the Monte Carlo histogram when simulated. */
export function sizeBundles(summary: SweepSummary, rows: readonly PlacementRow[], sizeIndex: number): ChartBundle[] {
  const size = summary.sizes.find((candidate) => candidate.sizeIndex === sizeIndex);
  if (!size) return [];
  const sizeLabel = sideLabel(size);
  const angles = angleSeries(rows, sizeIndex, size.reference.placementIndex);
  const heatmap = offsetHeatmap(rows, sizeIndex, defaultOffsetBins(size.placements));
  const bundles: ChartBundle[] = [
    {
      id: `angle-${sizeIndex}`,
      title: `VMR against angle, ${sizeLabel}`,
      spec: angleChartSpec(angles, sizeLabel, latticeOf(size.shape ?? 'square').anglePeriod),
      table: { caption: `VMR of each placement against its angle, cell side ${sizeLabel}`, ...angleTable(angles) },
    },
    {
      id: `offsets-${sizeIndex}`,
      title: `VMR over offsets, ${sizeLabel}`,
      spec: offsetHeatmapChartSpec(heatmap, sizeLabel),
      table: { caption: `Mean VMR by offset bin, cell side ${sizeLabel}`, ...offsetHeatmapTable(heatmap) },
    },
  ];
  if (size.monteCarlo && size.monteCarlo.sims > 0) {
    const histograms = monteCarloHistograms(size.monteCarlo);
    bundles.push({
      id: `monte-carlo-${sizeIndex}`,
      title: `Monte Carlo test, ${sizeLabel}`,
      spec: monteCarloChartSpec(histograms, size.monteCarlo, sizeLabel),
      table: { caption: `Simulated medians and maxima of chi-square / df, cell side ${sizeLabel}`, ...monteCarloTable(histograms) },
    });
  }
  return bundles;
}
