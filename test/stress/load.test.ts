import { mkdtempSync, rmSync } from 'node:fs';
import { loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { multipartBody, smallDatasetParts, type UploadPart } from '../reliability/http-helpers.js';
import { startServe, type ServeProcess } from './serve-process.js';

// Load on a real server process (node bin/gridshake.js serve, 127.0.0.1, free port, 2 worker threads) while a large
// sweep computes: concurrent clients list, read summaries and statuses, hold SSE streams and upload small datasets.
// Bounded: LOAD_SECONDS of load, CLIENTS loops (each pausing THINK_MS between requests), SSE_STREAMS streams. Targets (issue 6): 0 5xx, p99 of reads < 50 ms;
// the p99 is asserted loosely (< 250 ms) because CI machines are shared.
const LOAD_SECONDS = 20;
const CLIENTS = 32;
const SSE_STREAMS = 48;
const P99_TARGET_MS = 50;
const P99_ASSERTED_MS = 250;
/** pause of each client between requests: 32 clients then offer up to about 300 requests a second */
const THINK_MS = 100;

let server: ServeProcess;
let dataDir: string;

async function upload(parts: UploadPart[]): Promise<{ id: string }> {
  const body = await multipartBody(parts);
  const response = await fetch(`${server.base}/api/datasets`, { method: 'POST', body: body.payload, headers: { 'content-type': body.contentType } });
  if (response.status !== 201) throw new Error(`upload: ${response.status} ${await response.text()}`);
  return (await response.json()) as { id: string };
}

/** An invented survey of 40000 records on a 4 km square: half uniform, half around 12 invented sites. */
function largeDatasetParts(): UploadPart[] {
  let state = 99;
  const random = (): number => {
    state = (Math.imul(state, 1664525) + 1013904223) >>> 0;
    return state / 4294967296;
  };
  const sites = Array.from({ length: 12 }, () => [400 + random() * 3200, 400 + random() * 3200]);
  const rows: string[] = [];
  for (let k = 0; k < 40_000; k += 1) {
    const site = sites[k % 12] as number[];
    const [x, y] = k % 2 === 0 ? [random() * 4000, random() * 4000] : [site[0]! + (random() - 0.5) * 300, site[1]! + (random() - 0.5) * 300];
    rows.push(`${k},${x.toFixed(2)},${y.toFixed(2)}`);
  }
  const area = { type: 'Polygon', coordinates: [[[0, 0], [4000, 0], [4000, 4000], [0, 4000], [0, 0]]] };
  return [
    { field: 'points', value: `id,x,y\n${rows.join('\n')}\n`, filename: 'survey.csv' },
    { field: 'area', value: JSON.stringify(area), filename: 'area.geojson' },
    { field: 'crs', value: 'planar' },
    { field: 'name', value: 'large invented survey' },
  ];
}

function quantile(sorted: number[], q: number): number {
  if (sorted.length === 0) return Number.NaN;
  return sorted[Math.min(sorted.length - 1, Math.floor(q * sorted.length))] as number;
}

beforeAll(async () => {
  dataDir = mkdtempSync(join(tmpdir(), 'gridshake-load-'));
  // the large sweep is only load (cancelled at the end); its stability surface (about 3.4e6 pixels per placement
  // at these cell sizes) takes it past the default work budget, so this server gets a larger one
  server = await startServe(['--data', dataDir, '--threads', '2', '--no-demo'], { env: { GRIDSHAKE_WORK_BUDGET: '2e11' } });
});

afterAll(async () => {
  if (server) await server.kill('SIGTERM');
  rmSync(dataDir, { recursive: true, force: true });
});

describe('load while a large sweep computes', () => {
  it(`${CLIENTS} clients for ${LOAD_SECONDS} s: no 5xx, reads fast, ${SSE_STREAMS} SSE streams held`, async () => {
    const large = await upload(largeDatasetParts());
    const small = await upload(smallDatasetParts(3, 'small reference'));
    const finished = await fetch(`${server.base}/api/sweeps`, {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ datasetId: small.id, plan: { cells: [150, 250], placements: 16, sims: 9, alpha: 0.1 } }),
    });
    const finishedId = ((await finished.json()) as { id: string }).id;
    for (let k = 0; k < 200; k += 1) {
      const record = (await (await fetch(`${server.base}/api/sweeps/${finishedId}`)).json()) as { status: string };
      if (record.status === 'done') break;
      await new Promise((resolve) => setTimeout(resolve, 50));
    }
    const started = await fetch(`${server.base}/api/sweeps`, {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ datasetId: large.id, plan: { perCell: [1.6, 2, 5], placements: 1024, sims: 39, seed: 5 } }),
    });
    expect(started.status).toBe(202);
    const bigId = ((await started.json()) as { id: string }).id;
    // the start of a sweep (sharing points, drawing CSR patterns, queuing tasks) is timed apart from steady computing
    let startStallMs = 0;
    const startBegan = Date.now();
    for (;;) {
      const begin = performance.now();
      const record = (await (await fetch(`${server.base}/api/sweeps/${bigId}`)).json()) as { status: string; progress: { done: number } };
      startStallMs = Math.max(startStallMs, performance.now() - begin);
      if (record.status === 'running' && record.progress.done > 0) break;
      if (Date.now() - startBegan > 30_000) throw new Error(`sweep not computing after 30 s: ${record.status}`);
      await new Promise((resolve) => setTimeout(resolve, 10));
    }
    console.log(`load: sweep start took ${((Date.now() - startBegan) / 1000).toFixed(1)} s to the first finished placement; slowest status read meanwhile ${startStallMs.toFixed(0)} ms`);

    const deadline = Date.now() + LOAD_SECONDS * 1000;
    const latencies: number[] = [];
    const statuses = new Map<number, number>();
    let requests = 0;
    let networkErrors = 0;
    let uploads = 0;
    const count = (status: number): void => {
      statuses.set(status, (statuses.get(status) ?? 0) + 1);
    };

    // SSE streams on the running sweep, held for the whole load
    const sse = new AbortController();
    let streamsOpened = 0;
    let streamEvents = 0;
    const streams = Array.from({ length: SSE_STREAMS }, async () => {
      try {
        const response = await fetch(`${server.base}/api/sweeps/${bigId}/events`, { signal: sse.signal });
        requests += 1;
        count(response.status);
        if (response.status !== 200 || response.body === null) return;
        streamsOpened += 1;
        const reader = response.body.getReader();
        for (;;) {
          const { done, value } = await reader.read();
          if (done) break;
          streamEvents += (Buffer.from(value).toString().match(/^event: /gm) ?? []).length;
        }
      } catch (error) {
        if ((error as Error).name !== 'AbortError') networkErrors += 1;
      }
    });

    const reads = [
      '/api/datasets',
      `/api/datasets/${large.id}`,
      `/api/datasets/${small.id}`,
      '/api/sweeps',
      `/api/sweeps/${bigId}`,
      `/api/sweeps/${finishedId}`,
      '/api/health',
    ];
    const client = async (index: number): Promise<void> => {
      let step = index;
      while (Date.now() < deadline) {
        step += 1;
        await new Promise((resolve) => setTimeout(resolve, THINK_MS));
        try {
          if (step % 40 === 0) {
            const body = await multipartBody(smallDatasetParts(step, `upload ${step}`));
            const created = await fetch(`${server.base}/api/datasets`, { method: 'POST', body: body.payload, headers: { 'content-type': body.contentType } });
            requests += 1;
            count(created.status);
            if (created.status === 201) {
              uploads += 1;
              const { id } = (await created.json()) as { id: string };
              const removed = await fetch(`${server.base}/api/datasets/${id}`, { method: 'DELETE' });
              requests += 1;
              count(removed.status);
            } else await created.arrayBuffer();
            continue;
          }
          const path = reads[step % reads.length] as string;
          const begin = performance.now();
          const response = await fetch(`${server.base}${path}`);
          await response.arrayBuffer();
          latencies.push(performance.now() - begin);
          requests += 1;
          count(response.status);
        } catch {
          networkErrors += 1;
        }
      }
    };
    await Promise.all(Array.from({ length: CLIENTS }, (_, k) => client(k)));
    const held = streamsOpened;
    const during = (await (await fetch(`${server.base}/api/sweeps/${bigId}`)).json()) as { status: string; progress: { done: number; total: number } };
    sse.abort();
    await Promise.all(streams);
    await fetch(`${server.base}/api/sweeps/${bigId}/cancel`, { method: 'POST' });

    latencies.sort((a, b) => a - b);
    const p50 = quantile(latencies, 0.5);
    const p99 = quantile(latencies, 0.99);
    const fiveHundreds = [...statuses].filter(([s]) => s >= 500).reduce((sum, [, n]) => sum + n, 0);
    const other = [...statuses].filter(([s]) => s >= 400 && s < 500).reduce((sum, [, n]) => sum + n, 0);
    console.log(`load: ${requests} requests sent in ${LOAD_SECONDS} s by ${CLIENTS} clients, ${fiveHundreds} 5xx, ${other} 4xx, ${networkErrors} network errors, ${uploads} uploads (each deleted again)`);
    console.log(`load: read latency p50 ${p50.toFixed(1)} ms, p99 ${p99.toFixed(1)} ms over ${latencies.length} reads (target p99 < ${P99_TARGET_MS} ms, asserted < ${P99_ASSERTED_MS} ms), max ${latencies[latencies.length - 1]?.toFixed(1)} ms, machine load average ${loadavg()[0]!.toFixed(1)} on 2 cores`);
    console.log(`load: ${held} of ${SSE_STREAMS} SSE streams held, ${streamEvents} events received; sweep ${during.status} at ${during.progress.done}/${during.progress.total} placements when the load ended`);

    expect(fiveHundreds).toBe(0);
    expect(other).toBe(0);
    expect(networkErrors).toBe(0);
    expect(held).toBe(SSE_STREAMS);
    expect(during.status).toBe('running');
    expect(streamEvents).toBeGreaterThanOrEqual(SSE_STREAMS * (LOAD_SECONDS / 2));
    expect(p99).toBeLessThan(P99_ASSERTED_MS);
    const health = await fetch(`${server.base}/api/health`);
    expect(health.status).toBe(200);
  });
});
