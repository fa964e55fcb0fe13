import { describe, it, expect } from 'vitest';
import { equalEdges, histogram, monteCarloHistograms, stepPoints, sturgesBins } from '../../shared/charts/histogram-data.js';
import { monteCarloChartSpec } from '../../shared/charts/monte-carlo-chart.js';
import { makeMonteCarlo } from './summary-fixture.js';

describe('sturgesBins(n)', () => {
  it('is ceil(log2 n) + 1 (Sturges 1926)', () => {
    expect(sturgesBins(1)).toBe(1);
    expect(sturgesBins(8)).toBe(4);
    expect(sturgesBins(99)).toBe(8);
    expect(sturgesBins(999)).toBe(11);
  });
});

describe('histogram(values, edges)', () => {
  it('counts half-open bins with the last bin closed', () => {
    expect(histogram([0, 0.5, 1, 1.5, 2], [0, 1, 2]).counts).toEqual([2, 3]);
  });

  it('puts values lying on rounded edges in the right bin', () => {
    const edges = equalEdges(0, 0.7, 7);
    const values = [0.1, 0.2, 0.3, 0.4, 0.5, 0.6, 0.7];
    expect(histogram(values, edges).counts).toEqual([0, 1, 1, 1, 1, 1, 2]);
  });

  it('skips values outside the edges and non-finite values', () => {
    expect(histogram([-1, 3, Number.NaN, 1], [0, 1, 2]).counts).toEqual([0, 1]);
  });
});

describe('equalEdges(lo, hi, bins)', () => {
  it('spaces edges evenly and widens a zero-width range', () => {
    expect(equalEdges(1, 3, 4)).toEqual([1, 1.5, 2, 2.5, 3]);
    expect(equalEdges(2, 2, 2)).toEqual([1.5, 2, 2.5]);
  });
});

describe('monteCarloHistograms(result)', () => {
  it('bins simulated medians and maxima on edges that resolve both; far observed values are marked off the scale', () => {
    const result = makeMonteCarlo({});
    const histograms = monteCarloHistograms(result);
    // simulated values 0.9..1.6 (range 0.7); observed 2 and 3 lie beyond 1.6 + 0.5 x 0.7 = 1.95: off the scale.
    // medians span 0.2, maxima 0.2: ceil(5 x 0.7 / 0.2) = 18 bins of 0.7 / 18
    expect(histograms.edges).toHaveLength(19);
    expect(histograms.edges[0]).toBe(0.9);
    expect(histograms.edges[18]).toBe(1.6);
    expect(histograms.medians.reduce((a, b) => a + b, 0)).toBe(4);
    expect(Math.max(...histograms.medians)).toBeLessThan(4);
    expect(histograms.median).toEqual({ value: 2, shownAt: 1.6 + 0.7 * 0.12, offScale: 'above' });
    expect(histograms.axisMax).toBeCloseTo(1.6 + 0.7 * 0.24, 12);
    const spec = monteCarloChartSpec(histograms, result, '250 m');
    const observed = spec.data.datasets.find((dataset) => String(dataset.label).startsWith('observed median'));
    expect(observed?.label).toBe('observed median 2 (far above every simulated value: drawn at the axis end)');
    expect((observed?.data as { x: number }[])[0]!.x).toBeCloseTo(1.684, 12);
  });

  it('keeps an observed value near the simulated ones at its place on the axis', () => {
    const histograms = monteCarloHistograms(makeMonteCarlo({ observedMedian: 1.2, observedMax: 1.7 }));
    expect(histograms.median).toEqual({ value: 1.2, shownAt: 1.2, offScale: null });
    expect(histograms.max.offScale).toBeNull();
    expect(histograms.edges[histograms.edges.length - 1]).toBe(1.7);
  });

  it('resolves the simulated distribution when the observed value is 13.4 and the simulations lie near 1 (issue 9 item 6)', () => {
    // 99 simulated medians evenly spread over 0.95..1.05, maxima over 1.2..1.4
    const simulatedMedians = Array.from({ length: 99 }, (_, k) => 0.95 + (0.1 * k) / 98);
    const simulatedMaxima = Array.from({ length: 99 }, (_, k) => 1.2 + (0.2 * k) / 98);
    const result = makeMonteCarlo({ sims: 99, simulatedMedians, simulatedMaxima, observedMedian: 13.4, observedMax: 20.1 });
    const histograms = monteCarloHistograms(result);
    // no bin holds more than a quarter of the simulated medians
    expect(Math.max(...histograms.medians)).toBeLessThan(25);
    expect(histograms.medians.filter((count) => count > 0).length).toBeGreaterThanOrEqual(5);
    expect(histograms.median.offScale).toBe('above');
    const spec = monteCarloChartSpec(histograms, result, '250 m');
    const labels = spec.data.datasets.map((dataset) => String(dataset.label));
    expect(labels).toContain('observed median 13.4 (far above every simulated value: drawn at the axis end)');
    expect(labels).toContain('observed maximum 20.1 (far above every simulated value: drawn at the axis end)');
    // the legend draws each item from its dataset's colours: every dataset carries its own, matching its line or fill
    for (const dataset of spec.data.datasets) {
      expect(dataset.borderColor).toBeTruthy();
      expect(dataset.pointStyle).toBe(String(dataset.label).startsWith('observed') ? 'line' : 'rect');
      if (String(dataset.label).startsWith('observed')) expect(dataset.backgroundColor).toBe(dataset.borderColor);
    }
    const scales = spec.options.scales as Record<string, { min: number; max: number }>;
    expect(scales.x.max).toBeLessThan(2);
  });
});

describe('stepPoints(edges, counts)', () => {
  it('outlines each bar: up at the first edge, across every bin at its count, down after the last', () => {
    expect(stepPoints([0, 1, 2], [2, 3])).toEqual([
      { x: 0, y: 0 }, { x: 0, y: 2 }, { x: 1, y: 2 }, { x: 1, y: 3 }, { x: 2, y: 3 }, { x: 2, y: 0 },
    ]);
  });
});
