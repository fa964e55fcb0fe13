import * as turf from '@turf/turf';
import type { Feature, MultiPolygon, Polygon } from 'geojson';
import { describe, expect, it } from 'vitest';
import { loadDataset } from '../../server/inputs/index.js';
import { createBaselineWeigher } from '../../workers/baseline/baseline-weights.js';
import type { CellShape } from '../../workers/lattice/cell-shape.js';
import { latticeOf } from '../../workers/lattice/registry.js';

/**
 * The engine's areal weighting w_c = Σ_p P_p · |c ∩ p ∩ V| / |p ∩ V| against an independent reference: every cell
 * polygon (the lattice's frame) intersected one by one with every baseline polygon and with the valid region by
 * @turf/turf (polygon clipping, Martinez-Rueda algorithm), areas by the shoelace formula (Braden 1986), for rotated
 * and offset squares and hexagons over irregular polygons and a no-data zone.
 * Reference for the method: Goodchild & Lam (1980), Geo-Processing 1:297-312 (areal weighting).
 */
const STUDY = [[0, 0], [1300, 80], [1450, 900], [700, 1250], [-100, 1000], [0, 0]];
const ZONE = [[500, 400], [800, 380], [820, 700], [520, 720], [500, 400]];
const POLYGONS = [
  [[-200, -200], [650, -200], [620, 560], [600, 1400], [-200, 1400], [-200, -200]],
  [[650, -200], [1600, -200], [1600, 500], [620, 560], [650, -200]],
  [[620, 560], [1600, 500], [1600, 1400], [600, 1400], [620, 560]],
  [[3000, 3000], [3100, 3000], [3100, 3100], [3000, 3100], [3000, 3000]],
];
const COUNTS = [120, 45.5, 300, 7];

const collection = (rings: number[][][], properties: Record<string, unknown>[] = []) =>
  JSON.stringify({ type: 'FeatureCollection', features: rings.map((r, k) => ({ type: 'Feature', properties: properties[k] ?? {}, geometry: { type: 'Polygon', coordinates: [r] } })) });

function area(feature: Feature<Polygon | MultiPolygon> | null): number {
  if (feature === null) return 0;
  const g = feature.geometry;
  const polygons = g.type === 'Polygon' ? [g.coordinates] : g.coordinates;
  let total = 0;
  for (const polygon of polygons) {
    polygon.forEach((ring, index) => {
      let twice = 0;
      for (let k = 0; k < ring.length - 1; k++) twice += ring[k]![0]! * ring[k + 1]![1]! - ring[k + 1]![0]! * ring[k]![1]!;
      total += index === 0 ? Math.abs(twice / 2) : -Math.abs(twice / 2);
    });
  }
  return total;
}

const intersect = (a: Feature<Polygon | MultiPolygon>, b: Feature<Polygon | MultiPolygon>) =>
  turf.intersect(turf.featureCollection<Polygon | MultiPolygon>([a, b])) as Feature<Polygon | MultiPolygon> | null;

describe('areal weighting against cell-by-cell clipping', () => {
  const dataset = loadDataset(
    {
      points: { name: 'points.csv', content: 'id,x,y\n1,100,100\n2,900,300\n3,300,900\n' },
      area: { name: 'area.geojson', content: collection([STUDY]) },
      noData: [{ name: 'zone.geojson', content: collection([ZONE]) }],
      baseline: { name: 'pop.geojson', content: collection(POLYGONS, COUNTS.map((n) => ({ n }))) },
    },
    { crs: 'planar', baselineField: 'n' },
  );
  const valid = turf.difference(turf.featureCollection<Polygon | MultiPolygon>([turf.polygon([STUDY]), turf.polygon([ZONE])])) as Feature<Polygon | MultiPolygon>;
  const pieces = POLYGONS.map((ring) => intersect(turf.polygon([ring]), valid));
  const pieceAreas = pieces.map(area);

  it('records the polygon outside V and the totals', () => {
    expect(dataset.baseline!.info.outsideFeatures).toEqual([4]);
    expect(dataset.baseline!.info.totalInside).toBeCloseTo(465.5, 9);
  });

  const cases: [CellShape, number, { u: number; v: number; angle: number }][] = [
    ['square', 170, { u: 0.31, v: 0.77, angle: 23.5 }],
    ['hex', 190, { u: 0.6, v: 0.15, angle: 41 }],
  ];
  it.each(cases)('%s cells of %d m', (shape, cellSize, placement) => {
    const lattice = latticeOf(shape);
    const grid = lattice.coverage(dataset.region, dataset.origin, cellSize, placement);
    const weights = createBaselineWeigher(dataset.baseline!.engine, dataset.origin).weights(grid, cellSize, placement);
    const frame = lattice.frame(dataset.origin, cellSize, placement);
    let compared = 0;
    let total = 0;
    for (let r = 0; r < grid.ny; r++) {
      for (let c = 0; c < grid.nx; c++) {
        const cell = turf.polygon([frame.cellPolygon(grid.i0 + c, grid.j0 + r)]);
        let expected = 0;
        pieces.forEach((piece, p) => {
          if (piece === null || !(pieceAreas[p]! > 0)) return;
          expected += (COUNTS[p]! * area(intersect(cell, piece))) / pieceAreas[p]!;
        });
        expect(weights[r * grid.nx + c]).toBeCloseTo(expected, 6);
        if (expected > 0) compared++;
        total += weights[r * grid.nx + c]!;
      }
    }
    expect(compared).toBeGreaterThan(20);
    // every resident inside V lands in some cell
    expect(total).toBeCloseTo(465.5, 6);
  });
});
