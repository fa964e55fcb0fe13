/**
 * Validation of one raw GeoJSON polygon before it is projected: numeric finite positions, rings of at least four
 * positions that are closed, non-zero area, no self-intersections (an R-tree edge search, reported with their
 * location), holes inside their shell, longitude/latitude ranges when the coordinates are geographic, and at most
 * MAX_POLYGON_VERTICES vertices (the overlay of larger polygons would hold a request for minutes).
 */
import * as turf from '@turf/turf';
import { inputError, tooLargeError } from '../errors.js';
import { checkLonLat } from './parse-coordinate.js';
import type { RawPolygon } from './geojson-polygons.js';
import { signedRingArea } from './planar-rings.js';
import { selfIntersections } from './self-intersections.js';

/** Most vertices of one polygon (all its rings); larger ones get GS_ERR_TOO_LARGE and a hint to simplify. */
export const MAX_POLYGON_VERTICES = 100_000;

const ringName = (index: number): string => (index === 0 ? 'outer ring' : `hole ${index}`);

function checkRing(value: unknown, where: string, lonLat: boolean): number[][] {
  if (!Array.isArray(value)) throw inputError(`${where}: a ring must be an array of positions`);
  const ring = value.map((position: unknown, k: number) => {
    if (!Array.isArray(position) || position.length < 2) {
      throw inputError(`${where}, position ${k + 1}: a position must be an array [x, y]`);
    }
    const [x, y] = position as unknown[];
    if (typeof x !== 'number' || typeof y !== 'number' || !Number.isFinite(x) || !Number.isFinite(y)) {
      throw inputError(`${where}, position ${k + 1}: coordinates must be finite numbers`);
    }
    if (lonLat) checkLonLat(x, y, `${where}, position ${k + 1}`);
    return [x, y];
  });
  if (ring.length < 4) {
    throw inputError(`${where}: a ring needs at least 4 positions (3 corners and the closing one), got ${ring.length}`);
  }
  const first = ring[0];
  const last = ring[ring.length - 1];
  if (first[0] !== last[0] || first[1] !== last[1]) {
    throw inputError(
      `${where}: the ring is not closed (first position ${first.join(',')} differs from last ${last.join(',')})`,
    );
  }
  return ring;
}

function extentSquared(ring: number[][]): number {
  let minX = Infinity;
  let minY = Infinity;
  let maxX = -Infinity;
  let maxY = -Infinity;
  for (const [x, y] of ring) {
    minX = Math.min(minX, x);
    maxX = Math.max(maxX, x);
    minY = Math.min(minY, y);
    maxY = Math.max(maxY, y);
  }
  const extent = Math.max(maxX - minX, maxY - minY);
  return extent * extent;
}

function checkVertexCount(polygon: RawPolygon): void {
  let vertices = 0;
  for (const ring of polygon.rings) vertices += Array.isArray(ring) ? ring.length : 0;
  if (vertices > MAX_POLYGON_VERTICES) {
    throw tooLargeError(
      `${polygon.label}: the polygon has ${vertices} vertices, more than the limit of ${MAX_POLYGON_VERTICES}; ` +
        'simplify it (for example to a tolerance of 1 m) before loading',
    );
  }
}

/** The polygon's checked rings (GeoJSON order, closed), or a GS_ERR_INPUT naming the polygon and what is wrong. */
export function checkPolygon(polygon: RawPolygon, lonLat: boolean): number[][][] {
  checkVertexCount(polygon);
  const rings = polygon.rings.map((ring, index) => checkRing(ring, `${polygon.label}, ${ringName(index)}`, lonLat));
  const kinks = selfIntersections(rings);
  if (kinks.length > 0) {
    const where = kinks
      .slice(0, 3)
      .map((kink) => `(${kink.join(', ')})`)
      .join(', ');
    throw inputError(`${polygon.label}: the polygon intersects itself at ${where}`);
  }
  rings.forEach((ring, index) => {
    if (Math.abs(signedRingArea(ring)) <= 1e-12 * extentSquared(ring)) {
      throw inputError(`${polygon.label}, ${ringName(index)}: the ring has zero area`);
    }
  });
  const shell = turf.polygon([rings[0]]);
  for (let h = 1; h < rings.length; h += 1) {
    const outside = rings[h].find((p) => !turf.booleanPointInPolygon(p, shell));
    if (outside) {
      throw inputError(`${polygon.label}, ${ringName(h)}: the hole lies outside its outer ring at (${outside.join(', ')})`);
    }
  }
  return rings;
}
