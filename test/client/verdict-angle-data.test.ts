import { describe, it, expect } from 'vitest';
import { angleSeries } from '../../shared/charts/angle-data.js';
import { angleChartSpec } from '../../shared/charts/angle-chart.js';
import { hydrateChartSpec } from '../../shared/charts/chart-runtime.js';
import { verdictSeries } from '../../shared/charts/verdict-data.js';
import { verdictChartSpec } from '../../shared/charts/verdict-chart.js';
import { makeRow, makeSize } from './summary-fixture.js';

describe('verdictSeries(sizes)', () => {
  it('turns shares into percentages ordered by cell side, labels carrying the agreement', () => {
    const sizes = [
      makeSize({ sizeIndex: 0, cellSize: 400, verdictShares: { clustered: 0.5, csr: 0.375, regular: 0.125 }, agreement: 0.5 }),
      makeSize({ sizeIndex: 1, cellSize: 200 }),
    ];
    const series = verdictSeries(sizes);
    expect(series.labels).toEqual(['200 m (agreement 75 %)', '400 m (agreement 50 %)']);
    expect(series.clustered).toEqual([75, 50]);
    expect(series.csr).toEqual([25, 37.5]);
    expect(series.regular).toEqual([0, 12.5]);
    expect(series.agreement).toEqual([75, 50]);
    const spec = verdictChartSpec(series, 0.05);
    expect(spec.data.datasets.map((dataset) => dataset.data)).toEqual([[75, 50], [25, 37.5], [0, 12.5]]);
  });
});

describe('angleSeries(rows, sizeIndex, referenceIndex)', () => {
  const rows = [
    makeRow({ placementIndex: 0, angle: 0, vmr: 1.5 }),
    makeRow({ placementIndex: 1, angle: 60, u: 0.5, vmr: 2.5 }),
    makeRow({ placementIndex: 2, angle: 30, u: 0.25, vmr: 0.5 }),
    makeRow({ placementIndex: 0, sizeIndex: 1, angle: 10, vmr: 9 }),
  ];

  it('keeps the rows of the size, sorted by angle, and finds the reference placement', () => {
    const series = angleSeries(rows, 0);
    expect(series.points).toMatchObject([
      { x: 0, y: 1.5, placementIndex: 0 },
      { x: 30, y: 0.5, placementIndex: 2 },
      { x: 60, y: 2.5, placementIndex: 1 },
    ]);
    expect(series.reference).toMatchObject({ x: 0, y: 1.5, placementIndex: 0 });
    expect(series.singleAngle).toBe(false);
  });

  it('takes the reference by index when given, and notices a sweep without rotation', () => {
    expect(angleSeries(rows, 0, 2).reference?.placementIndex).toBe(2);
    const flat = angleSeries([makeRow({ placementIndex: 0 }), makeRow({ placementIndex: 1, u: 0.5 })], 0);
    expect(flat.singleAngle).toBe(true);
  });

  it('names each dot in its tooltip (number, offset, angle, VMR, verdict) and gives each verdict its own colour and shape', () => {
    const mixed = [
      makeRow({ placementIndex: 0, angle: 0, vmr: 1.1, verdict: 'csr' }),
      makeRow({ placementIndex: 7, angle: 33.75, u: 0.25, v: 0.5, vmr: 1.9, verdict: 'clustered' }),
      makeRow({ placementIndex: 9, angle: 12, u: 0.5, v: 0.125, vmr: 0.4, verdict: 'regular' }),
    ];
    const series = angleSeries(mixed, 0);
    expect(series.points.find((point) => point.placementIndex === 7)?.tip).toBe('Placement 7: offset (0.25, 0.5) cells, angle 33.75°, VMR 1.9, clustered');
    expect(series.reference?.tip).toMatch(/^Reference grid\. Placement 0: .*no departure from CSR$/);
    const spec = angleChartSpec(series, '200 m');
    const axisMax = (chart: typeof spec) => (chart.options.scales as Record<string, { max: number }>).x.max;
    // the angle axis spans the lattice's period: 90 degrees for squares, 60 for hexagons
    expect(axisMax(spec)).toBe(90);
    expect(axisMax(angleChartSpec(series, '200 m hexagons', 60))).toBe(60);
    const scatter = spec.data.datasets.filter((dataset) => Array.isArray(dataset.data) && (dataset.data as { verdict?: string }[]).some((point) => point.verdict));
    // three verdict series plus the reference; no two share a colour or a point style
    const verdictSets = scatter.slice(0, 3);
    expect(verdictSets.map((dataset) => (dataset.data as { verdict: string }[])[0].verdict)).toEqual(['clustered', 'regular', 'csr']);
    expect(new Set(verdictSets.map((dataset) => dataset.pointStyle)).size).toBe(3);
    expect(new Set(verdictSets.map((dataset) => dataset.borderColor)).size).toBe(3);
    // the page's and the report's tooltip shows the tip
    const hydrated = hydrateChartSpec(structuredClone(spec));
    const label = hydrated.options.plugins.tooltip.callbacks.label;
    expect(label({ raw: series.points[0], dataset: verdictSets[0], formattedValue: '' })).toBe(series.points[0].tip);
  });
});
