import type { FastifyInstance } from 'fastify';
import { Ajv, type AnySchema } from 'ajv';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { DatasetGeometry, HealthInfo, Plan, StoredDataset, SweepStarted, SweepView } from '../../shared/contracts.js';
import {
  DATASET_GEOMETRY_SCHEMA,
  DATASET_SUMMARY_SCHEMA,
  ERROR_SCHEMA,
  HEALTH_SCHEMA,
  SWEEP_SCHEMA,
  SWEEP_STARTED_SCHEMA,
} from '../../shared/http-schemas.js';
import { DEFAULT_PLAN } from '../../shared/plan-rules.js';
import type { FromSchema } from '../../shared/schema-type.js';
import type { datasetGeometry } from '../../server/services/dataset-geometry.js';
import type { DatasetService } from '../../server/services/dataset-service.js';
import type { SweepService } from '../../server/services/sweep-service.js';
import { polygonFile } from '../baseline/baseline-fixtures.js';
import { blocksGeoJson, csv, populationPoints, TOWN } from '../baseline/population-fixtures.js';
import { multipartBody, testApp, uploadScenario, waitForSweep } from './server-helpers.js';

/**
 * The HTTP contract is written once (shared/http-schemas.ts) and its types derived from it (shared/schema-type.ts).
 * At compile time (npm run typecheck): the derivation gives the types JSON Schema says (draft 7, json-schema.org
 * "Understanding JSON Schema": `required`, type lists, enum, const, anyOf), and the server's services return the
 * derived types. At run time: real responses from fastify.inject are checked against the same schema objects by Ajv
 * (the reference validator Fastify itself uses), closed: a response field the schema does not describe fails, as does
 * a described required field that is missing or of another type. Needs npm run build (the sweep runs on workers).
 */

type Equal<A, B> = (<T>() => T extends A ? 1 : 2) extends <T>() => T extends B ? 1 : 2 ? true : false;
type Expect<T extends true> = T;

// the derivation itself, on small schemas
const SAMPLE = {
  type: 'object',
  required: ['a', 'c'],
  properties: {
    a: { type: 'string' },
    b: { type: ['number', 'null'] },
    c: { type: 'array', items: { type: 'string', enum: ['x', 'y'] } },
    d: { anyOf: [{ const: 1 }, { type: 'object', properties: { e: { type: 'boolean' } } }] },
    f: { type: 'object', additionalProperties: true },
  },
} as const;
export type DerivationChecks = [
  Expect<
    Equal<
      FromSchema<typeof SAMPLE>,
      { a: string; c: ('x' | 'y')[]; b?: number | null; d?: 1 | { e?: boolean }; f?: Record<string, unknown> }
    >
  >,
  Expect<Equal<FromSchema<{ type: 'integer' }>, number>>,
  Expect<Equal<FromSchema<{ type: 'array' }>, unknown[]>>,
];

// the server's producers return the derived types; the stored plan keeps every field the defaults fill
export type ProducerChecks = [
  Expect<Equal<ReturnType<SweepService['get']>, SweepView>>,
  Expect<Equal<ReturnType<SweepService['start']>, SweepView>>,
  Expect<Equal<ReturnType<typeof datasetGeometry>, DatasetGeometry>>,
  Expect<Equal<SweepView['status'], FromSchema<typeof SWEEP_SCHEMA>['status']>>,
  Expect<Equal<HealthInfo, Omit<FromSchema<typeof HEALTH_SCHEMA>, 'status'>>>,
];
const producedDataset = (service: DatasetService) => service.get('') satisfies StoredDataset;
const startedFromView = (view: SweepView) => view satisfies SweepStarted;
const filledPlan = { ...DEFAULT_PLAN, cells: [1] } satisfies Plan;
void [producedDataset, startedFromView, filledPlan];

/** A copy of a schema whose objects that list their properties allow no others (the open `summary` stays open). */
function closed(schema: unknown): unknown {
  if (Array.isArray(schema)) return schema.map(closed);
  if (schema === null || typeof schema !== 'object') return schema;
  const copy: Record<string, unknown> = {};
  for (const [key, value] of Object.entries(schema)) {
    copy[key] = key === 'properties' ? Object.fromEntries(Object.entries(value as object).map(([name, sub]) => [name, closed(sub)])) : closed(value);
  }
  delete copy.$id;
  if ('properties' in copy) copy.additionalProperties = false;
  return copy;
}

const ajv = new Ajv({ allErrors: true, strict: true, allowUnionTypes: true });

function check(schema: AnySchema, body: unknown, what: string): void {
  const validate = ajv.compile(closed(schema) as AnySchema);
  const ok = validate(body);
  expect(ok, `${what}: ${ajv.errorsText(validate.errors)}`).toBe(true);
}

let app: FastifyInstance;
let close: () => Promise<void>;

beforeAll(async () => {
  ({ app, close } = await testApp());
});
afterAll(async () => close());

