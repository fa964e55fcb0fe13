/**
 * Issue 10, server items 2, 3 and 5-7: each attack replayed on a real loopback server, bounded in count and time.
 * 2. a multipart body sent to a route other than the upload is refused with 415 before its body is read;
 * 3. JSON bodies over 64 KB are refused with 413;
 * 5. at most 50 sweeps wait in the queue (429 GS_ERR_QUEUE_FULL); GET /api/sweeps is paged with x-total-count;
 * 6. at most 64 event streams are open at once (429 GS_ERR_TOO_MANY_STREAMS);
 * 7. slow bodies end with 408 GS_ERR_TIMEOUT, slow headers are cut off, and at most 8 uploads are received at once.
 */
import { connect, type Socket } from 'node:net';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { SweepRunner, SweepRunOptions } from '../../server/services/sweep-runner.js';
import { MAX_CONCURRENT_UPLOADS, MAX_EVENT_STREAMS, MAX_QUEUED_SWEEPS } from '../../server/limits.js';
import { errorCode, multipartBody, rawRequest, smallDatasetParts, startServer, storeDigest, type RunningServer } from './http-helpers.js';

/** A runner whose sweeps run until they are cancelled: the queue behind it only grows. */
class EndlessRunner implements SweepRunner {
  readonly threads = 1;
  runSweep(_dataset: unknown, _plan: unknown, options: SweepRunOptions): Promise<never> {
    return new Promise((_resolve, reject) => {
      options.signal?.addEventListener('abort', () => reject(Object.assign(new Error('aborted'), { name: 'AbortError' })));
    });
  }
  async destroy(): Promise<void> {}
}

let server: RunningServer;
let datasetId = '';

beforeAll(async () => {
  server = await startServer({ runner: new EndlessRunner(), timeouts: { headersMs: 1500, bodyMs: 1500 } });
  const body = await multipartBody(smallDatasetParts(5));
  const response = await fetch(`${server.base}/api/datasets`, { method: 'POST', body: body.payload, headers: { 'content-type': body.contentType } });
  expect(response.status).toBe(201);
  datasetId = ((await response.json()) as { id: string }).id;
});

afterAll(async () => {
  await server.close();
});

/** Open a socket, send `head` and `bodyStart`, and resolve with what comes back until the server closes (or timeoutMs). */
function partialRequest(head: string, bodyStart: string | Uint8Array, timeoutMs: number): Promise<{ text: string; closedAfterMs: number; socket: Socket }> {
  return new Promise((resolve) => {
    const began = Date.now();
    const socket = connect({ host: '127.0.0.1', port: server.port });
    let text = '';
    const timer = setTimeout(() => {
      socket.destroy();
      resolve({ text, closedAfterMs: Number.POSITIVE_INFINITY, socket });
    }, timeoutMs);
    socket.on('data', (chunk) => (text += chunk.toString('latin1')));
    socket.on('error', () => undefined);
    socket.on('close', () => {
      clearTimeout(timer);
      resolve({ text, closedAfterMs: Date.now() - began, socket });
    });
    socket.write(head);
    if (bodyStart.length > 0) socket.write(bodyStart);
  });
}

function statusOf(text: string): number {
  return Number(/^HTTP\/1\.1 (\d{3})/.exec(text)?.[1] ?? 0);
}

function bodyOf(text: string): string {
  return text.slice(text.indexOf('\r\n\r\n') + 4);
}

describe('item 2: multipart only on the upload route', () => {
  const targets = [
    ['POST', '/api/sweeps'],
    ['POST', '/api/sweeps/00000000-0000-4000-8000-000000000000/cancel'],
    ['DELETE', '/api/datasets/00000000-0000-4000-8000-000000000000'],
    ['POST', '/api/sweeps/00000000-0000-4000-8000-000000000000/rerun'],
  ] as const;
  for (const [method, path] of targets) {
    it(`${method} ${path}: a declared 60 MB multipart body is refused with 415 before it is sent`, async () => {
      const boundary = 'gridshakeattack';
      const head =
        `${method} ${path} HTTP/1.1\r\nHost: 127.0.0.1:${server.port}\r\n` +
        `Content-Type: multipart/form-data; boundary=${boundary}\r\nContent-Length: ${60 * 1024 * 1024}\r\n\r\n`;
      const start = `--${boundary}\r\nContent-Disposition: form-data; name="plan"; filename="a.bin"\r\n\r\n${'x'.repeat(1024)}`;
      // only 1 KB of the 60 MB is ever sent: the old server waited for (and buffered) the rest
      const result = await partialRequest(head, start, 5000);
      expect(statusOf(result.text)).toBe(415);
      expect(errorCode(bodyOf(result.text))).toBe('GS_ERR_CONTENT_TYPE');
      expect(result.closedAfterMs).toBeLessThan(3000);
    });
  }
});

