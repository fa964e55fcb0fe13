import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { errorCode, multipartBody, rawGet, rawRequest, smallDatasetParts, startServer, storeDigest, type RawResponse, type RunningServer } from './http-helpers.js';

// Security behaviours on a real server listening on 127.0.0.1 (random port), with raw requests over a socket so
// that Host headers and path bytes are sent exactly as an attacker would. Every refusal is checked for its status and
// its GS_ERR_ code, and the store is checked unchanged afterwards. Needs dist/ (npm test builds first).
const SECRET = 'gridshake-secret-marker-7d1f';
const BODY_LIMIT = 1024 * 1024;

let server: RunningServer;
let folder: string;
let datasetId: string;
let sweepId: string;
let digestBefore: string;
let refusals = 0;

function expectRefused(response: RawResponse, status: number, code: string, what: string): void {
  expect({ what, status: response.status, code: errorCode(response.body) }).toEqual({ what, status, code });
  expect(response.headers['access-control-allow-origin']).toBeUndefined();
  refusals += 1;
}

async function waitDone(id: string): Promise<void> {
  for (let k = 0; k < 600; k += 1) {
    const response = await fetch(`${server.base}/api/sweeps/${id}`);
    const record = (await response.json()) as { status: string };
    if (record.status === 'done') return;
    if (['failed', 'cancelled', 'interrupted'].includes(record.status)) throw new Error(`sweep ${record.status}`);
    await new Promise((resolve) => setTimeout(resolve, 50));
  }
  throw new Error('sweep did not finish');
}

beforeAll(async () => {
  // A client folder of our own, with a secret file beside it that no request may reach.
  folder = mkdtempSync(join(tmpdir(), 'gridshake-static-'));
  mkdirSync(join(folder, 'client', 'assets'), { recursive: true });
  writeFileSync(join(folder, 'client', 'index.html'), '<!doctype html><title>page</title>');
  writeFileSync(join(folder, 'client', 'assets', 'app.js'), 'console.log(1)');
  writeFileSync(join(folder, 'client', '.env'), SECRET);
  writeFileSync(join(folder, 'secret.txt'), SECRET);
  server = await startServer({ clientDir: join(folder, 'client'), bodyLimit: BODY_LIMIT, workBudget: 5e7 });
  const upload = await multipartBody(smallDatasetParts());
  const created = await fetch(`${server.base}/api/datasets`, { method: 'POST', body: upload.payload, headers: { 'content-type': upload.contentType } });
  expect(created.status).toBe(201);
  datasetId = ((await created.json()) as { id: string }).id;
  const started = await fetch(`${server.base}/api/sweeps`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ datasetId, plan: { cells: [150], placements: 4, sims: 0 } }),
  });
  expect(started.status).toBe(202);
  sweepId = ((await started.json()) as { id: string }).id;
  await waitDone(sweepId);
  digestBefore = storeDigest(server.databasePath);
});

afterAll(async () => {
  await server?.close();
  rmSync(folder, { recursive: true, force: true });
  console.log(`security: ${refusals} hostile requests refused with the right status and code, 0 served`);
});