describe('real responses against the shared schemas', () => {
  it('datasets: upload with a baseline, list, one, geometry; health; a coded error', async () => {
    const body = await multipartBody([
      { field: 'points', value: csv(populationPoints(400, 3)), filename: 'points.csv' },
      { field: 'area', value: polygonFile([TOWN]), filename: 'area.geojson' },
      { field: 'crs', value: 'planar' },
      { field: 'baseline', value: blocksGeoJson(), filename: 'blocks.geojson' },
      { field: 'baselineField', value: 'residents' },
    ]);
    const uploaded = await app.inject({ method: 'POST', url: '/api/datasets', ...body });
    expect(uploaded.statusCode, uploaded.body).toBe(201);
    check(DATASET_SUMMARY_SCHEMA, uploaded.json(), 'POST /api/datasets');
    const heath = await uploadScenario(app, 'brannock-heath');
    check(DATASET_SUMMARY_SCHEMA, heath, 'POST /api/datasets (scenario)');
    // every field the summary carries is described, the optional ones included
    expect(Object.keys(uploaded.json()).sort()).toEqual(expect.arrayContaining(['baseline', 'projection', 'projectionUsed', 'createdAt', 'sample']));

    const list = (await app.inject({ method: 'GET', url: '/api/datasets' })).json() as unknown[];
    expect(list).toHaveLength(2);
    list.forEach((item, index) => check(DATASET_SUMMARY_SCHEMA, item, `GET /api/datasets [${index}]`));
    const id = (uploaded.json() as StoredDataset).id;
    check(DATASET_SUMMARY_SCHEMA, (await app.inject({ method: 'GET', url: `/api/datasets/${id}` })).json(), 'GET /api/datasets/:id');
    const geometry = (await app.inject({ method: 'GET', url: `/api/datasets/${id}/geometry` })).json() as DatasetGeometry;
    expect(geometry.baseline?.polygons.length).toBeGreaterThan(0);
    check(DATASET_GEOMETRY_SCHEMA, geometry, 'GET /api/datasets/:id/geometry');
    check(HEALTH_SCHEMA, (await app.inject({ method: 'GET', url: '/api/health' })).json(), 'GET /api/health');
    // the other two projection branches: longitude/latitude (local equal-area) and a projected EPSG system
    for (const [rows, crs, kind] of [
      ['lon,lat\n10.2,45.1\n10.8,45.9\n10.5,45.3\n', undefined, 'laea'],
      ['easting,northing\n500000,5000000\n501000,5002000\n500500,5001000\n', 'EPSG:32633', 'epsg'],
    ] as const) {
      const parts = [{ field: 'points', value: rows, filename: 'points.csv' }, ...(crs === undefined ? [] : [{ field: 'crs', value: crs }])];
      const projected = await app.inject({ method: 'POST', url: '/api/datasets', ...(await multipartBody(parts)) });
      expect(projected.statusCode, projected.body).toBe(201);
      expect((projected.json() as StoredDataset).projection?.kind).toBe(kind);
      check(DATASET_SUMMARY_SCHEMA, projected.json(), `POST /api/datasets (${kind})`);
    }
    const missing = await app.inject({ method: 'GET', url: '/api/datasets/00000000-0000-0000-0000-000000000000' });
    expect(missing.statusCode).toBe(404);
    check(ERROR_SCHEMA, missing.json(), 'GET /api/datasets/:id (404)');
  });

  it('sweeps: start, list, one with its summary, cancel refused, rerun', async () => {
    const heath = await uploadScenario(app, 'brannock-heath');
    const started = await app.inject({
      method: 'POST',
      url: '/api/sweeps',
      payload: { datasetId: heath.id, plan: { cells: [120], placements: 4, sims: 19, seed: 3, shape: ['square', 'hex'] } },
    });
    expect(started.statusCode, started.body).toBe(202);
    check(SWEEP_STARTED_SCHEMA, started.json(), 'POST /api/sweeps');
    const id = (started.json() as SweepStarted).id;
    const finished = await waitForSweep(app, id, 120_000);
    expect(finished.status).toBe('done');
    expect(finished.summary).toBeTypeOf('object');
    check(SWEEP_SCHEMA, finished, 'GET /api/sweeps/:id');
    const list = (await app.inject({ method: 'GET', url: `/api/sweeps?datasetId=${heath.id}` })).json() as unknown[];
    expect(list).toHaveLength(1);
    check(SWEEP_SCHEMA, list[0], 'GET /api/sweeps');
    const cancel = await app.inject({ method: 'POST', url: `/api/sweeps/${id}/cancel` });
    expect(cancel.statusCode).toBe(409);
    check(ERROR_SCHEMA, cancel.json(), 'POST /api/sweeps/:id/cancel (409)');
    const rerun = await app.inject({ method: 'POST', url: `/api/sweeps/${id}/rerun` });
    expect(rerun.statusCode, rerun.body).toBe(202);
    check(SWEEP_STARTED_SCHEMA, rerun.json(), 'POST /api/sweeps/:id/rerun');
    await waitForSweep(app, (rerun.json() as SweepStarted).id, 120_000);
  });

  it('the closed check fails on a field the schema does not describe, and on a missing one', () => {
    const validate = ajv.compile(closed(HEALTH_SCHEMA) as AnySchema);
    expect(validate({ status: 'ok', version: '1', databasePath: ':memory:', poolSize: 2 })).toBe(true);
    expect(validate({ status: 'ok', version: '1', databasePath: ':memory:', poolSize: 2, extra: 1 })).toBe(false);
    expect(validate({ status: 'ok', version: '1', databasePath: ':memory:' })).toBe(false);
  });
});
