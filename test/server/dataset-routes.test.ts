import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import type { FastifyInstance } from 'fastify';
import { multipartBody, sampleFile, scenarioParts, testApp, uploadScenario } from './server-helpers.js';

let app: FastifyInstance;
let close: () => Promise<void>;

beforeAll(async () => {
  ({ app, close } = await testApp());
});
afterAll(async () => close());

/** Shoelace area of a closed ring [[x, y], ...] (Gauss's area formula), independent of the server's code. */
function ringArea(ring: number[][]): number {
  let twice = 0;
  for (let k = 0; k + 1 < ring.length; k++) twice += ring[k]![0]! * ring[k + 1]![1]! - ring[k + 1]![0]! * ring[k]![1]!;
  return Math.abs(twice) / 2;
}

describe('GET /api/health', () => {
  it('reports version, database path and pool size', async () => {
    const response = await app.inject({ method: 'GET', url: '/api/health' });
    expect(response.statusCode).toBe(200);
    const body = response.json();
    expect(body.version).toBe('0.1.0');
    expect(body.databasePath).toMatch(/gridshake\.sqlite$/);
    expect(body.poolSize).toBe(2);
  });
});

describe('POST /api/datasets', () => {
  it('stores an upload and answers 201 with the summary; the summary reads back by id and in the list', async () => {
    const created = await uploadScenario(app, 'port-calverin');
    expect(created.id).toMatch(/^[0-9a-f-]{36}$/);
    const csvRecords = sampleFile('port-calverin', 'points.csv').trim().split('\n').length - 1;
    expect(created.n).toBe(csvRecords);
    // the generator put 4 records in the harbour water (samples/port-calverin/README.md)
    expect(created.nOutside).toBe(4);
    expect(created.nInside).toBe(csvRecords - 4);
    const area = JSON.parse(sampleFile('port-calverin', 'area.geojson')).features[0].geometry.coordinates[0];
    const harbour = JSON.parse(sampleFile('port-calverin', 'no-data.geojson')).features[0].geometry.coordinates[0];
    expect(created.validArea).toBeCloseTo(ringArea(area) - ringArea(harbour), 3);
    const sizes = created.suggestedCellSizes as { perCell: number; cellSize: number }[];
    expect(sizes.map((size) => size.perCell)).toEqual([1.6, 2, 5]);
    for (const size of sizes) {
      expect(size.cellSize).toBeCloseTo(Math.sqrt((size.perCell * (created.validArea as number)) / (created.nInside as number)), 9);
    }
    const byId = await app.inject({ method: 'GET', url: `/api/datasets/${created.id}` });
    expect(byId.json()).toEqual(created);
    const list = (await app.inject({ method: 'GET', url: '/api/datasets' })).json() as { id: string }[];
    expect(list.map((dataset) => dataset.id)).toContain(created.id);
  });

  it('refuses a body that is not multipart with 415', async () => {
    const response = await app.inject({ method: 'POST', url: '/api/datasets', payload: { points: 'x' } });
    expect(response.statusCode).toBe(415);
    expect(response.json().code).toBe('GS_ERR_CONTENT_TYPE');
  });

  it('refuses an upload without points with GS_ERR_VALIDATION naming the field', async () => {
    const body = await multipartBody([{ field: 'crs', value: 'planar' }]);
    const response = await app.inject({ method: 'POST', url: '/api/datasets', ...body });
    expect(response.statusCode).toBe(400);
    expect(response.json()).toMatchObject({ statusCode: 400, code: 'GS_ERR_VALIDATION' });
    expect(response.json().message).toContain("'points'");
  });

  it('refuses points sent as a text field instead of a file', async () => {
    const body = await multipartBody([{ field: 'points', value: 'id,x,y\n1,2,3\n' }, { field: 'crs', value: 'planar' }]);
    const response = await app.inject({ method: 'POST', url: '/api/datasets', ...body });
    expect(response.statusCode).toBe(400);
    expect(response.json().code).toBe('GS_ERR_VALIDATION');
    expect(response.json().message).toContain('body/points');
  });

  it('refuses an unknown field with GS_ERR_VALIDATION', async () => {
    const body = await multipartBody([...scenarioParts('brannock-heath'), { field: 'colour', value: 'red' }]);
    const response = await app.inject({ method: 'POST', url: '/api/datasets', ...body });
    expect(response.statusCode).toBe(400);
    expect(response.json().message).toContain("unknown field 'colour'");
  });
});

