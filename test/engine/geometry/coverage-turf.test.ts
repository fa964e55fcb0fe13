import { describe, it, expect } from 'vitest';
import { featureCollection, intersect, polygon } from '@turf/turf';
import type { Feature, MultiPolygon, Polygon, Position } from 'geojson';
import { placementCoverage } from '../../../workers/geometry/coverage.js';
import { cellCorners, createGridFrame } from '../../../workers/geometry/grid-frame.js';
import { regionFromRings } from './region-fixtures.js';

/**
 * Cross-check against @turf/intersect (polyclip-ts, Martinez-Rueda style sweep-line boolean operations), a
 * general-purpose library. turf's intersect works on raw coordinates as a plane, so it is valid on planar metres;
 * turf's area is geodesic (longitude/latitude) and is NOT used: the planar area of its output is taken here with
 * the shoelace formula.
 */
function planarArea(feature: Feature<Polygon | MultiPolygon> | null): number {
  if (feature === null) return 0;
  const polygons: Position[][][] = feature.geometry.type === 'Polygon' ? [feature.geometry.coordinates] : feature.geometry.coordinates;
  let total = 0;
  for (const rings of polygons) {
    rings.forEach((ring, index) => {
      let twice = 0;
      for (let k = 0; k + 1 < ring.length; k++) twice += ring[k]![0]! * ring[k + 1]![1]! - ring[k + 1]![0]! * ring[k]![1]!;
      total += index === 0 ? Math.abs(twice / 2) : -Math.abs(twice / 2);
    });
  }
  return total;
}

describe('placementCoverage against @turf/intersect on planar cases', () => {
  const shell: [number, number][] = [[0, 0], [70, 5], [90, 60], [40, 85], [-5, 50]];
  const hole: [number, number][] = [[30, 30], [35, 50], [55, 45], [50, 25]]; // clockwise
  const region = regionFromRings([shell, hole]);
  const turfRegion = polygon([[...shell, shell[0]!], [...hole, hole[0]!]]);

  for (const placement of [
    { u: 0, v: 0, angle: 0 },
    { u: 0.3, v: 0.7, angle: 0 },
    { u: 0.25, v: 0.1, angle: 37.5 },
    { u: 0.9, v: 0.45, angle: 71 },
  ]) {
    it(`every cell at offset (${placement.u}, ${placement.v}), angle ${placement.angle}`, () => {
      const cellSize = 12.5;
      const origin = { x: region.bbox.minX, y: region.bbox.minY };
      const grid = placementCoverage(region, origin, cellSize, placement);
      const frame = createGridFrame(origin, cellSize, placement);
      let checked = 0;
      for (let r = 0; r < grid.ny; r++) {
        for (let c = 0; c < grid.nx; c++) {
          const cell = polygon([cellCorners(frame, grid.i0 + c, grid.j0 + r)]);
          const turfArea = planarArea(intersect(featureCollection([turfRegion, cell])));
          expect(Math.abs(grid.coverage[r * grid.nx + c]! * cellSize * cellSize - turfArea)).toBeLessThan(1e-6);
          checked++;
        }
      }
      expect(checked).toBeGreaterThan(40);
    });
  }
});
