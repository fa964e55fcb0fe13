import { axis, baseOptions, type ChartSpec } from './chart-spec.js';
import { formatNumber } from '../format.js';
import type { OffsetHeatmap } from './offset-heatmap-data.js';

/**
 * Heat map of mean VMR over the offsets (u, v), drawn as stacked bars of equal height: column = u bin, stacked
 * segment = v bin, colour = mean VMR on the sequential ramp (light grey = no placement in the bin).
 */
export function offsetHeatmapChartSpec(heatmap: OffsetHeatmap, cellSizeLabel: string): ChartSpec {
  const { bins } = heatmap;
  const labels = Array.from({ length: bins }, (_, uBin) => `${formatNumber(uBin / bins, 2)}-${formatNumber((uBin + 1) / bins, 2)}`);
  const datasets = Array.from({ length: bins }, (_, vBin) => {
    const row = heatmap.cells.slice(vBin * bins, (vBin + 1) * bins);
    return {
      type: 'bar',
      label: `v ${formatNumber(vBin / bins, 2)}-${formatNumber((vBin + 1) / bins, 2)}`,
      data: row.map(() => 1 / bins),
      meanVmr: row.map((cell) => cell.meanVmr),
      placementOf: row.map((cell) => cell.nearestPlacement),
      colourRange: { low: heatmap.colourLow, high: heatmap.colourHigh, widened: heatmap.widened },
      backgroundColor: row.map((cell) => cell.colour),
      borderColor: '#ffffff',
      borderWidth: 1,
      barPercentage: 1,
      categoryPercentage: 1,
    };
  });
  const options = baseOptions('VMR over grid offsets (u, v)', [`Cell side ${cellSizeLabel}; all angles pooled`, heatmap.rangeNote], {
    x: axis('offset u (cell units)', { stacked: true }),
    y: axis('offset v (cell units)', { stacked: true, min: 0, max: 1 }),
  });
  (options.plugins as Record<string, unknown>).legend = { display: false };
  return { type: 'bar', data: { labels, datasets }, options };
}

export function offsetHeatmapTable(heatmap: OffsetHeatmap): { head: string[]; rows: string[][] } {
  return {
    head: ['offset u', 'offset v', 'placements', 'mean VMR'],
    rows: heatmap.cells.map((cell) => [
      `${formatNumber(cell.uFrom, 2)} to ${formatNumber(cell.uTo, 2)}`,
      `${formatNumber(cell.vFrom, 2)} to ${formatNumber(cell.vTo, 2)}`,
      String(cell.count),
      formatNumber(cell.meanVmr, 4),
    ]),
  };
}
