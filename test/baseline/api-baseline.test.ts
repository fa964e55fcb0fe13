import type { FastifyInstance } from 'fastify';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { multipartBody, testApp, waitForSweep, type UploadPart } from '../server/server-helpers.js';
import { featuresGeoJson, polygonFile, rect } from './baseline-fixtures.js';
import { blocksGeoJson, blocks, csv, populationPoints, TOWN } from './population-fixtures.js';
import { writeGeoPackage } from '../inputs/geopackage-writer.js';

/**
 * The HTTP API takes the population at risk with the upload (issue 15): multipart parts `baseline` (polygons) with
 * `baselineField`, or `controls`; the stored dataset keeps it, and its sweeps test against it. Needs npm run build.
 */
let app: FastifyInstance;
let close: () => Promise<void>;

const townParts = (): UploadPart[] => [
  { field: 'points', value: csv(populationPoints(400, 3)), filename: 'points.csv' },
  { field: 'area', value: polygonFile([TOWN]), filename: 'area.geojson' },
  { field: 'crs', value: 'planar' },
];

async function upload(parts: UploadPart[]) {
  const body = await multipartBody(parts);
  return app.inject({ method: 'POST', url: '/api/datasets', ...body });
}

beforeAll(async () => {
  ({ app, close } = await testApp());
});
afterAll(async () => close());

describe('POST /api/datasets with a baseline', () => {
  it('stores the baseline, and a sweep of the dataset tests against it', async () => {
    const response = await upload([
      ...townParts(),
      { field: 'baseline', value: blocksGeoJson(), filename: 'blocks.geojson' },
      { field: 'baselineField', value: 'residents' },
    ]);
    expect(response.statusCode, response.body).toBe(201);
    const dataset = response.json();
    expect(dataset.baseline).toMatchObject({ kind: 'polygons', file: 'blocks.geojson', field: 'residents', totalInside: 3645 });
    // the map's choropleth: each 500 m block (0.25 km²) at residents / 0.25 per km²
    const geometry = (await app.inject({ method: 'GET', url: `/api/datasets/${dataset.id}/geometry` })).json();
    expect(geometry.baseline.polygons).toHaveLength(16);
    expect(geometry.baseline.maxDensity).toBeCloseTo(900 / 0.25, 9);
    expect(geometry.baseline.polygons.map((polygon: { density: number }) => Math.round(polygon.density))).toContain(80);
    expect(geometry.baseline.polygons[0].rings[0]).toHaveLength(5);
    const started = await app.inject({
      method: 'POST',
      url: '/api/sweeps',
      payload: { datasetId: dataset.id, plan: { cells: [250], placements: 8, sims: 19, seed: 2 } },
    });
    expect(started.statusCode, started.body).toBe(202);
    const finished = await waitForSweep(app, started.json().id, 120_000);
    expect(finished.status).toBe('done');
    const summary = finished.summary as { expectedFrom: string; baseline: { field: string }; sizes: { areaOnly?: unknown }[]; conclusion: string };
    expect(summary.expectedFrom).toBe('baseline');
    expect(summary.baseline.field).toBe('residents');
    expect(summary.sizes[0]!.areaOnly).toBeDefined();
    expect(summary.conclusion).toContain('the population at risk (baseline: blocks.geojson, field residents)');
    const report = await app.inject({ method: 'GET', url: `/api/sweeps/${started.json().id}/report.html` });
    expect(report.body).toContain('Against area and against the population at risk');
  }, 180_000);

  it('refuses a bad baseline with GS_ERR_BASELINE (400) naming the feature', async () => {
    const response = await upload([
      ...townParts(),
      { field: 'baseline', value: featuresGeoJson([rect(0, 0, 1000, 2000), rect(1000, 0, 2000, 2000)], [{ residents: 5 }, { residents: 'n/a' }]), filename: 'blocks.geojson' },
      { field: 'baselineField', value: 'residents' },
    ]);
    expect(response.statusCode).toBe(400);
    expect(response.json()).toMatchObject({ statusCode: 400, code: 'GS_ERR_BASELINE' });
    expect(response.json().message).toMatch(/blocks\.geojson: feature 2: the baseline field 'residents' holds "n\/a"/);
  });

  it('takes control points', async () => {
    const response = await upload([...townParts(), { field: 'controls', value: csv(populationPoints(300, 4)), filename: 'controls.csv' }]);
    expect(response.statusCode, response.body).toBe(201);
    expect(response.json().baseline).toMatchObject({ kind: 'controls', totalInside: 300 });
  });
});

