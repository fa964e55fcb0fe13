import { axis, baseOptions, type ChartSpec } from './chart-spec.js';
import { formatNumber } from '../format.js';
import { VERDICT_COLOURS } from './palette.js';
import { verdictWords } from '../verdict-words.js';
import type { VerdictSeries } from './verdict-data.js';

/** Stacked bars: per cell size, the percentage of placements whose verdict is clustered, CSR or regular. */
export function verdictChartSpec(series: VerdictSeries, alpha: number): ChartSpec {
  const bar = (label: string, data: number[], colour: string) => ({
    type: 'bar',
    label,
    data,
    backgroundColor: colour,
    borderColor: '#ffffff',
    borderWidth: 1,
    barPercentage: 0.6,
  });
  const datasets = [
    bar('clustered', series.clustered, VERDICT_COLOURS.clustered),
    bar(verdictWords('csr'), series.csr, VERDICT_COLOURS.csr),
    bar('regular', series.regular, VERDICT_COLOURS.regular),
  ];
  const subtitle = [`Two-sided test at alpha ${formatNumber(alpha)}; agreement = share of placements with the most common verdict`];
  const options = baseOptions('Verdicts across grid placements, by cell size', subtitle, {
    x: axis('cell side (m)', { stacked: true }),
    y: axis('placements (%)', { stacked: true, min: 0, max: 100 }),
  });
  return { type: 'bar', data: { labels: series.labels, datasets }, options };
}

export function verdictTable(series: VerdictSeries): { head: string[]; rows: string[][] } {
  return {
    head: ['cell side', 'clustered %', 'CSR %', 'regular %', 'agreement %'],
    rows: series.labels.map((label, k) => [
      label.replace(/ \(agreement.*$/, ''),
      formatNumber(series.clustered[k]),
      formatNumber(series.csr[k]),
      formatNumber(series.regular[k]),
      formatNumber(series.agreement[k]),
    ]),
  };
}
