/** Helpers of the server tests: an app on a temporary data folder, multipart bodies, waiting for sweeps. */
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { FastifyInstance } from 'fastify';
import { buildApp, type AppOptions } from '../../server/app.js';

export const SAMPLES = join(import.meta.dirname, '..', '..', 'samples');

export function sampleFile(scenario: string, file: string): string {
  return readFileSync(join(SAMPLES, scenario, file), 'utf8');
}

export function tempFolder(prefix = 'gridshake-test-'): { path: string; remove: () => void } {
  const path = mkdtempSync(join(tmpdir(), prefix));
  return { path, remove: () => rmSync(path, { recursive: true, force: true }) };
}

export async function testApp(options: AppOptions = {}): Promise<{ app: FastifyInstance; close: () => Promise<void>; dataDir: string }> {
  const folder = tempFolder();
  const app = await buildApp({ dataDir: folder.path, threads: 2, ...options });
  return {
    app,
    dataDir: folder.path,
    close: async () => {
      await app.close();
      folder.remove();
    },
  };
}

export interface UploadPart {
  field: string;
  value: string | Uint8Array;
  filename?: string;
}

/** A multipart/form-data body, serialised by the platform's FormData (as a browser would send it). */
export async function multipartBody(parts: UploadPart[]): Promise<{ payload: Buffer; headers: Record<string, string> }> {
  const form = new FormData();
  for (const part of parts) {
    const bytes = typeof part.value === 'string' ? part.value : new Uint8Array(part.value);
    if (part.filename === undefined) form.append(part.field, typeof bytes === 'string' ? bytes : Buffer.from(bytes).toString('utf8'));
    else form.append(part.field, new Blob([bytes]), part.filename);
  }
  const response = new Response(form);
  return {
    payload: Buffer.from(await response.arrayBuffer()),
    headers: { 'content-type': response.headers.get('content-type') as string },
  };
}

/** The multipart parts of one demo scenario with crs planar. */
export function scenarioParts(scenario: string, name = scenario): UploadPart[] {
  return [
    { field: 'points', value: sampleFile(scenario, 'points.csv'), filename: 'points.csv' },
    { field: 'area', value: sampleFile(scenario, 'area.geojson'), filename: 'area.geojson' },
    { field: 'noData', value: sampleFile(scenario, 'no-data.geojson'), filename: 'no-data.geojson' },
    { field: 'crs', value: 'planar' },
    { field: 'name', value: name },
  ];
}

export async function uploadScenario(app: FastifyInstance, scenario: string): Promise<{ id: string; [key: string]: unknown }> {
  const body = await multipartBody(scenarioParts(scenario));
  const response = await app.inject({ method: 'POST', url: '/api/datasets', ...body });
  if (response.statusCode !== 201) throw new Error(`upload failed: ${response.statusCode} ${response.body}`);
  return response.json();
}

const FINISHED = ['done', 'failed', 'cancelled', 'interrupted'];

/** Poll a sweep until it has finished; returns its final record. */
export async function waitForSweep(app: FastifyInstance, id: string, timeoutMs = 60_000): Promise<Record<string, unknown>> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const record = (await app.inject({ method: 'GET', url: `/api/sweeps/${id}` })).json() as Record<string, unknown>;
    if (FINISHED.includes(record.status as string)) return record;
    if (Date.now() > deadline) throw new Error(`sweep ${id} still ${String(record.status)} after ${timeoutMs} ms`);
    await new Promise((resolve) => setTimeout(resolve, 50));
  }
}

/** Parse a text/event-stream body into its events. */
export function parseEvents(text: string): { event: string; data: Record<string, unknown> }[] {
  return text
    .split('\n\n')
    .filter((block) => block.trim() !== '')
    .map((block) => {
      const lines = block.split('\n');
      const event = lines.find((line) => line.startsWith('event: '))?.slice(7) ?? 'message';
      const data = lines.filter((line) => line.startsWith('data: ')).map((line) => line.slice(6)).join('\n');
      return { event, data: JSON.parse(data) as Record<string, unknown> };
    });
}