describe('POST /api/datasets/baseline-fields (the page\'s count-field picker)', () => {
  const ask = async (value: string | Uint8Array, filename: string) =>
    app.inject({ method: 'POST', url: '/api/datasets/baseline-fields', ...(await multipartBody([{ field: 'baseline', value, filename }])) });
  const { rings, counts } = blocks();
  const geometries = rings.map((ring) => ({ type: 'Polygon', coordinates: [ring] }));

  it('lists the numeric columns of a GeoPackage layer, in column order, as for GeoJSON properties', async () => {
    // label: text; households: integers; residents: reals; note: a number in some rows only; code: numeric text
    const properties = counts.map((residents, k) => ({
      label: `block ${k + 1}`,
      households: Math.ceil(residents / 2),
      residents: residents + 0.5,
      note: k === 3 ? 'empty' : k,
      code: String(100 + k),
    }));
    const gpkg = writeGeoPackage([{ table: 'blocks', geometryType: 'POLYGON', geometries, properties }]);
    const response = await ask(new Uint8Array(gpkg), 'blocks.gpkg');
    expect(response.statusCode, response.body).toBe(200);
    expect(response.json()).toEqual({ fields: ['households', 'residents', 'code'] });
    // the same rule as the page applies to GeoJSON (shared/numeric-properties.ts)
    const geojson = await ask(featuresGeoJson(rings, properties), 'blocks.geojson');
    expect(geojson.json()).toEqual({ fields: ['households', 'residents', 'code'] });
  });

  it('a NULL in some row leaves that column out', async () => {
    const properties = counts.map((residents, k) => ({ residents, households: k === 0 ? null : residents }));
    const gpkg = writeGeoPackage([{ table: 'blocks', geometryType: 'POLYGON', geometries, properties }]);
    expect((await ask(new Uint8Array(gpkg), 'blocks.gpkg')).json()).toEqual({ fields: ['residents'] });
  });

  it('refuses a file that is not a polygon layer with a coded 400 naming it, and a request without a file', async () => {
    const bad = await ask(new Uint8Array(Buffer.from('SQLite format 3\u0000 but not really a database')), 'broken.gpkg');
    expect(bad.statusCode).toBe(400);
    expect(bad.json().code).toMatch(/^GS_ERR_/);
    expect(bad.json().message).toContain('broken.gpkg');
    const none = await app.inject({ method: 'POST', url: '/api/datasets/baseline-fields', ...(await multipartBody([{ field: 'crs', value: 'planar' }])) });
    expect(none.statusCode).toBe(400);
  });
});

describe('GET /api/datasets/:id/geometry with controls', () => {
  it('carries the control points inside V for the map\'s controls layer', async () => {
    const controls = [...populationPoints(300, 4), [5000, 5000]];
    const response = await upload([...townParts(), { field: 'controls', value: csv(controls), filename: 'controls.csv' }]);
    expect(response.statusCode, response.body).toBe(201);
    const geometry = (await app.inject({ method: 'GET', url: `/api/datasets/${response.json().id}/geometry` })).json();
    expect(geometry.controls).toMatchObject({ total: 300, stride: 1 });
    expect(geometry.controls.points).toHaveLength(600);
    expect(geometry.baseline).toBeUndefined();
    const decimated = (await app.inject({ method: 'GET', url: `/api/datasets/${response.json().id}/geometry?maxPoints=100` })).json();
    expect(decimated.controls).toMatchObject({ total: 300, stride: 3 });
    expect(decimated.controls.points).toHaveLength(200);
  });
});