describe('item 3: JSON bodies are small', () => {
  it('a 1 MB nested-array plan is refused with 413 GS_ERR_TOO_LARGE, and so is a declared 60 MB one before it is sent', async () => {
    const nested = `${'['.repeat(100_000)}${']'.repeat(100_000)}`;
    const plan = JSON.stringify({ datasetId, plan: { cells: [100], placements: 8, padding: nested.repeat(5) } });
    expect(plan.length).toBeGreaterThan(1_000_000);
    const began = performance.now();
    const response = await fetch(`${server.base}/api/sweeps`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: plan });
    expect(response.status).toBe(413);
    expect(errorCode(await response.text())).toBe('GS_ERR_TOO_LARGE');
    const head = `POST /api/sweeps HTTP/1.1\r\nHost: 127.0.0.1:${server.port}\r\nContent-Type: application/json\r\nContent-Length: ${60 * 1024 * 1024}\r\n\r\n`;
    const declared = await partialRequest(head, '[[[[', 5000);
    expect(statusOf(declared.text)).toBe(413);
    console.log(`limits: a 1 MB JSON plan refused with 413 in ${(performance.now() - began).toFixed(0)} ms (limit 64 KB)`);
  });

  it('a plan of ordinary size is still accepted', async () => {
    const response = await fetch(`${server.base}/api/sweeps`, {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ datasetId, plan: { cells: [100], placements: 8 } }),
    });
    expect(response.status).toBe(202);
    await fetch(`${server.base}/api/sweeps/${((await response.json()) as { id: string }).id}/cancel`, { method: 'POST' });
  });
});

describe('item 5: a capped queue and a paged list', () => {
  it(`accepts ${MAX_QUEUED_SWEEPS} waiting sweeps, refuses the next with 429 GS_ERR_QUEUE_FULL, and pages the list`, async () => {
    const start = (): Promise<Response> =>
      fetch(`${server.base}/api/sweeps`, {
        method: 'POST',
        headers: { 'content-type': 'application/json' },
        body: JSON.stringify({ datasetId, plan: { cells: [100], placements: 8 } }),
      });
    const accepted: string[] = [];
    let refused: Response | null = null;
    // one runs, MAX_QUEUED_SWEEPS wait; the attack sent 20,000
    for (let k = 0; k < MAX_QUEUED_SWEEPS + 5 && refused === null; k += 1) {
      const response = await start();
      if (response.status === 202) accepted.push(((await response.json()) as { id: string }).id);
      else refused = response;
    }
    expect(accepted.length).toBe(MAX_QUEUED_SWEEPS + 1);
    expect(refused?.status).toBe(429);
    const body = (await refused!.json()) as { code: string; message: string };
    expect(body.code).toBe('GS_ERR_QUEUE_FULL');
    expect(body.message).toMatch(/50/);

    const page = await fetch(`${server.base}/api/sweeps?limit=10&offset=5`);
    expect(page.status).toBe(200);
    const total = Number(page.headers.get('x-total-count'));
    expect(total).toBeGreaterThanOrEqual(accepted.length);
    const rows = (await page.json()) as { id: string }[];
    expect(rows.length).toBe(10);
    const all = (await (await fetch(`${server.base}/api/sweeps?limit=500`)).json()) as { id: string }[];
    expect(rows.map((r) => r.id)).toEqual(all.slice(5, 15).map((r) => r.id));
    expect((await fetch(`${server.base}/api/sweeps?limit=100000`)).status).toBe(400);

    // cancelling one makes room for one more
    await fetch(`${server.base}/api/sweeps/${accepted[accepted.length - 1]}/cancel`, { method: 'POST' });
    expect((await start()).status).toBe(202);
  });
});

