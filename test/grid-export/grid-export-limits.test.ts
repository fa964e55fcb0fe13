/**
 * Issue 10, item 1: one grid export must not take the server down. The attack: a sweep at the finest allowed cell
 * size (0.5 m cells over 1 km^2, about 4 million cells), then GET grid.geojson?size=0&placement=0, which grew the
 * heap to 4.4 GB and killed the process. Now it is refused at once (GS_ERR_GRID_TOO_LARGE, 422) with a message that
 * says how to get it, and an allowed export (about 228,000 cells) is streamed while /api/health keeps answering.
 */
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { MAX_GEOJSON_GRID_CELLS } from '../../server/grid-export/grid-cells.js';
import { startFineGridServer } from './fine-grid-server.js';

let close: () => Promise<void>;
let base: string;
let sweepId: string;

beforeAll(async () => {
  ({ close, base, sweepId } = await startFineGridServer());
}, 180_000);
afterAll(async () => close());

describe('grid export limits', () => {
  it('0.5 m cells over 1 km^2: grid.geojson is refused at once with GS_ERR_GRID_TOO_LARGE and a way to get it', async () => {
    const heapBefore = process.memoryUsage().heapUsed;
    const started = performance.now();
    const response = await fetch(`${base}/api/sweeps/${sweepId}/grid.geojson?size=0&placement=0`);
    const seconds = (performance.now() - started) / 1000;
    expect(response.status).toBe(422);
    const body = (await response.json()) as { code: string; message: string };
    expect(body.code).toBe('GS_ERR_GRID_TOO_LARGE');
    expect(body.message).toContain('0.5 m cells');
    expect(body.message).toContain(`more than the ${MAX_GEOJSON_GRID_CELLS.toLocaleString('en-US')}`);
    // a coarser size that fits: sqrt(4e6 / 250,000) x 0.5 m = 2 m, rounded up
    expect(body.message).toMatch(/at least 2\.\d m/);
    expect(body.message).toContain('grid.gpkg?size=0&placement=0');
    expect(seconds).toBeLessThan(2);
    expect(process.memoryUsage().heapUsed - heapBefore).toBeLessThan(64 * 1024 * 1024);
  });

  it('an allowed grid (2.1 m, about 228,000 cells) is streamed while /api/health keeps answering', async () => {
    const latencies: number[] = [];
    let downloading = true;
    const poll = (async () => {
      while (downloading) {
        const started = performance.now();
        const health = await fetch(`${base}/api/health`);
        await health.arrayBuffer();
        latencies.push(performance.now() - started);
        await new Promise((resolve) => setTimeout(resolve, 25));
      }
    })();
    const response = await fetch(`${base}/api/sweeps/${sweepId}/grid.geojson?size=1&placement=0`);
    expect(response.status).toBe(200);
    let chunks = 0;
    let features = 0;
    let carry = '';
    const decoder = new TextDecoder();
    for await (const chunk of response.body as unknown as AsyncIterable<Uint8Array>) {
      chunks++;
      const text = carry + decoder.decode(chunk, { stream: true });
      features += text.split('"type":"Feature"').length - 1;
      carry = text.slice(-20);
      if (carry.includes('"type":"Feature"')) carry = '';
    }
    downloading = false;
    await poll;
    expect(features).toBeGreaterThan(220_000);
    expect(features).toBeLessThanOrEqual(MAX_GEOJSON_GRID_CELLS);
    expect(chunks).toBeGreaterThan(10);
    latencies.sort((a, b) => a - b);
    const worst = latencies[latencies.length - 1]!;
    console.log(`grid export: ${features} features in ${chunks} chunks; health ${latencies.length} requests, median ${latencies[latencies.length >> 1]!.toFixed(1)} ms, worst ${worst.toFixed(1)} ms`);
    expect(latencies.length).toBeGreaterThan(5);
    expect(worst).toBeLessThan(1000);
  });

  it('grid.gpkg at 2.1 m is allowed; an unknown coordinates value is refused', async () => {
    const gpkg = await fetch(`${base}/api/sweeps/${sweepId}/grid.gpkg?size=1&placement=0`);
    expect(gpkg.status).toBe(200);
    expect(Buffer.from(await gpkg.arrayBuffer()).subarray(0, 15).toString('latin1')).toBe('SQLite format 3');
    const bad = await fetch(`${base}/api/sweeps/${sweepId}/grid.geojson?size=1&placement=0&coordinates=feet`);
    expect(bad.status).toBe(400);
    const lonlat = await fetch(`${base}/api/sweeps/${sweepId}/grid.geojson?size=1&placement=0&coordinates=lonlat`);
    expect(lonlat.status).toBe(400);
    expect(((await lonlat.json()) as { message: string }).message).toContain('crs planar');
  });
});
