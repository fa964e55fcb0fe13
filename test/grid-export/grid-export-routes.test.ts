/**
 * The grid exports of a finished sweep, checked against outside sources:
 * - RFC 7946 (GeoJSON): longitude/latitude WGS 84 positions, exterior rings counter-clockwise (section 3.1.6),
 *   feature ids; the positions checked by projecting them back with proj4 (an independent use of the library with
 *   the definition the export records) onto the planar cell, within the promised 1 cm;
 * - OGC GeoPackage 1.3 (OGC 12-128r18): application_id 'GPKG', user_version 10300, the required tables and columns
 *   (clauses 1.1.2, 1.1.3, 2.1.5 and annex C), the three required gpkg_spatial_ref_sys rows, the geometry header;
 *   read back with the project's GeoPackage reader and with proj4 parsing the stored WKT.
 */
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import Database from 'better-sqlite3';
import proj4 from 'proj4';
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import type { FastifyInstance } from 'fastify';
import { multipartBody, tempFolder, testApp, waitForSweep } from '../server/server-helpers.js';
import { readGeoPackageFeatures } from '../../server/inputs/geopackage/read-geopackage.js';
import { lonLatScenario, utmScenario, UTM33N } from './geo-scenarios.js';

type Ring = [number, number][];
interface GridFeature { id: string; properties: { i: number; j: number; count: number; kept: boolean }; geometry: { coordinates: Ring[] } }
interface Grid { features: GridFeature[]; gridshake: { coordinates: string; projection: string }; crs?: unknown }

let app: FastifyInstance;
let close: () => Promise<void>;
const sweeps: Record<'lonlat' | 'utm', string> = { lonlat: '', utm: '' };
const folder = tempFolder('gridshake-gpkg-test-');

async function upload(files: { points: string; area: string; noData: string }, crs?: string): Promise<string> {
  const parts = [
    { field: 'points', value: files.points, filename: 'points.csv' },
    { field: 'area', value: files.area, filename: 'area.geojson' },
    { field: 'noData', value: files.noData, filename: 'no-data.geojson' },
    ...(crs ? [{ field: 'crs', value: crs }] : []),
  ];
  const response = await app.inject({ method: 'POST', url: '/api/datasets', ...(await multipartBody(parts)) });
  expect(response.statusCode, response.body).toBe(201);
  return response.json().id as string;
}

async function sweep(datasetId: string): Promise<string> {
  const plan = { cells: [150, 400], placements: 4, rotation: true, sims: 19, seed: 3 };
  const response = await app.inject({ method: 'POST', url: '/api/sweeps', payload: { datasetId, plan } });
  expect(response.statusCode, response.body).toBe(202);
  const done = await waitForSweep(app, response.json().id as string);
  expect(done.status).toBe('done');
  return done.id as string;
}

async function grid(id: string, query: string): Promise<Grid> {
  const response = await app.inject({ method: 'GET', url: `/api/sweeps/${id}/grid.geojson?${query}` });
  expect(response.statusCode, response.body).toBe(200);
  return response.json() as Grid;
}

const twiceArea = (ring: Ring): number => ring.slice(0, -1).reduce((s, p, k) => s + p[0] * ring[k + 1]![1] - ring[k + 1]![0] * p[1], 0);

function distanceToRing(x: number, y: number, ring: Ring): number {
  let best = Infinity;
  for (let k = 0; k + 1 < ring.length; k++) {
    const [ax, ay] = ring[k]!;
    const [bx, by] = ring[k + 1]!;
    const dx = bx - ax;
    const dy = by - ay;
    const t = Math.max(0, Math.min(1, ((x - ax) * dx + (y - ay) * dy) / (dx * dx + dy * dy)));
    best = Math.min(best, Math.hypot(x - ax - t * dx, y - ay - t * dy));
  }
  return best;
}

/** Largest distance (m) of the lon/lat ring, sampled 8 times per segment and projected with `definition`, from the planar ring. */
function worstDeviation(lonLat: Ring, planar: Ring, definition: string): number {
  const forward = proj4('+proj=longlat +datum=WGS84 +no_defs', definition);
  let worst = 0;
  for (let k = 0; k + 1 < lonLat.length; k++) {
    for (let step = 0; step <= 8; step++) {
      const t = step / 8;
      const lon = lonLat[k]![0] + t * (lonLat[k + 1]![0] - lonLat[k]![0]);
      const lat = lonLat[k]![1] + t * (lonLat[k + 1]![1] - lonLat[k]![1]);
      const [x, y] = forward.forward([lon, lat]);
      worst = Math.max(worst, distanceToRing(x!, y!, planar));
    }
  }
  return worst;
}

beforeAll(async () => {
  ({ app, close } = await testApp());
  sweeps.lonlat = await sweep(await upload(lonLatScenario()));
  sweeps.utm = await sweep(await upload(utmScenario(), 'EPSG:32633'));
}, 120_000);
afterAll(async () => {
  await close();
  folder.remove();
});

