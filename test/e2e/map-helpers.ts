/** Helpers of the map's browser tests: uploads and sweeps through the API, reading the view's mapping, waiting. */
import type { Page } from 'playwright-core';
import { expect } from 'vitest';
import { getJson, type PageServer } from './page-server.js';

export interface StoredDataset { id: string; name: string; n: number; sample?: string | null }
export interface StabilityEntry {
  sizeIndex: number;
  cellSize: number;
  placements: number;
  raster: { x0: number; y0: number; side: number; width: number; height: number };
  excessThreshold: number | null;
  areas: { kind: 'excess' | 'deficit'; maxShare: number; areaKm2: number; rings: [number, number][][] }[];
  files: { tif: string; geojson: string };
}
export interface SweepRecord {
  id: string;
  status: string;
  summary: { plan: { alpha: number }; sizes: { sizeIndex: number; cellSize: number; shape?: string; reference: { placementIndex: number } }[]; stability?: StabilityEntry[] } | null;
}

export async function postJson<T>(server: PageServer, path: string, body: unknown): Promise<T> {
  const response = await fetch(`${server.origin}${path}`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify(body) });
  if (!response.ok) throw new Error(`POST ${path}: ${response.status} ${await response.text()}`);
  return (await response.json()) as T;
}

export async function upload(server: PageServer, name: string, csv: string, crs: string): Promise<StoredDataset> {
  const form = new FormData();
  form.append('points', new Blob([csv], { type: 'text/csv' }), `${name}.csv`);
  form.append('crs', crs);
  form.append('name', name);
  const response = await fetch(`${server.origin}/api/datasets`, { method: 'POST', body: form });
  if (!response.ok) throw new Error(`upload ${name}: ${response.status} ${await response.text()}`);
  return (await response.json()) as StoredDataset;
}

export async function finishedSweep(server: PageServer, datasetId: string, plan: Record<string, unknown>): Promise<SweepRecord> {
  const { id } = await postJson<{ id: string }>(server, '/api/sweeps', { datasetId, plan });
  for (let attempt = 0; attempt < 1500; attempt += 1) {
    const record = await getJson<SweepRecord>(server, `/api/sweeps/${id}`);
    if (record.status === 'done') return record;
    if (record.status === 'failed' || record.status === 'cancelled') throw new Error(`sweep ${id} ${record.status}`);
    await new Promise((resolve) => setTimeout(resolve, 200));
  }
  throw new Error(`sweep ${id} did not finish`);
}

export interface Probe { x: number; y: number; lon: number | null; lat: number | null }

/** Moves the mouse to (px, py) inside the map and reads the coordinates the page reports there. */
export async function probe(page: Page, px: number, py: number): Promise<Probe> {
  const box = (await page.locator('#map').boundingBox())!;
  await page.mouse.move(box.x + px, box.y + py);
  const text = await page.innerText('#map-pointer');
  const match = /x (-?[\d.]+) m, y (-?[\d.]+) m(?: \(longitude (-?[\d.]+), latitude (-?[\d.]+)\))?/.exec(text);
  if (!match) throw new Error(`no coordinates under the pointer: ${JSON.stringify(text)}`);
  return { x: Number(match[1]), y: Number(match[2]), lon: match[3] ? Number(match[3]) : null, lat: match[4] ? Number(match[4]) : null };
}

/** The view's mapping from map pixels to working coordinates, read from two probes. */
export async function viewMapping(page: Page): Promise<{ resolution: number; x0: number; y0: number }> {
  const a = await probe(page, 100, 100);
  const b = await probe(page, 300, 300);
  const resolution = (b.x - a.x) / 200;
  expect((a.y - b.y) / 200).toBeCloseTo(resolution, 2);
  return { resolution, x0: a.x - 100 * resolution, y0: a.y + 100 * resolution };
}

/** Waits until the view stops moving. */
export async function settle(page: Page): Promise<void> {
  let previous = '';
  for (let attempt = 0; attempt < 40; attempt += 1) {
    await page.waitForTimeout(150);
    const now = await page.innerText('#map .ol-scale-bar').catch(() => '');
    const frame = await page.getAttribute('#map', 'data-frame-ms');
    if (`${now}|${frame}` === previous) return;
    previous = `${now}|${frame}`;
  }
}

export async function openSweep(page: Page, server: PageServer, dataset: StoredDataset, sweepId: string): Promise<void> {
  await page.goto(`${server.origin}/`);
  await page.waitForSelector(`#dataset-select option[value="${dataset.id}"]`, { state: 'attached' });
  await page.selectOption('#dataset-select', dataset.id);
  await page.click('#use-dataset');
  await page.waitForSelector('[data-testid=dataset-summary]');
  await page.click(`[data-open-sweep="${sweepId}"]`);
  await page.waitForSelector('#pick-reference');
}

/** Even-odd point in rings (Shimrat 1962, CACM 5(8), Algorithm 112). */
export function insideRings(rings: [number, number][][], x: number, y: number): boolean {
  let inside = false;
  for (const ring of rings) {
    for (let k = 0, previous = ring.length - 1; k < ring.length; previous = k, k += 1) {
      const [xk, yk] = ring[k];
      const [xp, yp] = ring[previous];
      if (yk > y !== yp > y && x < ((xp - xk) * (y - yk)) / (yp - yk) + xk) inside = !inside;
    }
  }
  return inside;
}
