import { describe, it, expect } from 'vitest';
import { cellSizeSeries } from '../../shared/charts/cell-size-data.js';
import { cellSizeChartSpec, cellSizeTable } from '../../shared/charts/cell-size-chart.js';
import { hydrateChartSpec } from '../../shared/charts/chart-runtime.js';
import { makeMonteCarlo, makeRow, makeSize, quantiles } from './summary-fixture.js';

// Expected values are hand computations from the fixture's numbers.
const small = makeSize({ sizeIndex: 1, cellSize: 250, monteCarlo: makeMonteCarlo({ envelope: { lo: 0.8, hi: 1.25 } }) });
const large = makeSize({
  sizeIndex: 0,
  cellSize: 500,
  chi2PerDf: quantiles(2, 2.5, 3, 3.5, 4),
  vmr: quantiles(2.1, 2.6, 3.1, 3.6, 4.1),
  reference: makeRow({ placementIndex: 3, vmr: 4.5, chi2PerDf: 4.4 }),
  referenceInTail: true,
});

describe('cellSizeSeries(sizes, measure)', () => {
  it('orders sizes by cell side and carries quantiles, envelope and the reference', () => {
    const series = cellSizeSeries([large, small], 'chi2PerDf');
    expect(series.labels).toEqual(['250 m', '500 m']);
    expect(series.sizeIndex).toEqual([1, 0]);
    expect(series.p5).toEqual([1.0, 2]);
    expect(series.p25).toEqual([1.3, 2.5]);
    expect(series.median).toEqual([1.6, 3]);
    expect(series.p75).toEqual([1.9, 3.5]);
    expect(series.p95).toEqual([2.3, 4]);
    expect(series.envelopeLo).toEqual([0.8, null]);
    expect(series.envelopeHi).toEqual([1.25, null]);
    expect(series.reference).toEqual([1.8, 4.4]);
    expect(series.referenceInTail).toEqual([false, true]);
    expect(series.referencePlacementIndex).toEqual([0, 3]);
  });

  it('uses VMR quantiles and drops the chi2/df envelope for the VMR measure', () => {
    const series = cellSizeSeries([large, small], 'vmr');
    expect(series.median).toEqual([1.7, 3.1]);
    expect(series.reference).toEqual([1.9, 4.5]);
    expect(series.envelopeLo).toEqual([null, null]);
    // the chart says why the envelope is missing rather than dropping it silently
    const subtitle = (cellSizeChartSpec(series, 64).options.plugins as { subtitle: { text: string[] } }).subtitle.text;
    expect(subtitle.join(' ')).toMatch(/No CSR envelope for VMR: .*choose chi-square \/ df to see it/);
  });
});

