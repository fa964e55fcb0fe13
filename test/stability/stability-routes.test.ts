/**
 * The stability files over HTTP (issue 17): a done sweep serves GET /api/sweeps/:id/stability-<side>m.tif (the
 * GeoTIFF, read back by the registry library geotiff) and /api/sweeps/:id/excess-areas-<side>m.geojson, under the
 * names that summary.stability lists (the same as `sweep --out`); unknown names are 404 with the names it has, and
 * names outside the pattern are 400. Data: the invented demo scenario brannock-heath.
 */
import type { FastifyInstance } from 'fastify';
import { fromArrayBuffer } from 'geotiff';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { SweepSummary } from '../../shared/contracts.js';
import { testApp, uploadScenario, waitForSweep } from '../server/server-helpers.js';

let app: FastifyInstance;
let close: () => Promise<void>;
let sweepId: string;
let summary: SweepSummary;

beforeAll(async () => {
  ({ app, close } = await testApp());
  const heath = await uploadScenario(app, 'brannock-heath');
  const started = await app.inject({ method: 'POST', url: '/api/sweeps', payload: { datasetId: heath.id, plan: { cells: [90, 140], placements: 8, sims: 39, seed: 3 } } });
  sweepId = (started.json() as { id: string }).id;
  const finished = await waitForSweep(app, sweepId);
  expect(finished.status).toBe('done');
  summary = finished.summary as SweepSummary;
}, 120_000);
afterAll(async () => close());

describe('stability files of a server sweep', () => {
  it('summary.stability lists one entry per cell size with the file names', () => {
    expect(summary.stability?.map((entry) => entry.files)).toEqual([
      { tif: 'stability-90m.tif', geojson: 'excess-areas-90m.geojson' },
      { tif: 'stability-140m.tif', geojson: 'excess-areas-140m.geojson' },
    ]);
  });

  it('serves the GeoTIFF with the raster of the summary', async () => {
    const response = await app.inject({ method: 'GET', url: `/api/sweeps/${sweepId}/stability-90m.tif` });
    expect(response.statusCode).toBe(200);
    expect(response.headers['content-type']).toMatch(/^image\/tiff/);
    const bytes = response.rawPayload;
    const image = await (await fromArrayBuffer(bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength) as ArrayBuffer)).getImage();
    const raster = summary.stability![0]!.raster;
    expect([image.getWidth(), image.getHeight(), image.getSamplesPerPixel()]).toEqual([raster.width, raster.height, 2]);
    expect(image.getOrigin()).toEqual([raster.x0, raster.y0, 0]);
    expect(image.getResolution()[0]).toBeCloseTo(raster.side, 9);
  });

  it('serves the areas as GeoJSON with the summary areas', async () => {
    const response = await app.inject({ method: 'GET', url: `/api/sweeps/${sweepId}/excess-areas-140m.geojson` });
    expect(response.statusCode).toBe(200);
    expect(response.headers['content-type']).toMatch(/^application\/geo\+json/);
    const collection = response.json() as { type: string; features: { properties: { kind: string } }[]; gridshake: { cellSize: number } };
    expect(collection.type).toBe('FeatureCollection');
    expect(collection.gridshake.cellSize).toBe(140);
    expect(collection.features.map((f) => f.properties.kind)).toEqual(summary.stability![1]!.areas.map((area) => area.kind));
  });

  it('404 for a size the sweep does not have, naming the files it has; 400 for other names', async () => {
    const missing = await app.inject({ method: 'GET', url: `/api/sweeps/${sweepId}/stability-100m.tif` });
    expect(missing.statusCode).toBe(404);
    expect(missing.json()).toMatchObject({ code: 'GS_ERR_NOT_FOUND' });
    expect((missing.json() as { message: string }).message).toContain('stability-90m.tif');
    const other = await app.inject({ method: 'GET', url: `/api/sweeps/${sweepId}/secrets.txt` });
    expect(other.statusCode).toBe(400);
  });
});