describe('GET /api/datasets/:id/geometry', () => {
  it('returns every point when there are few, with inside flags, the area and the zones', async () => {
    const created = await uploadScenario(app, 'brannock-heath');
    const response = await app.inject({ method: 'GET', url: `/api/datasets/${created.id}/geometry` });
    expect(response.statusCode).toBe(200);
    const geometry = response.json();
    expect(geometry.stride).toBe(1);
    expect(geometry.totalPoints).toBe(created.n);
    expect(geometry.points).toHaveLength(2 * (created.n as number));
    const firstRecord = sampleFile('brannock-heath', 'points.csv').split('\n')[1]!.split(',');
    expect(geometry.points.slice(0, 2)).toEqual([Number(firstRecord[1]), Number(firstRecord[2])]);
    expect(geometry.pointInside.reduce((a: number, b: number) => a + b, 0)).toBe(created.nInside);
    expect(geometry.studyArea).toHaveLength(1);
    expect(geometry.noDataZones).toHaveLength(1);
  });

  it('decimates with a deterministic stride ceil(n / maxPoints)', async () => {
    const created = await uploadScenario(app, 'port-calverin');
    const url = `/api/datasets/${created.id}/geometry?maxPoints=100`;
    const first = (await app.inject({ method: 'GET', url })).json();
    const again = (await app.inject({ method: 'GET', url })).json();
    const stride = Math.ceil((created.n as number) / 100);
    expect(first.stride).toBe(stride);
    expect(first.points).toHaveLength(2 * Math.ceil((created.n as number) / stride));
    expect(again.points).toEqual(first.points);
    const lines = sampleFile('port-calverin', 'points.csv').trim().split('\n').slice(1);
    const third = lines[2 * stride]!.split(',');
    expect(first.points.slice(4, 6)).toEqual([Number(third[1]), Number(third[2])]);
  });

  it('refuses a bad maxPoints and an unknown query field', async () => {
    const created = await uploadScenario(app, 'brannock-heath');
    const zero = await app.inject({ method: 'GET', url: `/api/datasets/${created.id}/geometry?maxPoints=0` });
    expect(zero.statusCode).toBe(400);
    expect(zero.json().code).toBe('GS_ERR_VALIDATION');
    expect(zero.json().message).toContain('querystring/maxPoints');
    const extra = await app.inject({ method: 'GET', url: `/api/datasets/${created.id}/geometry?zoom=3` });
    expect(extra.json().message).toContain("unknown field 'zoom'");
  });
});

describe('ids and deletion', () => {
  it('answers 400 for a malformed id and 404 for an unknown one', async () => {
    const malformed = await app.inject({ method: 'GET', url: '/api/datasets/not-an-id' });
    expect(malformed.statusCode).toBe(400);
    expect(malformed.json().code).toBe('GS_ERR_VALIDATION');
    const unknown = await app.inject({ method: 'GET', url: '/api/datasets/00000000-0000-4000-8000-000000000000' });
    expect(unknown.statusCode).toBe(404);
    expect(unknown.json()).toEqual({
      statusCode: 404,
      code: 'GS_ERR_NOT_FOUND',
      message: 'no dataset with id 00000000-0000-4000-8000-000000000000',
    });
  });

  it('DELETE removes the dataset (204), then 404', async () => {
    const created = await uploadScenario(app, 'brannock-heath');
    const removed = await app.inject({ method: 'DELETE', url: `/api/datasets/${created.id}` });
    expect(removed.statusCode).toBe(204);
    expect((await app.inject({ method: 'GET', url: `/api/datasets/${created.id}` })).statusCode).toBe(404);
    expect((await app.inject({ method: 'DELETE', url: `/api/datasets/${created.id}` })).statusCode).toBe(404);
  });

  it('an unknown route is a coded 404', async () => {
    const response = await app.inject({ method: 'GET', url: '/api/nothing-here' });
    expect(response.statusCode).toBe(404);
    expect(response.json()).toEqual({ statusCode: 404, code: 'GS_ERR_NOT_FOUND', message: 'no such route: GET /api/nothing-here' });
  });
});
