/**
 * Stable areas as GeoJSON: pixel masks traced into polygons whose rings are closed and follow the right-hand rule of
 * RFC 7946 section 3.1.6 (outer counter-clockwise, holes clockwise), valid by @turf/turf booleanValid (OGC simple
 * features validity), with area equal to the pixels' area (planar shoelace; geodesic area by @turf/turf area for
 * longitude/latitude output, which must agree with the equal-area working projection to well under 1 %).
 */
import { area as turfArea, booleanClockwise, booleanPointInPolygon, booleanValid, point, polygon } from '@turf/turf';
import { describe, expect, it } from 'vitest';
import type { ProjectionInfo } from '../../shared/contracts.js';
import { areasGeoJson } from '../../server/stability/areas-geojson.js';
import { pixelPolygons } from '../../server/stability/pixel-polygons.js';
import type { StabilitySurface } from '../../server/stability/stability-accumulator.js';
import { stabilitySummary } from '../../server/stability/stability-summary.js';
import { calibratedSurface, shoelace } from './surface-stubs.js';

// a 7 x 6 mask: a ring of pixels around a one-pixel hole, a pixel touching the ring only at a corner,
// and a separate L-shaped area
const MASK_ROWS = ['1110000', '1010000', '1110000', '0001011', '0000001', '0000000'];
const raster = { x0: 500, y0: 900, side: 10, width: 7, height: 6 };
const mask = Uint8Array.from(MASK_ROWS.join('').split('').map(Number));

function surfaceWith(excess: Uint8Array): StabilitySurface {
  return calibratedSurface(raster, excess, (p) => 0.5 + p / 1000);
}

describe('pixel polygons', () => {
  const polygons = pixelPolygons(mask, raster);

  it('one polygon per 4-connected component; the corner-touching pixel is its own', () => {
    expect(polygons.map((p) => p.pixels.length).sort((a, b) => a - b)).toEqual([1, 3, 8]);
  });

  it('closed rings, outer counter-clockwise, holes clockwise, area = pixels x pixel area', () => {
    for (const p of polygons) {
      for (const ring of [p.outer, ...p.holes]) expect(ring[0]).toEqual(ring[ring.length - 1]);
      expect(shoelace(p.outer)).toBeGreaterThan(0);
      for (const hole of p.holes) expect(shoelace(hole)).toBeLessThan(0);
      const area = shoelace(p.outer) + p.holes.reduce((sum, hole) => sum + shoelace(hole), 0);
      expect(area).toBe(p.pixels.length * 100);
      expect(booleanValid(polygon([p.outer, ...p.holes]))).toBe(true);
    }
  });

  it('the ring of pixels has the one-pixel hole at the right place', () => {
    const ring = polygons.find((p) => p.pixels.length === 8)!;
    expect(ring.holes).toHaveLength(1);
    // pixel (row 1, col 1): x 510..520, y 900 - 20 .. 900 - 10
    const corners = ring.holes[0]!.slice(0, -1).map(([x, y]) => `${x},${y}`).sort();
    expect(corners).toEqual(['510,880', '510,890', '520,880', '520,890']);
    expect(ring.outer).toHaveLength(5); // a square: 4 corners and the closing point
  });
});

describe('excess-areas GeoJSON', () => {
  it('planar input: working coordinates with a note, properties kind, maxShare, areaKm2', () => {
    const json = areasGeoJson(stabilitySummary(surfaceWith(mask), 0, false), { kind: 'planar' }, 'invented') as {
      gridshake: { coordinates: string; note: string };
      features: { properties: { kind: string; maxShare: number; areaKm2: number }; geometry: { coordinates: [number, number][][] } }[];
    };
    expect(json.gridshake.coordinates).toMatch(/not longitude\/latitude/);
    expect(json.features).toHaveLength(3);
    for (const feature of json.features) {
      expect(feature.properties.kind).toBe('excess');
      expect(feature.properties.maxShare).toBeGreaterThan(0.5);
    }
    expect(json.features.map((f) => f.properties.areaKm2).sort()).toEqual([0.0001, 0.0003, 0.0008]);
  });

  it('longitude/latitude: RFC 7946 rings (closed, right-hand rule), valid, geodesic area matching the pixels', () => {
    // an invented place; the local equal-area projection of longitude/latitude input
    const projection: ProjectionInfo = { kind: 'laea', lon0: 12.5, lat0: 47.25, proj4: '+proj=laea +lat_0=47.25 +lon_0=12.5 +x_0=0 +y_0=0 +datum=WGS84 +units=m +no_defs' };
    const big = new Uint8Array(mask.length);
    mask.forEach((v, p) => (big[p] = v));
    const json = areasGeoJson(stabilitySummary(surfaceWith(big), 0, false), projection, 'invented') as {
      features: { properties: { areaKm2: number }; geometry: { type: string; coordinates: [number, number][][] } }[];
    };
    for (const feature of json.features) {
      const rings = feature.geometry.coordinates;
      for (const ring of rings) expect(ring[0]).toEqual(ring[ring.length - 1]);
      expect(booleanClockwise(rings[0]!)).toBe(false);
      for (const hole of rings.slice(1)) expect(booleanClockwise(hole)).toBe(true);
      const shape = polygon(rings);
      expect(booleanValid(shape)).toBe(true);
      // the spherical area of @turf/turf (mean Earth radius) against the equal-area planar area: within 1 %
      expect(Math.abs(turfArea(shape) / 1e6 / feature.properties.areaKm2 - 1)).toBeLessThan(0.01);
    }
    const ring = json.features.find((f) => f.geometry.coordinates.length === 2)!;
    const [lon, lat] = ring.geometry.coordinates[1]![0]!;
    expect(Math.abs(lon - 12.5)).toBeLessThan(0.1);
    expect(Math.abs(lat - 47.25)).toBeLessThan(0.1);
    // the hole's centre is not in the polygon, a pixel of the ring is
    const hole = ring.geometry.coordinates[1]!;
    const centre = [(hole[0]![0] + hole[2]![0]) / 2, (hole[0]![1] + hole[2]![1]) / 2];
    expect(booleanPointInPolygon(point(centre), polygon(ring.geometry.coordinates))).toBe(false);
  });

  it('without calibration: no features and a note saying why', () => {
    const surface = { ...surfaceWith(new Uint8Array(mask.length)), calibration: null };
    const json = areasGeoJson(stabilitySummary(surface, 0, false), { kind: 'planar' }, 'invented') as { features: unknown[]; gridshake: { note: string } };
    expect(json.features).toEqual([]);
    expect(json.gridshake.note).toMatch(/sims = 0/);
  });
});
