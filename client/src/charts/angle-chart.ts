import type { AngleSeries } from './angle-data.js';
import { axis, baseOptions, type ChartSpec } from './chart-spec.js';
import { formatNumber } from './format.js';
import { NEUTRAL, OKABE_ITO, withAlpha } from './palette.js';

/** Scatter of VMR against grid angle for one cell size, the reference placement marked, the line at 1. */
export function angleChartSpec(series: AngleSeries, cellSizeLabel: string): ChartSpec {
  const datasets: Record<string, unknown>[] = [
    {
      type: 'scatter',
      label: 'placements',
      data: series.points,
      backgroundColor: withAlpha(OKABE_ITO.blue, 0.55),
      borderColor: OKABE_ITO.blue,
      pointRadius: 3.5,
      pointHoverRadius: 6,
      order: 2,
    },
    {
      type: 'line',
      label: '1 = CSR expectation',
      data: [{ x: 0, y: 1 }, { x: 90, y: 1 }],
      borderColor: NEUTRAL.ink,
      borderDash: [6, 4],
      borderWidth: 1,
      pointRadius: 0,
      order: 3,
    },
  ];
  if (series.reference) {
    datasets.push({
      type: 'scatter',
      label: 'reference placement',
      data: [series.reference],
      pointStyle: 'triangle',
      pointRadius: 8,
      backgroundColor: OKABE_ITO.yellow,
      borderColor: NEUTRAL.ink,
      borderWidth: 1.5,
      clip: 12,
      order: 1,
    });
  }
  const subtitle = series.singleAngle
    ? [`Cell side ${cellSizeLabel}; rotation was off, so every placement has the same angle`]
    : [`Cell side ${cellSizeLabel}; each dot is one grid placement`];
  const options = baseOptions('VMR against grid angle', subtitle, {
    x: axis('grid angle (degrees, counter-clockwise)', { type: 'linear', min: 0, max: 90 }),
    y: axis('variance-to-mean ratio, VMR (ratio)', { grace: '5%' }),
  });
  return { type: 'scatter', data: { datasets }, options };
}

export function angleTable(series: AngleSeries): { head: string[]; rows: string[][] } {
  return {
    head: ['placement', 'angle (degrees)', 'VMR'],
    rows: series.points.map((point) => [String(point.placementIndex), formatNumber(point.x, 4), formatNumber(point.y, 4)]),
  };
}
