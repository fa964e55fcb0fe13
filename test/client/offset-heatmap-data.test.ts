import { describe, it, expect } from 'vitest';
import { defaultOffsetBins, offsetHeatmap } from '../../shared/charts/offset-heatmap-data.js';
import { offsetHeatmapChartSpec } from '../../shared/charts/offset-heatmap-chart.js';
import { sequentialColour } from '../../shared/charts/palette.js';
import { makeRow } from './summary-fixture.js';

describe('offsetHeatmap(rows, sizeIndex, bins)', () => {
  const rows = [
    makeRow({ placementIndex: 0, u: 0.1, v: 0.1, vmr: 1 }),
    makeRow({ placementIndex: 1, u: 0.2, v: 0.3, vmr: 3 }),
    makeRow({ placementIndex: 2, u: 0.6, v: 0.1, vmr: 4 }),
    makeRow({ placementIndex: 3, u: 0.7, v: 0.8, vmr: 2 }),
    makeRow({ placementIndex: 4, sizeIndex: 1, u: 0.1, v: 0.9, vmr: 50 }),
  ];

  it('averages VMR per offset bin and leaves empty bins without a value', () => {
    const map = offsetHeatmap(rows, 0, 2);
    // bin (u 0-0.5, v 0-0.5): (1 + 3) / 2 = 2; bin (0.5-1, 0-0.5): 4; bin (0-0.5, 0.5-1): empty; (0.5-1, 0.5-1): 2
    expect(map.cells.map((cell) => cell.meanVmr)).toEqual([2, 4, null, 2]);
    expect(map.cells.map((cell) => cell.count)).toEqual([2, 1, 0, 1]);
    expect(map.min).toBe(2);
    expect(map.max).toBe(4);
    // nearest to the centre (0.25, 0.25): (0.2, 0.3) at 0.0707 beats (0.1, 0.1) at 0.2121
    expect(map.cells[0].nearestPlacement).toBe(1);
    expect(map.cells[2].nearestPlacement).toBeNull();
    expect(map.cells.map((cell) => cell.colour)).toEqual(['#440154', '#fde725', '#d9d9d9', '#440154']);
  });

  it('puts an offset of exactly 1 - epsilon in the last bin and 0 in the first', () => {
    const map = offsetHeatmap([makeRow({ u: 0.9999999, v: 0 })], 0, 4);
    expect(map.cells[3].count).toBe(1);
  });

  it('becomes stacked bars: one dataset per v bin, coloured per u bin', () => {
    const spec = offsetHeatmapChartSpec(offsetHeatmap(rows, 0, 2), '250 m');
    expect(spec.data.labels).toEqual(['0-0.5', '0.5-1']);
    expect(spec.data.datasets).toHaveLength(2);
    expect(spec.data.datasets[0].data).toEqual([0.5, 0.5]);
    expect(spec.data.datasets[1].backgroundColor).toEqual(['#d9d9d9', '#440154']);
    expect(spec.data.datasets[0].placementOf).toEqual([1, 2]);
  });
});

describe('colour range of the heat map (issue 9 item 6)', () => {
  it('states its range; a wide spread uses the bins\' own range', () => {
    const map = offsetHeatmap([makeRow({ u: 0.1, v: 0.1, vmr: 2 }), makeRow({ u: 0.6, v: 0.1, vmr: 4 })], 0, 2);
    expect(map.widened).toBe(false);
    expect([map.colourLow, map.colourHigh]).toEqual([2, 4]);
    expect(map.rangeNote).toBe('colours span mean VMR 2 (dark) to 4 (light), the range of the bins');
    const spec = offsetHeatmapChartSpec(map, '250 m');
    expect((spec.options.plugins as { subtitle: { text: string[] } }).subtitle.text).toContain(map.rangeNote);
  });

  it('does not stretch 13.0 to 13.6 to full contrast: the ramp is widened to +-10 % around 13.3 and says so', () => {
    const map = offsetHeatmap([makeRow({ u: 0.1, v: 0.1, vmr: 13.0 }), makeRow({ u: 0.6, v: 0.1, vmr: 13.6 })], 0, 2);
    expect(map.widened).toBe(true);
    // middle 13.3, span 0.2 x 13.3 = 2.66: ends 11.97 and 14.63
    expect(map.colourLow).toBeCloseTo(11.97, 10);
    expect(map.colourHigh).toBeCloseTo(14.63, 10);
    // positions (13.0 - 11.97) / 2.66 = 0.387 and (13.6 - 11.97) / 2.66 = 0.613: neither end of the ramp
    expect(map.cells[0].colour).toBe(sequentialColour((13.0 - 11.97) / 2.66));
    expect(map.cells[1].colour).toBe(sequentialColour((13.6 - 11.97) / 2.66));
    expect(map.cells[0].colour).not.toBe(sequentialColour(0));
    expect(map.rangeNote).toContain('colours span mean VMR 12 (dark) to 14.6 (light)');
    expect(map.rangeNote).toContain('range only from 13 to 13.6 (4.5 % of the level)');
    expect(map.rangeNote).toContain('not stretched to full contrast');
  });
});

describe('defaultOffsetBins(placements)', () => {
  it('aims at about two placements per bin, within 2..10', () => {
    expect(defaultOffsetBins(4)).toBe(2);
    expect(defaultOffsetBins(32)).toBe(4); // sqrt(16)
    expect(defaultOffsetBins(72)).toBe(6); // sqrt(36)
    expect(defaultOffsetBins(1024)).toBe(10);
  });
});

describe('sequentialColour(t)', () => {
  it('interpolates the viridis anchors in RGB', () => {
    expect(sequentialColour(0)).toBe('#440154');
    expect(sequentialColour(0.5)).toBe('#21918c');
    // halfway between (68,1,84) and (59,82,139): (63.5, 41.5, 111.5) rounded to (64, 42, 112)
    expect(sequentialColour(0.125)).toBe('#402a70');
    expect(sequentialColour(2)).toBe('#fde725');
    expect(sequentialColour(Number.NaN)).toBe('#d9d9d9');
  });
});
