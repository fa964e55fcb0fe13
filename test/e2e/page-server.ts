/**
 * The real server for the browser test: buildApp on 127.0.0.1, a random port, a temporary data folder and the
 * invented demo scenarios loaded (without their demo sweeps, so the test's sweeps run at once).
 */
import { existsSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { AddressInfo } from 'node:net';
import type { FastifyInstance } from 'fastify';
import { buildApp, type AppOptions } from '../../server/app.js';
import { loadDemoScenarios } from '../../server/services/demo-loader.js';
import { DEFAULT_CLIENT_DIR, SAMPLES_DIR } from '../../server/services/project-paths.js';

export interface PageServer {
  app: FastifyInstance;
  origin: string;
  close: () => Promise<void>;
}

/** `options` go to buildApp: `queue` sends sweeps to a Redis queue as `serve --queue` does (test/queue/queue-page.test.ts). */
export async function startPageServer(options: Partial<AppOptions> = {}): Promise<PageServer> {
  if (!existsSync(join(DEFAULT_CLIENT_DIR, 'index.html'))) {
    throw new Error(`the page is not built (${DEFAULT_CLIENT_DIR}/index.html is missing): run npm run build first`);
  }
  const dataDir = mkdtempSync(join(tmpdir(), 'gridshake-e2e-'));
  const app = await buildApp({ dataDir, host: '127.0.0.1', threads: 2, ...options });
  await loadDemoScenarios(app.gridshake, SAMPLES_DIR, { sweeps: false });
  await app.listen({ host: '127.0.0.1', port: 0 });
  const { port } = app.server.address() as AddressInfo;
  return {
    app,
    origin: `http://127.0.0.1:${port}`,
    close: async () => {
      await app.close();
      rmSync(dataDir, { recursive: true, force: true });
    },
  };
}

export async function getJson<T>(server: PageServer, path: string): Promise<T> {
  const response = await fetch(`${server.origin}${path}`);
  if (!response.ok) throw new Error(`GET ${path}: ${response.status} ${await response.text()}`);
  return (await response.json()) as T;
}