describe('cellSizeChartSpec(series, placements)', () => {
  it('draws the band, quartile boxes, median, line at 1, reference and the envelope when simulated', () => {
    const spec = cellSizeChartSpec(cellSizeSeries([large, small], 'chi2PerDf'), 64);
    const labels = spec.data.datasets.map((dataset) => dataset.label);
    expect(labels).toContain('CSR envelope of medians (2.5-97.5 %)');
    const quartiles = spec.data.datasets.find((dataset) => dataset.label === 'quartiles (25-75 %)');
    expect(quartiles?.data).toEqual([{ x: 250, y: [1.3, 1.9], entry: 0 }, { x: 500, y: [2.5, 3.5], entry: 1 }]);
    const one = spec.data.datasets.find((dataset) => dataset.label === '1 = CSR expectation');
    expect(one?.data).toEqual([{ x: 250, y: 1, entry: 0 }, { x: 500, y: 1, entry: 1 }]);
    expect(spec.data.datasets[0].fill).toBe('+1');
    expect(spec.data.datasets[1].data).toEqual([{ x: 250, y: 2.3, entry: 0 }, { x: 500, y: 4, entry: 1 }]);
    const scales = spec.options.scales as Record<string, { title: { text: string } }>;
    expect(scales.x.title.text).toBe('cell side (m)');
    expect(JSON.parse(JSON.stringify(spec))).toEqual(spec);
  });

  it('puts cell sides on a linear metre axis: 144, 161 and 254 m are spaced by their differences (issue 9 item 6)', () => {
    const sides = [144, 254, 161].map((cellSize, sizeIndex) => makeSize({ sizeIndex, cellSize }));
    const spec = cellSizeChartSpec(cellSizeSeries(sides, 'chi2PerDf'), 16);
    const scales = spec.options.scales as Record<string, { type?: string; min: number; max: number }>;
    expect(scales.x.type).toBe('linear');
    expect(spec.data.labels).toBeUndefined();
    for (const dataset of spec.data.datasets) {
      expect((dataset.data as { x: number }[]).map((point) => point.x)).toEqual([144, 161, 254]);
    }
    // margins of 8 % of the range (8.8 m) or of the smallest side (11.52 m), whichever is larger, each way
    expect(scales.x.min).toBeCloseTo(144 - 11.52, 10);
    expect(scales.x.max).toBeCloseTo(254 + 11.52, 10);
  });

  it('draws squares and hexagons of the same side as separate, labelled series; each point names its entry', () => {
    const hexSmall = makeSize({ sizeIndex: 2, cellSize: 250, shape: 'hex', chi2PerDf: quantiles(1.1, 1.4, 1.7, 2, 2.4) });
    const series = cellSizeSeries([hexSmall, large, small], 'chi2PerDf');
    expect(series.labels).toEqual(['250 m', '250 m hexagons', '500 m']);
    expect(series.shapes).toEqual(['square', 'hex', 'square']);
    expect(series.sizeIndex).toEqual([1, 2, 0]);
    const spec = cellSizeChartSpec(series, 64);
    const medianOf = (label: string) => spec.data.datasets.find((dataset) => dataset.label === label)?.data;
    expect(medianOf('median, squares')).toEqual([{ x: 250, y: 1.6, entry: 0 }, { x: 500, y: 3, entry: 2 }]);
    expect(medianOf('median, hexagons')).toEqual([{ x: 250, y: 1.7, entry: 1 }]);
    expect(spec.data.datasets.filter((dataset) => dataset.label === '1 = CSR expectation')).toHaveLength(1);
    const subtitle = (spec.options.plugins as { subtitle: { text: string[] } }).subtitle.text;
    expect(subtitle.join(' ')).toContain('hexagons (area = side²) in orange');
  });

  it('has no envelope datasets without simulations', () => {
    const spec = cellSizeChartSpec(cellSizeSeries([large], 'chi2PerDf'), 64);
    expect(spec.data.datasets.some((dataset) => String(dataset.label).startsWith('CSR envelope'))).toBe(false);
    const subtitle = (spec.options.plugins as { subtitle: { text: string[] } }).subtitle.text;
    expect(subtitle.join(' ')).toContain('No CSR envelope: this sweep ran no CSR simulations');
  });

  it('hides the helper datasets from the legend once hydrated', () => {
    const spec = hydrateChartSpec(cellSizeChartSpec(cellSizeSeries([small], 'chi2PerDf'), 64));
    const filter = spec.options.plugins.legend.labels.filter as (item: { datasetIndex: number }, data: unknown) => boolean;
    const shown = spec.data.datasets.map((_: unknown, index: number) => filter({ datasetIndex: index }, spec.data));
    expect(shown).toEqual([true, false, true, true, true, true, true, false]);
  });
});

describe('cellSizeTable(series)', () => {
  it('lists the numbers of the chart for screen readers', () => {
    const table = cellSizeTable(cellSizeSeries([large, small], 'chi2PerDf'));
    expect(table.rows[0]).toEqual(['250 m', '1', '1.3', '1.6', '1.9', '2.3', '0.8 to 1.25', '1.8']);
    expect(table.rows[1][7]).toBe('4.4 (in the tail)');
  });
});