describe('item 6: a cap on event streams', () => {
  it(`holds ${MAX_EVENT_STREAMS} streams, refuses one more with 429 GS_ERR_TOO_MANY_STREAMS, and takes it once one closes`, async () => {
    // a sweep that is still queued or running: a finished one's stream ends at once and frees its place
    const list = (await (await fetch(`${server.base}/api/sweeps?limit=500`)).json()) as { id: string; status: string }[];
    const id = list.find((sweep) => sweep.status === 'queued' || sweep.status === 'running')!.id;
    const streams: AbortController[] = [];
    // the responses stay referenced: undici cancels the body of a fetch response that is garbage collected, which
    // closed a stream in the middle of the test and let the extra one in
    const held: Response[] = [];
    for (let k = 0; k < MAX_EVENT_STREAMS; k += 1) {
      const controller = new AbortController();
      const response = await fetch(`${server.base}/api/sweeps/${id}/events`, { signal: controller.signal });
      expect(response.status).toBe(200);
      streams.push(controller);
      held.push(response);
    }
    const extra = await fetch(`${server.base}/api/sweeps/${id}/events`);
    expect(extra.status).toBe(429);
    expect(errorCode(await extra.text())).toBe('GS_ERR_TOO_MANY_STREAMS');
    const health = await fetch(`${server.base}/api/health`);
    expect(health.status).toBe(200);
    expect(held.every((response) => !response.bodyUsed)).toBe(true);
    streams.pop()!.abort();
    let again: Response | null = null;
    for (let tries = 0; tries < 50; tries += 1) {
      await new Promise((resolve) => setTimeout(resolve, 20));
      const response = await fetch(`${server.base}/api/sweeps/${id}/events`, { signal: AbortSignal.timeout(3000) }).catch(() => null);
      if (response?.status === 200) {
        again = response;
        break;
      }
      await response?.text();
    }
    expect(again?.status).toBe(200);
    await again?.body?.cancel();
    for (const controller of streams) controller.abort();
  });
});

describe('item 7: slow requests time out', () => {
  it('a body that stalls ends with 408 GS_ERR_TIMEOUT and a closed connection; the store is unchanged', async () => {
    const digest = storeDigest(server.databasePath);
    const body = await multipartBody(smallDatasetParts(9));
    const head =
      `POST /api/datasets HTTP/1.1\r\nHost: 127.0.0.1:${server.port}\r\nContent-Type: ${body.contentType}\r\n` +
      `Content-Length: ${body.payload.length}\r\n\r\n`;
    const result = await partialRequest(head, body.payload.subarray(0, 200), 10_000);
    expect(statusOf(result.text)).toBe(408);
    expect(errorCode(bodyOf(result.text))).toBe('GS_ERR_TIMEOUT');
    expect(result.closedAfterMs).toBeLessThan(5000);
    expect(storeDigest(server.databasePath)).toBe(digest);
  });

  it('headers that never end are cut off', async () => {
    const result = await partialRequest(`GET /api/health HTTP/1.1\r\nHost: 127.0.0.1:${server.port}\r\nX-Slow: a`, '', 10_000);
    expect(result.closedAfterMs).toBeLessThan(5000);
  });

  it(`40 slow uploads at once: ${MAX_CONCURRENT_UPLOADS} are received (then time out), the others are refused at once with 429; reads keep working`, async () => {
    const body = await multipartBody(smallDatasetParts(11));
    const head =
      `POST /api/datasets HTTP/1.1\r\nHost: 127.0.0.1:${server.port}\r\nContent-Type: ${body.contentType}\r\n` +
      `Content-Length: ${body.payload.length}\r\n\r\n`;
    const began = Date.now();
    const results = await Promise.all(Array.from({ length: 40 }, () => partialRequest(head, body.payload.subarray(0, 100), 10_000)));
    const statuses = results.map((r) => statusOf(r.text));
    expect(statuses.filter((s) => s === 429).length).toBe(40 - MAX_CONCURRENT_UPLOADS);
    expect(statuses.filter((s) => s === 408).length).toBe(MAX_CONCURRENT_UPLOADS);
    expect(Math.max(...results.map((r) => r.closedAfterMs))).toBeLessThan(6000);
    const health = await rawRequest(server.port, `GET /api/health HTTP/1.1\r\nHost: 127.0.0.1:${server.port}`);
    expect(health.status).toBe(200);
    console.log(`limits: 40 slow uploads: ${statuses.filter((s) => s === 429).length} refused with 429 at once, ${MAX_CONCURRENT_UPLOADS} timed out with 408; all closed within ${((Date.now() - began) / 1000).toFixed(1)} s`);
  });

  it('the default limits are short: headers 10 s, bodies 30 s (the attack held 300 uploads open past 130 s)', async () => {
    const defaults = await startServer();
    try {
      expect(defaults.app.server.headersTimeout).toBe(10_000);
      expect(defaults.app.server.requestTimeout).toBeLessThanOrEqual(45_000);
      expect(defaults.app.server.requestTimeout).toBeGreaterThan(0);
    } finally {
      await defaults.close();
    }
  });
});
