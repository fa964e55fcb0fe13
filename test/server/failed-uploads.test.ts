import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import type { FastifyInstance } from 'fastify';
import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { multipartBody, sampleFile, testApp, uploadScenario, type UploadPart } from './server-helpers.js';

let app: FastifyInstance;
let close: () => Promise<void>;
let dataDir: string;

beforeAll(async () => {
  ({ app, close, dataDir } = await testApp());
  await uploadScenario(app, 'brannock-heath');
});
afterAll(async () => close());

const AREA = (): UploadPart => ({ field: 'area', value: sampleFile('brannock-heath', 'area.geojson'), filename: 'area.geojson' });

/** What a client can see of the store, and the bytes of the committed database pages. */
async function snapshot(): Promise<{ datasets: unknown; sweeps: unknown }> {
  return {
    datasets: (await app.inject({ method: 'GET', url: '/api/datasets' })).json(),
    sweeps: (await app.inject({ method: 'GET', url: '/api/sweeps' })).json(),
  };
}

function databaseDigest(): string {
  app.gridshake.store.checkpoint();
  return createHash('sha256').update(readFileSync(join(dataDir, 'gridshake.sqlite'))).digest('hex');
}

describe('a failed upload changes nothing', () => {
  const badUploads: [string, UploadPart[], number, string, RegExp][] = [
    [
      'a non-numeric coordinate',
      [{ field: 'points', value: 'id,x,y\n1,10,20\n2,ten,30\n3,40,50\n', filename: 'nests.csv' }, { field: 'crs', value: 'planar' }, AREA()],
      400,
      'GS_ERR_INPUT',
      /nests\.csv.*line 3/,
    ],
    [
      'an empty points file',
      [{ field: 'points', value: '', filename: 'empty.csv' }, { field: 'crs', value: 'planar' }],
      400,
      'GS_ERR_INPUT',
      /empty\.csv/,
    ],
    [
      'a study area that is not GeoJSON',
      [
        { field: 'points', value: sampleFile('brannock-heath', 'points.csv'), filename: 'points.csv' },
        { field: 'area', value: '{ "type": "FeatureCollection", "features": [ ', filename: 'area.geojson' },
        { field: 'crs', value: 'planar' },
      ],
      400,
      'GS_ERR_INPUT',
      /area\.geojson/,
    ],
    [
      'an unknown coordinate system',
      [{ field: 'points', value: sampleFile('brannock-heath', 'points.csv'), filename: 'points.csv' }, { field: 'crs', value: 'mercator-ish' }],
      400,
      'GS_ERR_PARAMETER',
      // named as the page names it (the command line says --crs)
      /^the "Coordinate system" field must be 'planar' or 'EPSG:n', got 'mercator-ish'$/,
    ],
    [
      'projected columns without a crs',
      [{ field: 'points', value: sampleFile('brannock-heath', 'points.csv'), filename: 'points.csv' }],
      400,
      'GS_ERR_INPUT',
      /points\.csv: line 1/,
    ],
  ];

  for (const [label, parts, status, code, message] of badUploads) {
    it(`${label}: ${status} ${code} with the file and place named; store unchanged`, async () => {
      const before = await snapshot();
      const digest = databaseDigest();
      const response = await app.inject({ method: 'POST', url: '/api/datasets', ...(await multipartBody(parts)) });
      expect(response.statusCode).toBe(status);
      expect(response.json().code).toBe(code);
      expect(response.json().message).toMatch(message);
      expect(await snapshot()).toEqual(before);
      expect(databaseDigest()).toBe(digest);
    });
  }

  it('an upload whose connection breaks mid-body leaves nothing behind', async () => {
    const before = await snapshot();
    const body = await multipartBody([
      { field: 'points', value: sampleFile('brannock-heath', 'points.csv'), filename: 'points.csv' },
      { field: 'crs', value: 'planar' },
    ]);
    const truncated = body.payload.subarray(0, Math.floor(body.payload.length / 2));
    const response = await app.inject({
      method: 'POST',
      url: '/api/datasets',
      headers: { ...body.headers, 'content-length': String(truncated.length) },
      payload: truncated,
    });
    expect(response.statusCode).toBe(400);
    expect(response.json().code).toBe('GS_ERR_UPLOAD');
    expect(await snapshot()).toEqual(before);
  });
});
