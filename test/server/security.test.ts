import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import type { FastifyInstance } from 'fastify';
import { mkdirSync, writeFileSync } from 'node:fs';
import { request as httpRequest } from 'node:http';
import type { AddressInfo } from 'node:net';
import { join } from 'node:path';
import { multipartBody, sampleFile, scenarioParts, tempFolder, testApp, uploadScenario } from './server-helpers.js';

let app: FastifyInstance;
let close: () => Promise<void>;
let clientDir: ReturnType<typeof tempFolder>;
const SECRET = 'secret-outside-the-client-folder';

beforeAll(async () => {
  // a client folder with a page, and a file beside it that must never be served
  clientDir = tempFolder('gridshake-client-');
  mkdirSync(join(clientDir.path, 'client', 'assets'), { recursive: true });
  writeFileSync(join(clientDir.path, 'client', 'index.html'), '<!doctype html><title>page</title>');
  writeFileSync(join(clientDir.path, 'client', 'assets', 'app.js'), 'console.log(1)');
  writeFileSync(join(clientDir.path, 'client', '.env'), SECRET);
  writeFileSync(join(clientDir.path, 'secret.txt'), SECRET);
  ({ app, close } = await testApp({ clientDir: join(clientDir.path, 'client'), bodyLimit: 256 * 1024, maxPoints: 500 }));
});
afterAll(async () => {
  await close();
  clientDir.remove();
});

describe('Host header (DNS rebinding)', () => {
  it('refuses a foreign Host with 421 GS_ERR_HOST', async () => {
    const response = await app.inject({ method: 'GET', url: '/api/health', headers: { host: 'evil.example:5178' } });
    expect(response.statusCode).toBe(421);
    expect(response.json().code).toBe('GS_ERR_HOST');
  });

  it('accepts localhost, 127.0.0.1 and [::1]', async () => {
    for (const host of ['localhost:5178', '127.0.0.1:5178', '[::1]:5178', 'LOCALHOST']) {
      expect((await app.inject({ method: 'GET', url: '/api/health', headers: { host } })).statusCode).toBe(200);
    }
  });

  it('on a listening server, refuses the right name with the wrong port and a missing Host', async () => {
    const served = await testApp();
    try {
      await served.app.listen({ host: '127.0.0.1', port: 0 });
      const port = (served.app.server.address() as AddressInfo).port;
      const get = (host: string | undefined): Promise<number> =>
        new Promise((resolve, reject) => {
          const request = httpRequest({ host: '127.0.0.1', port, path: '/api/health', setHost: false, headers: host === undefined ? {} : { host } });
          request.on('response', (response) => {
            response.resume();
            resolve(response.statusCode ?? 0);
          });
          request.on('error', reject);
          request.end();
        });
      expect(await get(`127.0.0.1:${port}`)).toBe(200);
      expect(await get(`localhost:${port}`)).toBe(200);
      expect(await get(`127.0.0.1:${port + 1}`)).toBe(421);
      expect(await get(`attacker.example:${port}`)).toBe(421);
      expect(await get(undefined)).toBeGreaterThanOrEqual(400);
    } finally {
      await served.close();
    }
  });
});

describe('cross-site requests', () => {
  it('refuses a foreign Origin with 403 GS_ERR_ORIGIN, also on reads', async () => {
    const post = await app.inject({
      method: 'POST',
      url: '/api/sweeps',
      headers: { origin: 'http://evil.example' },
      payload: { datasetId: '00000000-0000-4000-8000-000000000000', plan: { cells: [10] } },
    });
    expect(post.statusCode).toBe(403);
    expect(post.json().code).toBe('GS_ERR_ORIGIN');
    const read = await app.inject({ method: 'GET', url: '/api/datasets', headers: { origin: 'null' } });
    expect(read.statusCode).toBe(403);
  });

  it('accepts its own origin', async () => {
    const response = await app.inject({ method: 'GET', url: '/api/datasets', headers: { origin: 'http://localhost:5178' } });
    expect(response.statusCode).toBe(200);
    expect(response.headers['access-control-allow-origin']).toBeUndefined();
  });

  it('refuses text/plain and urlencoded posts (what a cross-site form can send) with 415', async () => {
    for (const type of ['text/plain', 'application/x-www-form-urlencoded']) {
      const before = (await app.inject({ method: 'GET', url: '/api/sweeps' })).json();
      const response = await app.inject({
        method: 'POST',
        url: '/api/sweeps',
        headers: { 'content-type': type },
        payload: 'datasetId=x&plan=y',
      });
      expect(response.statusCode).toBe(415);
      expect(response.json().code).toBe('GS_ERR_CONTENT_TYPE');
      expect((await app.inject({ method: 'GET', url: '/api/sweeps' })).json()).toEqual(before);
    }
    const upload = await app.inject({ method: 'POST', url: '/api/datasets', headers: { 'content-type': 'text/plain' }, payload: 'id,x,y' });
    expect(upload.statusCode).toBe(415);
  });

  it('allows a body-less DELETE and cancel, and refuses a body-less POST with a text type', async () => {
    const created = await uploadScenario(app, 'brannock-heath');
    const removed = await app.inject({ method: 'DELETE', url: `/api/datasets/${created.id}` });
    expect(removed.statusCode).toBe(204);
    const cancel = await app.inject({ method: 'POST', url: '/api/sweeps/00000000-0000-4000-8000-000000000000/cancel' });
    expect(cancel.statusCode).toBe(404);
    const typed = await app.inject({
      method: 'POST',
      url: '/api/sweeps/00000000-0000-4000-8000-000000000000/cancel',
      headers: { 'content-type': 'text/plain' },
    });
    expect(typed.statusCode).toBe(415);
  });

  it('sends no CORS headers, also to a preflight', async () => {
    const response = await app.inject({
      method: 'OPTIONS',
      url: '/api/sweeps',
      headers: { 'access-control-request-method': 'POST' },
    });
    expect(response.headers['access-control-allow-origin']).toBeUndefined();
    expect(response.headers['access-control-allow-methods']).toBeUndefined();
  });
});