describe('grid.geojson in RFC 7946 longitude/latitude', () => {
  for (const kind of ['lonlat', 'utm'] as const) {
    it(`${kind} input: lon/lat cells that project back onto the planar square within 1 cm, counter-clockwise, with ids`, async () => {
      const lonLat = await grid(sweeps[kind], 'size=1&placement=2');
      const planar = await grid(sweeps[kind], 'size=1&placement=2&coordinates=planar');
      expect(lonLat.gridshake.coordinates).toContain('RFC 7946');
      expect(lonLat.crs).toBeUndefined();
      expect(planar.gridshake.coordinates).toContain('planar metres');
      expect(lonLat.features.length).toBe(planar.features.length);
      expect(lonLat.features.length).toBeGreaterThan(5);
      const definition = lonLat.gridshake.projection.slice(lonLat.gridshake.projection.indexOf('+proj='));
      if (kind === 'utm') expect(definition).toBe(`${UTM33N} +type=crs`);
      const planarById = new Map(planar.features.map((feature) => [feature.id, feature]));
      expect(planarById.size).toBe(planar.features.length);
      for (const feature of lonLat.features) {
        expect(feature.id).toBe(`${feature.properties.i},${feature.properties.j}`);
        const ring = feature.geometry.coordinates[0]!;
        expect(ring[0]).toEqual(ring[ring.length - 1]);
        for (const [lon, lat] of ring) {
          expect(lon).toBeGreaterThan(14.9);
          expect(lon).toBeLessThan(15.1);
          expect(lat).toBeGreaterThan(62.1);
          expect(lat).toBeLessThan(62.3);
        }
        expect(twiceArea(ring)).toBeGreaterThan(0); // RFC 7946 3.1.6: exterior rings counter-clockwise
        const square = planarById.get(feature.id)!;
        expect(square.properties).toEqual(feature.properties);
        expect(worstDeviation(ring, square.geometry.coordinates[0]!, definition)).toBeLessThan(0.01);
      }
    });
  }

  it('UTM input: cell corners equal proj4 inverse of the planar corners (1e-9 degree)', async () => {
    const lonLat = await grid(sweeps.utm, 'size=0&placement=1');
    const planar = await grid(sweeps.utm, 'size=0&placement=1&coordinates=planar');
    const inverse = proj4(UTM33N, '+proj=longlat +datum=WGS84 +no_defs');
    expect(planar.crs).toEqual({ type: 'name', properties: { name: 'urn:ogc:def:crs:EPSG::32633' } });
    const byId = new Map(lonLat.features.map((feature) => [feature.id, feature.geometry.coordinates[0]!]));
    for (const feature of planar.features.slice(0, 40)) {
      const ring = byId.get(feature.id)!;
      for (const corner of feature.geometry.coordinates[0]!) {
        const [lon, lat] = inverse.forward(corner) as [number, number];
        const nearest = Math.min(...ring.map(([a, b]) => Math.hypot(a - lon, b - lat)));
        expect(nearest).toBeLessThan(2e-9);
      }
    }
  });
});

