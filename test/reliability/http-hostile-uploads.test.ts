import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { GridshakeError } from '../../server/errors.js';
import { loadDataset } from '../../server/inputs/index.js';
import { hostileCsvCase } from './hostile-csv.js';
import { hostileGeoJsonCase } from './hostile-geojson.js';
import type { HostileCase } from './hostile-outcome.js';
import { hostilePolygonCase } from './hostile-polygons.js';
import { datasetParts, errorCode, multipartBody, smallDatasetParts, startServer, storeDigest, type RunningServer } from './http-helpers.js';

// Hostile inputs uploaded through HTTP to a real loopback server: never a 5xx; a refusal carries the same code and
// status as loadDataset gives for the same files, and leaves the database content digest unchanged; an accepted
// upload is deleted again and the digest returns to its value before. Needs dist/ (npm test builds first).
const SEED = 5150;

let server: RunningServer;
let baseline: string;

beforeAll(async () => {
  server = await startServer();
  const upload = await multipartBody(smallDatasetParts());
  const response = await fetch(`${server.base}/api/datasets`, { method: 'POST', body: upload.payload, headers: { 'content-type': upload.contentType } });
  expect(response.status).toBe(201);
  baseline = storeDigest(server.databasePath);
});

afterAll(async () => server?.close());

function directOutcome(testCase: HostileCase): { status: number; code: string } {
  try {
    loadDataset(testCase.input, { ...testCase.options, maxPoints: undefined });
    return { status: 201, code: '' };
  } catch (error) {
    if (error instanceof GridshakeError) return { status: error.statusCode, code: error.code };
    return { status: 500, code: 'uncoded' };
  }
}

describe('hostile uploads through HTTP', () => {
  it('generated CSV, GeoJSON and polygon uploads: never 5xx, refusals change nothing', async () => {
    const cases = [
      ...fc.sample(hostileCsvCase, { seed: SEED, numRuns: 150 }),
      ...fc.sample(hostileGeoJsonCase, { seed: SEED, numRuns: 120 }),
      ...fc.sample(hostilePolygonCase, { seed: SEED, numRuns: 100 }),
    ];
    const failures: string[] = [];
    const statuses = new Map<number, number>();
    for (const testCase of cases) {
      const upload = await multipartBody(datasetParts(testCase.input, testCase.options));
      const response = await fetch(`${server.base}/api/datasets`, { method: 'POST', body: upload.payload, headers: { 'content-type': upload.contentType } });
      const text = await response.text();
      statuses.set(response.status, (statuses.get(response.status) ?? 0) + 1);
      const expected = directOutcome(testCase);
      const label = testCase.label.replace(/\s+/g, ' ').slice(0, 160);
      if (response.status >= 500) failures.push(`${label}: ${response.status} ${text.slice(0, 200)}`);
      else if (response.status === 201) {
        if (expected.status !== 201) failures.push(`${label}: stored although loadDataset refuses it with ${expected.code}`);
        const { id } = JSON.parse(text) as { id: string };
        const removed = await fetch(`${server.base}/api/datasets/${id}`, { method: 'DELETE' });
        if (removed.status !== 204) failures.push(`${label}: delete gave ${removed.status}`);
        if (storeDigest(server.databasePath) !== baseline) failures.push(`${label}: store differs after create and delete`);
      } else {
        const code = errorCode(text);
        if (code !== expected.code || response.status !== expected.status) {
          failures.push(`${label}: ${response.status} ${code}, loadDataset gives ${expected.status} ${expected.code}`);
        }
        if (storeDigest(server.databasePath) !== baseline) failures.push(`${label}: store changed by a refused upload`);
      }
    }
    const summary = [...statuses].sort((a, b) => a[0] - b[0]).map(([status, count]) => `${count} x ${status}`).join(', ');
    console.log(`hostile uploads over HTTP: ${cases.length} cases, ${failures.length} failures (${summary})`);
    for (const failure of failures.slice(0, 10)) console.log(`  failure: ${failure}`);
    expect(failures).toEqual([]);
    expect(statuses.get(201) ?? 0).toBeGreaterThan(10);
    const list = (await (await fetch(`${server.base}/api/datasets`)).json()) as unknown[];
    expect(list).toHaveLength(1);
  });
});
