import { describe, expect, it } from 'vitest';
import { loadDataset, summarizeDataset } from '../../server/inputs/index.js';
import { csvFile, polygonFile, square } from './input-helpers.js';

function signedArea(ring: Float64Array): number {
  let twice = 0;
  const n = ring.length / 2;
  for (let k = 0; k < n; k += 1) {
    const next = (k + 1) % n;
    twice += ring[2 * k] * ring[2 * next + 1] - ring[2 * next] * ring[2 * k + 1];
  }
  return twice / 2;
}

const points = csvFile('pts.csv', 'id,x,y', [
  ['in1', 50, 50],
  ['zone', 25, 25],
  ['out', 150, 50],
  ['in2', 90, 10],
  ['in2-again', 90, 10],
]);

describe('the valid region', () => {
  const area = polygonFile('area.geojson', [square(0, 0, 100)]);
  // two overlapping zones (10..30 and 20..40 squared) and one that sticks out of the study area (-10..10)
  const zones = polygonFile('zones.geojson', [square(10, 10, 20)], [square(20, 20, 20)], [square(-10, -10, 20)]);
  const dataset = loadDataset({ points, area, noData: [zones] }, { crs: 'planar' });

  it('is the study area minus the union of the zones, overlaps removed once, outside parts ignored', () => {
    // 100^2 - (20^2 + 20^2 - 10^2) - 10^2 (the part of the third zone inside the area)
    expect(dataset.region.area).toBeCloseTo(10000 - 700 - 100, 9);
    expect(summarizeDataset(dataset).studyAreaArea).toBeCloseTo(10000, 9);
  });

  it('has counter-clockwise shells and clockwise holes whose signed areas add up to its area', () => {
    const areas = dataset.region.rings.map(signedArea);
    expect(areas.filter((a) => a > 0).length).toBe(1);
    expect(areas.reduce((s, a) => s + a, 0)).toBeCloseTo(dataset.region.area, 9);
    for (const ring of dataset.region.rings) expect(ring.length % 2).toBe(0);
  });

  it('puts the origin at the lower-left corner of the study area bbox, not of the valid region', () => {
    expect(dataset.origin).toEqual({ x: 0, y: 0 });
    expect(dataset.region.bbox).toEqual({ minX: 0, minY: 0, maxX: 100, maxY: 100 });
  });

  it('reports points outside (in a zone or beyond the area) by id, and duplicates, as warnings', () => {
    expect(Array.from(dataset.inside)).toEqual([0, 3, 4]);
    expect(dataset.outsideIds).toEqual(['zone', 'out']);
    const outside = dataset.warnings.find((w) => w.code === 'points-outside');
    expect(outside?.ids).toEqual(['zone', 'out']);
    expect(outside?.message).toMatch(/^2 of 5 point\(s\) lie outside the valid region/);
    const duplicates = dataset.warnings.find((w) => w.code === 'duplicate-points');
    expect(duplicates?.ids).toEqual(['in2-again']);
    expect(dataset.areaIsDefault).toBe(false);
  });

  it('summarizes with cell sides sqrt(k * validArea / nInside) for 1.6, 2 and 5 points per cell', () => {
    const summary = summarizeDataset(dataset);
    expect(summary).toMatchObject({ n: 5, nInside: 3, nOutside: 2 });
    expect(summary.suggestedCellSizes.map((s) => s.perCell)).toEqual([1.6, 2, 5]);
    for (const size of summary.suggestedCellSizes) {
      expect(size.cellSize).toBeCloseTo(Math.sqrt((size.perCell * 9200) / 3), 9);
      expect(size.rule).toMatch(/common practice/);
    }
  });
});

describe('the default study area', () => {
  it("is the points' bounding box, with a warning, and holds the extreme points", () => {
    const dataset = loadDataset({ points }, { crs: 'planar' });
    expect(dataset.areaIsDefault).toBe(true);
    expect(dataset.warnings.map((w) => w.code)).toContain('default-study-area');
    expect(dataset.inside.length).toBe(5);
    expect(dataset.origin).toEqual({ x: 25, y: 10 });
    expect(dataset.region.area).toBeCloseTo(125 * 40, 4);
  });

  it('accepts a study area with a hole and several parts (MultiPolygon)', () => {
    const multi = { type: 'MultiPolygon', coordinates: [[square(0, 0, 100), square(40, 40, 20).reverse()], [square(200, 0, 10)]] };
    const area = { name: 'area.geojson', content: JSON.stringify({ type: 'Feature', properties: {}, geometry: multi }) };
    const dataset = loadDataset({ points, area }, { crs: 'planar' });
    expect(dataset.region.area).toBeCloseTo(10000 - 400 + 100, 9);
    expect(dataset.outsideIds).toEqual(['in1', 'out']);
  });
});
