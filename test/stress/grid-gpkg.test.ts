/**
 * The largest allowed grid export: the GeoPackage of 0.5 m cells over 1 km^2 (about 4 million cells, written in
 * transactions of 2,000 rows) while /api/health keeps answering, with the server's memory bounded.
 */
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { startFineGridServer } from '../grid-export/fine-grid-server.js';

let close: () => Promise<void>;
let base: string;
let sweepId: string;

beforeAll(async () => {
  ({ close, base, sweepId } = await startFineGridServer());
}, 180_000);
afterAll(async () => close());

describe('grid.gpkg at the finest allowed cell size', () => {
  it('0.5 m cells over 1 km^2: about 4 million cells written while health answers', async () => {
    const latencies: number[] = [];
    let downloading = true;
    const poll = (async () => {
      while (downloading) {
        const started = performance.now();
        await (await fetch(`${base}/api/health`)).arrayBuffer();
        latencies.push(performance.now() - started);
        await new Promise((resolve) => setTimeout(resolve, 100));
      }
    })();
    const started = performance.now();
    let peakRss = process.memoryUsage().rss;
    const sampler = setInterval(() => (peakRss = Math.max(peakRss, process.memoryUsage().rss)), 200);
    const response = await fetch(`${base}/api/sweeps/${sweepId}/grid.gpkg?size=0&placement=0`);
    let bytes = 0;
    for await (const chunk of response.body as unknown as AsyncIterable<Uint8Array>) bytes += chunk.length;
    clearInterval(sampler);
    downloading = false;
    await poll;
    expect(response.status).toBe(200);
    latencies.sort((a, b) => a - b);
    const p99 = latencies[Math.floor(0.99 * (latencies.length - 1))]!;
    console.log(
      `grid.gpkg 0.5 m: ${(bytes / 1e6).toFixed(0)} MB in ${((performance.now() - started) / 1000).toFixed(1)} s, ` +
        `peak rss ${(peakRss / 1e6).toFixed(0)} MB, health ${latencies.length} requests, p99 ${p99.toFixed(0)} ms`,
    );
    expect(bytes).toBeGreaterThan(4e6 * 100);
    expect(p99).toBeLessThan(1000);
    expect(peakRss).toBeLessThan(1.5e9);
  });
});
