/**
 * Helpers of the HTTP reliability tests: a real gridshake server on 127.0.0.1 (random port) over a temporary data
 * folder, raw HTTP requests over a socket (any Host header, any path bytes), multipart bodies, and a digest of the
 * whole database content read through a separate read-only connection.
 */
import Database from 'better-sqlite3';
import { createHash } from 'node:crypto';
import { mkdtempSync, rmSync } from 'node:fs';
import { connect } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { FastifyInstance } from 'fastify';
import { multipartBody as formDataBody, type UploadPart } from '../server/server-helpers.js';
import { buildApp, type AppOptions } from '../../server/app.js';
import type { DatasetInput, DatasetOptions } from '../../server/inputs/index.js';

export interface RunningServer {
  app: FastifyInstance;
  port: number;
  base: string;
  dataDir: string;
  databasePath: string;
  close: () => Promise<void>;
}

export async function startServer(options: AppOptions = {}): Promise<RunningServer> {
  const dataDir = mkdtempSync(join(tmpdir(), 'gridshake-reliability-'));
  const app = await buildApp({ dataDir, threads: 1, ...options });
  await app.listen({ host: '127.0.0.1', port: 0 });
  const address = app.server.address();
  const port = typeof address === 'object' && address !== null ? address.port : 0;
  return {
    app,
    port,
    base: `http://127.0.0.1:${port}`,
    dataDir,
    databasePath: join(dataDir, 'gridshake.sqlite'),
    close: async () => {
      await app.close();
      rmSync(dataDir, { recursive: true, force: true });
    },
  };
}

export interface RawResponse {
  status: number;
  headers: Record<string, string>;
  body: string;
}

/**
 * Send `head` (request line and headers, without the final blank line) and `body` over a fresh socket, exactly as
 * given, and read the whole response (Connection: close is added).
 */
export function rawRequest(port: number, head: string, body: Uint8Array | string = ''): Promise<RawResponse> {
  return new Promise((resolve, reject) => {
    const socket = connect({ host: '127.0.0.1', port });
    const chunks: Buffer[] = [];
    socket.setTimeout(20_000, () => socket.destroy(new Error(`no response to ${head.split('\r\n')[0]}`)));
    socket.on('data', (chunk) => chunks.push(chunk));
    socket.on('error', reject);
    socket.on('close', () => {
      const text = Buffer.concat(chunks).toString('latin1');
      const split = text.indexOf('\r\n\r\n');
      const lines = text.slice(0, split).split('\r\n');
      const status = Number(/^HTTP\/1\.[01] (\d{3})/.exec(lines[0] ?? '')?.[1] ?? 0);
      const headers: Record<string, string> = {};
      for (const line of lines.slice(1)) {
        const colon = line.indexOf(':');
        if (colon > 0) headers[line.slice(0, colon).trim().toLowerCase()] = line.slice(colon + 1).trim();
      }
      resolve({ status, headers, body: Buffer.from(text.slice(split + 4), 'latin1').toString('utf8') });
    });
    // no half-close: the server answers, then closes (Connection: close)
    socket.write(`${head}\r\nConnection: close\r\n\r\n`);
    if (body.length > 0) socket.write(body);
  });
}

/** A GET with the given raw path and Host header. */
export function rawGet(port: number, path: string, host = `127.0.0.1:${port}`, extra = ''): Promise<RawResponse> {
  return rawRequest(port, `GET ${path} HTTP/1.1\r\nHost: ${host}${extra}`);
}

/** Error code of a JSON error body, or '' when the body is not one. */
export function errorCode(body: string): string {
  try {
    const parsed = JSON.parse(body) as { code?: unknown };
    return typeof parsed.code === 'string' ? parsed.code : '';
  } catch {
    return '';
  }
}

export type { UploadPart };

/** The server tests' multipart body (test/server/server-helpers.ts) as bytes fetch accepts, with its content type. */
export async function multipartBody(parts: UploadPart[]): Promise<{ payload: Uint8Array<ArrayBuffer>; contentType: string }> {
  const body = await formDataBody(parts);
  return { payload: new Uint8Array(body.payload), contentType: body.headers['content-type']! };
}

/** The multipart parts of a loadDataset call (points, area, noData files; crs, x, y, id fields). */
export function datasetParts(input: DatasetInput, options: DatasetOptions): UploadPart[] {
  const parts: UploadPart[] = [{ field: 'points', value: input.points.content, filename: input.points.name }];
  if (input.area) parts.push({ field: 'area', value: input.area.content, filename: input.area.name });
  for (const zone of input.noData ?? []) parts.push({ field: 'noData', value: zone.content, filename: zone.name });
  for (const key of ['crs', 'x', 'y', 'id'] as const) {
    const value = options[key];
    if (value !== undefined) parts.push({ field: key, value });
  }
  return parts;
}

/**
 * SHA-256 of every row of every table (in primary-key order), read through a separate read-only connection:
 * equal digests mean equal stored content, whatever the WAL and checkpoint state of the file.
 */
export function storeDigest(databasePath: string): string {
  const db = new Database(databasePath, { readonly: true, fileMustExist: true });
  try {
    const hash = createHash('sha256');
    const tables = db.prepare("SELECT name FROM sqlite_master WHERE type = 'table' ORDER BY name").all() as { name: string }[];
    for (const { name } of tables) {
      hash.update(`table ${name}\n`);
      for (const row of db.prepare(`SELECT * FROM "${name}" ORDER BY 1, 2`).iterate() as Iterable<Record<string, unknown>>) {
        for (const [column, value] of Object.entries(row)) {
          hash.update(`${column}=`);
          hash.update(value instanceof Uint8Array ? value : String(value));
          hash.update('\u0000');
        }
        hash.update('\n');
      }
    }
    return hash.digest('hex');
  } finally {
    db.close();
  }
}

/** A small valid planar dataset upload: an invented survey of 60 sites on a 1 km square with a pond. */
export function smallDatasetParts(seed = 1, name = 'pond survey'): UploadPart[] {
  let state = seed >>> 0;
  const random = (): number => {
    state = (Math.imul(state, 1664525) + 1013904223) >>> 0;
    return state / 4294967296;
  };
  const rows = Array.from({ length: 60 }, (_, k) => `s${k + 1},${(random() * 1000).toFixed(2)},${(random() * 1000).toFixed(2)}`);
  const area = { type: 'Polygon', coordinates: [[[0, 0], [1000, 0], [1000, 1000], [0, 1000], [0, 0]]] };
  const pond = { type: 'Polygon', coordinates: [[[600, 600], [800, 600], [800, 750], [600, 750], [600, 600]]] };
  return [
    { field: 'points', value: `id,x,y\n${rows.join('\n')}\n`, filename: 'sites.csv' },
    { field: 'area', value: JSON.stringify(area), filename: 'area.geojson' },
    { field: 'noData', value: JSON.stringify(pond), filename: 'pond.geojson' },
    { field: 'crs', value: 'planar' },
    { field: 'name', value: name },
  ];
}
