import type { CellSizeSeries } from './cell-size-data.js';
import { measureLabel } from './cell-size-data.js';
import { axis, baseOptions, type ChartSpec } from './chart-spec.js';
import { formatNumber } from '../format.js';
import { NEUTRAL, OKABE_ITO, withAlpha } from './palette.js';
import { CELL_SHAPES, type CellShape } from '../../workers/lattice/cell-shape.js';

/**
 * The cell-size chart: per cell size, the spread of the measure across placements (5-95 % band, quartile box,
 * median), the CSR envelope of simulated medians, the line at 1 (the CSR expectation) and the reference placement.
 */
export function cellSizeChartSpec(series: CellSizeSeries, placements: number): ChartSpec {
  const label = measureLabel(series.measure);
  const shapes = CELL_SHAPES.filter((shape) => series.shapes.includes(shape));
  const datasets = shapes.flatMap((shape) => shapeDatasets(series, shape, shapes.length > 1));
  const subtitle = [`${placements} placements per size; the triangle is the reference grid (angle 0, offset 0,0)`];
  if (shapes.length > 1) subtitle.push('Squares in blue, hexagons (area = side²) in orange, at the same cell sides');
  if (series.envelopeNote) subtitle.push(series.envelopeNote);
  const options = baseOptions(`Spread of ${label} across grid placements, by cell size`, subtitle, {
    x: axis('cell side (m)', { type: 'linear', ...cellSideBounds(series.cellSizes) }),
    y: axis(`${label} (ratio)`, { grace: '5%' }),
  });
  return { type: 'bar', data: { datasets }, options };
}

/** Colours of one shape's spread: squares blue (as in a one-shape sweep), hexagons orange. */
const SHAPE_COLOURS: Record<CellShape, { band: string; box: string }> = {
  square: { band: OKABE_ITO.skyBlue, box: OKABE_ITO.blue },
  hex: { band: OKABE_ITO.orange, box: OKABE_ITO.reddishPurple },
};

/**
 * The datasets of one shape's entries. Each point carries `entry`, its index in the series, so that a click finds
 * the cell size (and placement) behind it. With two shapes the labels name the shape; the CSR line is drawn once.
 */
function shapeDatasets(series: CellSizeSeries, shape: CellShape, named: boolean): Record<string, unknown>[] {
  const entries = series.shapes.flatMap((entryShape, k) => (entryShape === shape ? [k] : []));
  // points at their cell side on a linear metre axis (144, 161 and 254 m are not equally spaced)
  const at = <T>(values: readonly T[]) => entries.map((k) => ({ x: series.cellSizes[k]!, y: values[k]!, entry: k }));
  const suffix = named ? `, ${shape === 'hex' ? 'hexagons' : 'squares'}` : '';
  const { band, box } = SHAPE_COLOURS[shape];
  const line = (extra: Record<string, unknown>) => ({ type: 'line', pointRadius: 0, borderWidth: 1.5, fill: false, ...extra });
  const datasets: Record<string, unknown>[] = [
    line({ label: `5-95 % of placements${suffix}`, data: at(series.p5), borderColor: withAlpha(band, 0.6), backgroundColor: withAlpha(band, 0.22), fill: '+1', order: 6 }),
    line({ label: `95 % of placements${suffix}`, data: at(series.p95), borderColor: withAlpha(band, 0.6), order: 6, legendHidden: true }),
    { type: 'bar', label: `quartiles (25-75 %)${suffix}`, data: at(series.p25.map((low, k) => [low, series.p75[k]!])), backgroundColor: withAlpha(box, 0.35), borderColor: box, borderWidth: 1, barThickness: shape === 'hex' ? 7 : 12, order: 5 },
    line({ label: `median${suffix}`, data: at(series.median), borderColor: box, backgroundColor: box, borderWidth: 2.5, pointRadius: 4, pointStyle: shape === 'hex' ? 'rectRot' : 'circle', borderDash: shape === 'hex' ? [8, 3] : undefined, order: 2 }),
    line({ label: `reference placement${suffix}`, data: at(series.reference), showLine: false, pointStyle: 'triangle', pointRadius: 8, pointHoverRadius: 10, borderColor: NEUTRAL.ink, backgroundColor: shape === 'hex' ? OKABE_ITO.orange : OKABE_ITO.yellow, borderWidth: 1.5, order: 1 }),
  ];
  if (shape === series.shapes[0]) {
    datasets.push(line({ label: '1 = CSR expectation', data: series.labels.map((_, k) => ({ x: series.cellSizes[k]!, y: 1, entry: k })), borderColor: NEUTRAL.ink, borderDash: [6, 4], borderWidth: 1, order: 4 }));
  }
  if (entries.some((k) => series.envelopeLo[k] !== null)) {
    datasets.push(
      line({ label: `CSR envelope of medians (2.5-97.5 %)${suffix}`, data: at(series.envelopeLo), borderColor: OKABE_ITO.vermillion, borderDash: shape === 'hex' ? [1, 3] : [3, 3], borderWidth: 2, order: 3 }),
      line({ label: `CSR envelope, upper${suffix}`, data: at(series.envelopeHi), borderColor: OKABE_ITO.vermillion, borderDash: shape === 'hex' ? [1, 3] : [3, 3], borderWidth: 2, order: 3, legendHidden: true }),
    );
  }
  return datasets;
}

/** Bounds of the linear cell-side axis: the sides with a margin of 8 % of their range (or of the side) each way. */
export function cellSideBounds(cellSizes: readonly number[]): { min: number; max: number } {
  const low = Math.min(...cellSizes);
  const high = Math.max(...cellSizes);
  const margin = Math.max((high - low) * 0.08, low * 0.08);
  return { min: Math.max(0, low - margin), max: high + margin };
}

/** The text table of the cell-size chart. */
export function cellSizeTable(series: CellSizeSeries): { head: string[]; rows: string[][] } {
  return {
    head: ['cell side', '5 %', '25 %', 'median', '75 %', '95 %', 'CSR envelope', 'reference'],
    rows: series.labels.map((label, k) => [
      label,
      formatNumber(series.p5[k]),
      formatNumber(series.p25[k]),
      formatNumber(series.median[k]),
      formatNumber(series.p75[k]),
      formatNumber(series.p95[k]),
      series.envelopeLo[k] === null ? '-' : `${formatNumber(series.envelopeLo[k])} to ${formatNumber(series.envelopeHi[k])}`,
      `${formatNumber(series.reference[k])}${series.referenceInTail[k] ? ' (in the tail)' : ''}`,
    ]),
  };
}
