import type { MonteCarloResult } from '../contracts.js';
import { axis, baseOptions, type ChartSpec } from './chart-spec.js';
import { formatNumber, formatP, pPhrase } from '../format.js';
import type { MonteCarloHistograms, ObservedMark } from './histogram-data.js';
import { stepPoints } from './histogram-data.js';
import { NEUTRAL, OKABE_ITO, withAlpha } from './palette.js';

/**
 * Histograms of the simulated CSR patterns' median and maximum of chi2/df across placements, with the observed
 * median and maximum as vertical lines and their Monte Carlo p-values (Besag & Diggle 1977) in the subtitle.
 */
export function monteCarloChartSpec(histograms: MonteCarloHistograms, result: MonteCarloResult, cellSizeLabel: string): ChartSpec {
  const top = Math.max(1, ...histograms.medians, ...histograms.maxima) * 1.08;
  // legend icons are drawn from pointStyle, borderColor and backgroundColor: a filled box for each histogram in its
  // own colours, a line for each marker in its colour and dash
  const step = (label: string, counts: number[], colour: string) => ({
    type: 'line',
    label,
    data: stepPoints(histograms.edges, counts),
    tension: 0,
    fill: 'origin',
    borderColor: colour,
    backgroundColor: withAlpha(colour, 0.3),
    borderWidth: 1.5,
    pointRadius: 0,
    pointStyle: 'rect',
  });
  const marker = (what: string, mark: ObservedMark, colour: string, dash: number[]) => ({
    type: 'line',
    label: `${what} ${formatNumber(mark.value)}${mark.offScale === null ? '' : ` (far ${mark.offScale === 'above' ? 'above' : 'below'} every simulated value: drawn at the axis end)`}`,
    data: [{ x: mark.shownAt, y: 0 }, { x: mark.shownAt, y: top }],
    borderColor: colour,
    backgroundColor: colour,
    borderWidth: 2.5,
    borderDash: dash,
    pointRadius: 0,
    pointStyle: 'line',
    fill: false,
  });
  const datasets = [
    step(`simulated medians (${result.sims} CSR patterns)`, histograms.medians, OKABE_ITO.blue),
    step('simulated maxima', histograms.maxima, OKABE_ITO.orange),
    marker('observed median', histograms.median, NEUTRAL.ink, []),
    marker('observed maximum', histograms.max, OKABE_ITO.vermillion, [6, 4]),
  ];
  const subtitle = [
    `Cell side ${cellSizeLabel}. Median across placements: ${pPhrase(result.pMedianClustered)} for clustering, ${formatP(result.pMedianRegular)} for regularity.`,
    `Maximum across placements (worst-case choice of grid): ${pPhrase(result.pMaxClustered)} for clustering.`,
  ];
  const options = baseOptions('Monte Carlo test against CSR: chi-square / df across placements', subtitle, {
    x: axis('chi-square / df, median or maximum over placements (ratio)', { type: 'linear', min: histograms.axisMin, max: histograms.axisMax }),
    y: axis('simulated patterns (count)', { min: 0, max: Math.ceil(top) }),
  });
  return { type: 'scatter', data: { datasets }, options };
}

export function monteCarloTable(histograms: MonteCarloHistograms): { head: string[]; rows: string[][] } {
  return {
    head: ['chi-square / df from', 'to', 'simulated medians', 'simulated maxima'],
    rows: histograms.medians.map((count, bin) => [
      formatNumber(histograms.edges[bin], 4),
      formatNumber(histograms.edges[bin + 1], 4),
      String(count),
      String(histograms.maxima[bin]),
    ]),
  };
}
