import type { AngleSeries } from './angle-data.js';
import { axis, baseOptions, type ChartSpec } from './chart-spec.js';
import { formatNumber } from '../format.js';
import { NEUTRAL, OKABE_ITO, VERDICT_COLOURS, withAlpha } from './palette.js';
import { verdictWords } from '../verdict-words.js';
import type { Verdict } from '../../workers/types.js';

/**
 * Marker of each verdict, colour AND shape so that it reads without colour vision (and in greyscale print):
 * clustered a filled square, regular a diamond, no departure a small open circle.
 */
export const VERDICT_MARKERS: Readonly<Record<Verdict, { pointStyle: string; radius: number; fill: number }>> = {
  clustered: { pointStyle: 'rect', radius: 4.5, fill: 0.8 },
  regular: { pointStyle: 'rectRot', radius: 5, fill: 0.8 },
  csr: { pointStyle: 'circle', radius: 3.5, fill: 0.15 },
};

const VERDICT_ORDER: readonly Verdict[] = ['clustered', 'regular', 'csr'];

/**
 * Scatter of VMR against grid angle for one cell size: one series per verdict (colour and shape), the reference
 * placement marked, the line at 1. Each dot's tooltip names its placement (number, offset, angle, VMR, verdict).
 * The angle axis spans the lattice's period (90 degrees for squares, 60 for hexagons).
 */
export function angleChartSpec(series: AngleSeries, cellSizeLabel: string, anglePeriod = 90): ChartSpec {
  const datasets: Record<string, unknown>[] = VERDICT_ORDER.map((verdict) => {
    const marker = VERDICT_MARKERS[verdict];
    const points = series.points.filter((point) => point.verdict === verdict);
    return {
      type: 'scatter',
      label: `${verdictWords(verdict)} (${points.length})`,
      data: points,
      pointStyle: marker.pointStyle,
      backgroundColor: withAlpha(VERDICT_COLOURS[verdict], marker.fill),
      borderColor: VERDICT_COLOURS[verdict],
      borderWidth: 1.2,
      pointRadius: marker.radius,
      pointHoverRadius: marker.radius + 2.5,
      legendHidden: points.length === 0,
      order: 2,
    };
  });
  datasets.push(
    {
      type: 'line',
      label: '1 = CSR expectation',
      pointStyle: 'line',
      data: [{ x: 0, y: 1 }, { x: anglePeriod, y: 1 }],
      borderColor: NEUTRAL.ink,
      borderDash: [6, 4],
      borderWidth: 1,
      pointRadius: 0,
      order: 3,
    },
  );
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
    x: axis('grid angle (degrees, counter-clockwise)', { type: 'linear', min: 0, max: anglePeriod }),
    y: axis('variance-to-mean ratio, VMR (ratio)', { grace: '5%' }),
  });
  return { type: 'scatter', data: { datasets }, options };
}

export function angleTable(series: AngleSeries): { head: string[]; rows: string[][] } {
  return {
    head: ['placement', 'offset (u, v) in cells', 'angle (degrees)', 'VMR', 'verdict'],
    rows: series.points.map((point) => [
      String(point.placementIndex),
      `${formatNumber(point.u, 3)}, ${formatNumber(point.v, 3)}`,
      formatNumber(point.x, 4),
      formatNumber(point.y, 4),
      verdictWords(point.verdict),
    ]),
  };
}
