import { describe, it, expect } from 'vitest';
import { equalEdges, histogram, monteCarloHistograms, stepPoints, sturgesBins } from '../../client/src/charts/histogram-data.js';
import { monteCarloChartSpec } from '../../client/src/charts/monte-carlo-chart.js';
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
  it('bins simulated medians and maxima on common edges that cover the observed values', () => {
    const result = makeMonteCarlo({});
    const histograms = monteCarloHistograms(result);
    // lo = 0.9 (a simulated median), hi = 3 (observed maximum), max(Sturges(4) = 3, 5) = 5 bins of 0.42
    expect(histograms.edges.map((edge) => Number(edge.toFixed(10)))).toEqual([0.9, 1.32, 1.74, 2.16, 2.58, 3]);
    expect(histograms.medians).toEqual([4, 0, 0, 0, 0]);
    expect(histograms.maxima).toEqual([0, 4, 0, 0, 0]);
    const spec = monteCarloChartSpec(histograms, result, '250 m');
    const observed = spec.data.datasets.find((dataset) => String(dataset.label).startsWith('observed median'));
    expect(observed?.data).toEqual([{ x: 2, y: 0 }, { x: 2, y: 4.32 }]);
  });
});

describe('stepPoints(edges, counts)', () => {
  it('outlines each bar: up at the first edge, across every bin at its count, down after the last', () => {
    expect(stepPoints([0, 1, 2], [2, 3])).toEqual([
      { x: 0, y: 0 }, { x: 0, y: 2 }, { x: 1, y: 2 }, { x: 1, y: 3 }, { x: 2, y: 3 }, { x: 2, y: 0 },
    ]);
  });
});