describe('grid.gpkg: OGC GeoPackage 1.3', () => {
  async function fetchGpkg(id: string, name: string): Promise<string> {
    const response = await app.inject({ method: 'GET', url: `/api/sweeps/${id}/grid.gpkg?size=1&placement=2` });
    expect(response.statusCode, response.body).toBe(200);
    expect(response.headers['content-type']).toBe('application/geopackage+sqlite3');
    expect(response.headers['content-disposition']).toContain('.gpkg');
    const path = join(folder.path, name);
    writeFileSync(path, response.rawPayload);
    return path;
  }

  const columns = (db: Database.Database, table: string): string[] =>
    (db.prepare(`PRAGMA table_info(${table})`).all() as { name: string }[]).map((column) => column.name);

  for (const kind of ['lonlat', 'utm'] as const) {
    it(`${kind} input: required tables, columns, srs rows and geometry headers; reads back as the planar grid`, async () => {
      const path = await fetchGpkg(sweeps[kind], `${kind}.gpkg`);
      const db = new Database(path, { readonly: true });
      try {
        // OGC 12-128r18 requirement 2: application_id 0x47504B47 ('GPKG'); requirement 2a: user_version 10300
        expect(db.pragma('application_id', { simple: true })).toBe(0x47504b47);
        expect(db.pragma('user_version', { simple: true })).toBe(10300);
        expect(db.pragma('integrity_check', { simple: true })).toBe('ok');
        expect(db.pragma('foreign_key_check')).toEqual([]);
        // annex C table definitions
        expect(columns(db, 'gpkg_spatial_ref_sys')).toEqual(['srs_name', 'srs_id', 'organization', 'organization_coordsys_id', 'definition', 'description']);
        expect(columns(db, 'gpkg_contents')).toEqual(['table_name', 'data_type', 'identifier', 'description', 'last_change', 'min_x', 'min_y', 'max_x', 'max_y', 'srs_id']);
        expect(columns(db, 'gpkg_geometry_columns')).toEqual(['table_name', 'column_name', 'geometry_type_name', 'srs_id', 'z', 'm']);
        // requirement 11: rows for EPSG 4326, -1 and 0
        const srsIds = (db.prepare('SELECT srs_id FROM gpkg_spatial_ref_sys').all() as { srs_id: number }[]).map((row) => row.srs_id);
        expect(srsIds).toEqual(expect.arrayContaining([4326, -1, 0]));
        const layer = db.prepare("SELECT c.*, g.column_name, g.geometry_type_name, g.z, g.m FROM gpkg_contents c JOIN gpkg_geometry_columns g USING (table_name) WHERE c.data_type = 'features'").get() as Record<string, number | string>;
        expect(layer).toMatchObject({ table_name: 'grid_cells', column_name: 'geom', geometry_type_name: 'POLYGON', z: 0, m: 0 });
        expect(String(layer.last_change)).toMatch(/^\d{4}-\d\d-\d\dT\d\d:\d\d:\d\d\.\d{3}Z$/);
        const srs = db.prepare('SELECT * FROM gpkg_spatial_ref_sys WHERE srs_id = ?').get(layer.srs_id) as Record<string, string | number>;
        const planar = await grid(sweeps[kind], 'size=1&placement=2&coordinates=planar');
        const definition = planar.gridshake.projection.slice(planar.gridshake.projection.indexOf('+proj='));
        if (kind === 'utm') {
          expect(srs).toMatchObject({ srs_id: 32633, organization: 'EPSG', organization_coordsys_id: 32633 });
        } else {
          expect(srs).toMatchObject({ srs_id: 100001, organization: 'gridshake' });
          expect(definition).toMatch(/^\+proj=laea /);
        }
        // the stored WKT, parsed by proj4, is the same projection as the proj4 definition the export records
        const fromWkt = proj4('+proj=longlat +datum=WGS84 +no_defs', String(srs.definition));
        const fromProj4 = proj4('+proj=longlat +datum=WGS84 +no_defs', definition);
        for (const position of [[15.0, 62.2], [14.95, 62.18], [15.05, 62.25]]) {
          const a = fromWkt.forward(position);
          const b = fromProj4.forward(position);
          expect(Math.hypot(a[0]! - b[0]!, a[1]! - b[1]!)).toBeLessThan(1e-3);
        }
        // geometry header: "GP", version 0, flags 0x03 (little-endian, xy envelope), the layer's srs_id, envelope = bbox
        const rows = db.prepare('SELECT geom, i, j, count, kept FROM grid_cells ORDER BY fid').all() as { geom: Buffer; i: number; j: number; count: number; kept: number }[];
        expect(rows.length).toBe(planar.features.length);
        for (const row of rows) {
          expect(row.geom.subarray(0, 2).toString('latin1')).toBe('GP');
          expect(row.geom[2]).toBe(0);
          expect(row.geom[3]).toBe(0x03);
          expect(row.geom.readInt32LE(4)).toBe(layer.srs_id);
        }
        const bounds = [Number(layer.min_x), Number(layer.min_y), Number(layer.max_x), Number(layer.max_y)];
        const all = planar.features.flatMap((feature) => feature.geometry.coordinates[0]!);
        expect(bounds[0]).toBeCloseTo(Math.min(...all.map((p) => p[0])), 6);
        expect(bounds[3]).toBeCloseTo(Math.max(...all.map((p) => p[1])), 6);
        // read back with the project's GeoPackage reader: the same rings as the planar GeoJSON
        const { readFileSync } = await import('node:fs');
        const back = readGeoPackageFeatures({ name: 'grid.gpkg', content: new Uint8Array(readFileSync(path)) });
        expect(back.crs).toBe(kind === 'utm' ? 'EPSG:32633' : undefined);
        back.features.forEach((feature, k) => {
          const ring = (feature.geometry as { coordinates: Ring[] }).coordinates[0]!;
          const expected = planar.features[k]!.geometry.coordinates[0]!;
          ring.forEach((p, q) => {
            expect(p[0]).toBeCloseTo(expected[q]![0], 6);
            expect(p[1]).toBeCloseTo(expected[q]![1], 6);
          });
          const envelope = [rows[k]!.geom.readDoubleLE(8), rows[k]!.geom.readDoubleLE(16), rows[k]!.geom.readDoubleLE(24), rows[k]!.geom.readDoubleLE(32)];
          expect(envelope).toEqual([Math.min(...ring.map((p) => p[0])), Math.max(...ring.map((p) => p[0])), Math.min(...ring.map((p) => p[1])), Math.max(...ring.map((p) => p[1]))]);
          expect(rows[k]).toMatchObject({ i: planar.features[k]!.properties.i, count: planar.features[k]!.properties.count, kept: planar.features[k]!.properties.kept ? 1 : 0 });
        });
      } finally {
        db.close();
      }
    });
  }
});