describe('static files only from the client folder', () => {
  it('serves the page and its assets', async () => {
    const page = await app.inject({ method: 'GET', url: '/' });
    expect(page.statusCode).toBe(200);
    expect(page.body).toContain('<title>page</title>');
    expect((await app.inject({ method: 'GET', url: '/assets/app.js' })).body).toBe('console.log(1)');
  });

  it('never serves files outside it or dotfiles, whatever the encoding of the path', async () => {
    const attempts = [
      '/../secret.txt',
      '/assets/../../secret.txt',
      '/%2e%2e/secret.txt',
      '/%2e%2e%2fsecret.txt',
      '/assets/%2e%2e/%2e%2e/secret.txt',
      '/..%5csecret.txt',
      '/%252e%252e/secret.txt',
      '/.env',
      '/%2eenv',
      `/${encodeURIComponent(join(clientDir.path, 'secret.txt'))}`,
      '//etc/passwd',
    ];
    for (const url of attempts) {
      const response = await app.inject({ method: 'GET', url });
      expect(response.statusCode, url).toBeGreaterThanOrEqual(400);
      expect(response.body, url).not.toContain(SECRET);
      expect(response.body, url).not.toContain('root:');
    }
  });
});

describe('size limits', () => {
  it('refuses a JSON body over the 64 KB JSON limit with 413 GS_ERR_TOO_LARGE (the upload limit does not apply)', async () => {
    const response = await app.inject({
      method: 'POST',
      url: '/api/sweeps',
      headers: { 'content-type': 'application/json' },
      payload: JSON.stringify({ datasetId: 'x', plan: { cells: [1] }, padding: 'x'.repeat(300 * 1024) }),
    });
    expect(response.statusCode).toBe(413);
    expect(response.json()).toMatchObject({ code: 'GS_ERR_TOO_LARGE' });
    expect(response.json().message).toContain('64 KB');
  });

  it('refuses an upload over bodyLimit with 413 and stores nothing', async () => {
    const before = (await app.inject({ method: 'GET', url: '/api/datasets' })).json();
    const big = 'id,x,y\n' + Array.from({ length: 20000 }, (_, k) => `${k},${k % 1000}.5,${k % 700}.25`).join('\n');
    const body = await multipartBody([{ field: 'points', value: big, filename: 'big.csv' }, { field: 'crs', value: 'planar' }]);
    expect(body.payload.length).toBeGreaterThan(256 * 1024);
    const response = await app.inject({ method: 'POST', url: '/api/datasets', ...body });
    expect(response.statusCode).toBe(413);
    expect(response.json().code).toBe('GS_ERR_TOO_LARGE');
    expect((await app.inject({ method: 'GET', url: '/api/datasets' })).json()).toEqual(before);
  });

  it('refuses more points than maxPoints with 413 naming the file and the limit', async () => {
    const parts = scenarioParts('port-calverin');
    const response = await app.inject({ method: 'POST', url: '/api/datasets', ...(await multipartBody(parts)) });
    expect(response.statusCode).toBe(413);
    expect(response.json().code).toBe('GS_ERR_TOO_LARGE');
    const n = sampleFile('port-calverin', 'points.csv').trim().split('\n').length - 1;
    expect(response.json().message).toBe(`points.csv: ${n} points, more than the limit of 500`);
  });
});