describe('security on a real loopback server', () => {
  it('refuses foreign Host headers (DNS rebinding) with 421 GS_ERR_HOST', async () => {
    const port = server.port;
    for (const host of ['evil.example', `evil.example:${port}`, `127.0.0.1.evil.example:${port}`, `localhost:${port + 1}`, `127.0.0.2:${port}`, `0.0.0.0:${port}`, `[::2]:${port}`]) {
      for (const path of ['/api/datasets', `/api/sweeps/${sweepId}/placements.csv`, '/']) {
        expectRefused(await rawGet(port, path, host), 421, 'GS_ERR_HOST', `Host ${host} ${path}`);
      }
    }
    const post = await rawRequest(port, `POST /api/sweeps HTTP/1.1\r\nHost: evil.example\r\nContent-Type: application/json\r\nContent-Length: 2`, '{}');
    expectRefused(post, 421, 'GS_ERR_HOST', 'POST with a foreign Host');
    expect((await rawGet(port, '/api/health', `localhost:${port}`)).status).toBe(200);
  });

  it('refuses foreign Origin headers with 403 GS_ERR_ORIGIN, on reads and writes', async () => {
    const port = server.port;
    const origins = ['http://evil.example', 'null', `http://127.0.0.1:${port + 1}`, `https://127.0.0.1:${port}`, `http://user@127.0.0.1:${port}`, `http://127.0.0.1:${port}.evil.example`];
    for (const origin of origins) {
      expectRefused(await rawGet(port, '/api/datasets', `127.0.0.1:${port}`, `\r\nOrigin: ${origin}`), 403, 'GS_ERR_ORIGIN', `Origin ${origin}`);
      const body = JSON.stringify({ datasetId, plan: { cells: [150], placements: 2, sims: 0 } });
      const head = `POST /api/sweeps HTTP/1.1\r\nHost: 127.0.0.1:${port}\r\nOrigin: ${origin}\r\nContent-Type: application/json\r\nContent-Length: ${Buffer.byteLength(body)}`;
      expectRefused(await rawRequest(port, head, body), 403, 'GS_ERR_ORIGIN', `POST from ${origin}`);
      const remove = `DELETE /api/datasets/${datasetId} HTTP/1.1\r\nHost: 127.0.0.1:${port}\r\nOrigin: ${origin}`;
      expectRefused(await rawRequest(port, remove), 403, 'GS_ERR_ORIGIN', `DELETE from ${origin}`);
    }
  });

  it('refuses cross-site form posts (text/plain, urlencoded, form-data lookalikes) with 415 GS_ERR_CONTENT_TYPE', async () => {
    const port = server.port;
    const json = JSON.stringify({ datasetId, plan: { cells: [150], placements: 2, sims: 0 } });
    const posts: [string, string, string][] = [
      ['/api/sweeps', 'text/plain', json],
      ['/api/sweeps', 'text/plain;charset=UTF-8', json],
      ['/api/sweeps', 'application/x-www-form-urlencoded', `${encodeURIComponent(json)}=`],
      ['/api/datasets', 'application/x-www-form-urlencoded', 'points=x%2Cy%0A1%2C2'],
      ['/api/datasets', 'text/plain', 'x,y\n1,2\n'],
      [`/api/sweeps/${sweepId}/cancel`, 'text/plain', '{}'],
      [`/api/sweeps/${sweepId}/rerun`, 'text/plain', '{}'],
      ['/api/sweeps', 'application/json-seq', json],
      ['/api/sweeps', 'multipart/mixed; boundary=x', json],
    ];
    for (const [path, type, body] of posts) {
      const head = `POST ${path} HTTP/1.1\r\nHost: 127.0.0.1:${port}\r\nContent-Type: ${type}\r\nContent-Length: ${Buffer.byteLength(body)}`;
      expectRefused(await rawRequest(port, head, body), 415, 'GS_ERR_CONTENT_TYPE', `POST ${path} as ${type}`);
    }
    const remove = `DELETE /api/datasets/${datasetId} HTTP/1.1\r\nHost: 127.0.0.1:${port}\r\nContent-Type: text/plain\r\nContent-Length: 2`;
    expectRefused(await rawRequest(port, remove, '{}'), 415, 'GS_ERR_CONTENT_TYPE', 'DELETE with a text body');
  });

  it('never serves a file outside the client folder, whatever the encoding of the path', async () => {
    const port = server.port;
    const paths = [
      '/../secret.txt', '/..%2fsecret.txt', '/%2e%2e/secret.txt', '/%2e%2e%2fsecret.txt', '/%252e%252e%252fsecret.txt',
      '/.%2e/secret.txt', '/assets/../../secret.txt', '/assets/%2e%2e/%2e%2e/secret.txt', '/..%5csecret.txt', '/..\\secret.txt',
      `//${folder}/secret.txt`, `/${encodeURIComponent(join(folder, 'secret.txt'))}`, '/%c0%ae%c0%ae/secret.txt', '/.env', '/%2eenv',
      '/assets/app.js%00.html', '/index.html/../../secret.txt', '/..;/secret.txt',
      `/api/sweeps/..%2f..%2fsecret.txt/placements.csv`, `/api/sweeps/${sweepId}/..%2f..%2f..%2fsecret.txt`,
      `/api/sweeps/%2e%2e/report.html`, `/api/datasets/..%2F..%2Fsecret.txt/geometry`,
      `/api/sweeps/${sweepId}/grid.geojson?size=..%2f..%2fsecret.txt&placement=0`, `/api/sweeps/${sweepId}/report.html/..%2f..%2f..%2fsecret.txt`,
    ];
    let statuses = new Map<number, number>();
    for (const path of paths) {
      const response = await rawGet(port, path);
      expect({ path, served: response.body.includes(SECRET) }).toEqual({ path, served: false });
      expect({ path, status: response.status >= 400 && response.status < 500 }).toEqual({ path, status: true });
      statuses.set(response.status, (statuses.get(response.status) ?? 0) + 1);
      refusals += 1;
    }
    console.log(`security: ${paths.length} traversal paths refused (${[...statuses].map(([s, n]) => `${n} x ${s}`).join(', ')})`);
    statuses = new Map();
    expect((await rawGet(port, '/assets/app.js')).body).toBe('console.log(1)');
    expect((await rawGet(port, `/api/sweeps/${sweepId}/placements.csv`)).status).toBe(200);
  });

  it('refuses oversized bodies with 413 GS_ERR_TOO_LARGE, also when only the Content-Length is large', async () => {
    const port = server.port;
    const big = JSON.stringify({ datasetId, plan: { cells: [150], placements: 2, sims: 0 }, pad: 'p'.repeat(BODY_LIMIT + 10) });
    const json = `POST /api/sweeps HTTP/1.1\r\nHost: 127.0.0.1:${port}\r\nContent-Type: application/json\r\nContent-Length: ${Buffer.byteLength(big)}`;
    expectRefused(await rawRequest(port, json, big), 413, 'GS_ERR_TOO_LARGE', 'JSON over the body limit');
    const claimed = `POST /api/datasets HTTP/1.1\r\nHost: 127.0.0.1:${port}\r\nContent-Type: multipart/form-data; boundary=b\r\nContent-Length: 10000000000`;
    expectRefused(await rawRequest(port, claimed, '--b\r\n'), 413, 'GS_ERR_TOO_LARGE', 'a claimed 10 GB upload');
    const parts = smallDatasetParts();
    parts[0] = { field: 'points', value: `id,x,y\n${'s,1,1\n'.repeat(BODY_LIMIT / 6 + 100)}`, filename: 'big.csv' };
    const upload = await multipartBody(parts);
    const head = `POST /api/datasets HTTP/1.1\r\nHost: 127.0.0.1:${port}\r\nContent-Type: ${upload.contentType}\r\nContent-Length: ${upload.payload.length}`;
    expectRefused(await rawRequest(port, head, upload.payload), 413, 'GS_ERR_TOO_LARGE', 'an upload over the body limit');
  });

  it('refuses sweeps over the work budget with 400 GS_ERR_BUDGET, and plans out of range with 400', async () => {
    const port = server.port;
    const plans: [unknown, string][] = [
      [{ cells: [20, 30, 40], placements: 65536, sims: 999 }, 'GS_ERR_BUDGET'],
      [{ perCell: [2], placements: 4096, sims: 9999 }, 'GS_ERR_BUDGET'],
      [{ cells: [150], placements: 1e9, sims: 0 }, 'GS_ERR_VALIDATION'],
      [{ cells: [150], placements: 4, sims: -1 }, 'GS_ERR_VALIDATION'],
      [{ cells: [1e-300], placements: 4, sims: 0 }, 'GS_ERR_PARAMETER'],
    ];
    for (const [plan, code] of plans) {
      const body = JSON.stringify({ datasetId, plan });
      const head = `POST /api/sweeps HTTP/1.1\r\nHost: 127.0.0.1:${port}\r\nContent-Type: application/json\r\nContent-Length: ${Buffer.byteLength(body)}`;
      expectRefused(await rawRequest(port, head, body), 400, code, `plan ${JSON.stringify(plan)}`);
    }
  });

  it('left the store unchanged: same dataset list and the same database content digest', async () => {
    expect(storeDigest(server.databasePath)).toBe(digestBefore);
    const list = (await (await fetch(`${server.base}/api/datasets`)).json()) as { id: string }[];
    expect(list.map((d) => d.id)).toEqual([datasetId]);
    const sweeps = (await (await fetch(`${server.base}/api/sweeps`)).json()) as { id: string }[];
    expect(sweeps.map((s) => s.id)).toEqual([sweepId]);
  });
});
