/**
 * `gridshake serve [--host 127.0.0.1] [--port 5178] [--data DIR] [--basemap URL]`: the local server with the page.
 * Binds to loopback unless --host says otherwise (then warns), prints the URL, loads the demo scenarios into an
 * empty store, and shuts down cleanly on SIGINT / SIGTERM (running sweeps are marked interrupted).
 */
import type { AddressInfo } from 'node:net';
import { buildApp } from '../app.js';
import { DEFAULT_BODY_LIMIT, DEFAULT_MAX_POINTS, MAX_THREADS_PER_CORE } from '../limits.js';
import { GridshakeError } from '../errors.js';
import { loadDemoScenarios } from '../services/demo-loader.js';
import { SAMPLES_DIR } from '../services/project-paths.js';
import { lockDataFolder } from '../store/data-folder-lock.js';
import { checkThreadCount } from '../sweeps/thread-count.js';
import { optionalString, parseChecked, parseWholeNumber, type OptionSpecs, type OptionValues } from './args.js';
import type { CliCommand, CliIo } from './cli-command.js';
import { QUEUE_OPTION, queueFromOptions } from './queue-option.js';
import { parseBasemapUrl } from '../security/basemap-url.js';
import { untilSignal } from './until-signal.js';

export const DEFAULT_PORT = 5178;
export const DEFAULT_HOST = '127.0.0.1';
export const DEFAULT_DATA_DIR = './.gridshake';

const LOOPBACK = new Set(['127.0.0.1', 'localhost', '::1']);

const OPTIONS: OptionSpecs = {
  host: { type: 'string', value: 'ADDRESS', description: `address to bind; default ${DEFAULT_HOST} (this computer only)` },
  port: { type: 'string', value: 'PORT', description: `port; default ${DEFAULT_PORT} (0 picks a free one)` },
  data: { type: 'string', value: 'DIR', description: `data folder of the database; default ${DEFAULT_DATA_DIR}` },
  'body-limit': { type: 'string', value: 'MB', description: `largest upload in MB; default ${DEFAULT_BODY_LIMIT / 1048576}` },
  'max-points': { type: 'string', value: 'N', description: `most points in one dataset; default ${DEFAULT_MAX_POINTS}` },
  threads: { type: 'string', value: 'N', description: `worker threads; default one per core, at most ${MAX_THREADS_PER_CORE} per core` },
  basemap: { type: 'string', value: 'URL', description: 'your own XYZ tile server for an optional map background, e.g. http://127.0.0.1:8080/{z}/{x}/{y}.png; default none (the page fetches nothing outside this server)' },
  'no-demo': { type: 'boolean', description: 'do not load the demo scenarios into an empty database' },
  ...QUEUE_OPTION,
};

/** The warning printed when the server binds to an address other computers can reach; null for loopback. */
export function bindWarning(host: string): string | null {
  if (LOOPBACK.has(host.toLowerCase())) return null;
  return (
    `gridshake: warning: binding to ${host} makes the server reachable from other computers; it has no login. ` +
    'Use it only on a network you trust.\n'
  );
}

function urlHost(host: string): string {
  if (host === '0.0.0.0' || host === '::') return '127.0.0.1';
  return host.includes(':') ? `[${host}]` : host;
}

async function run(values: OptionValues, io: CliIo): Promise<number> {
  const host = optionalString(values, 'host') ?? DEFAULT_HOST;
  const portText = optionalString(values, 'port');
  const port = portText === undefined ? DEFAULT_PORT : parseChecked(portText, 'port', 'a port from 0 to 65535', (v) => Number.isInteger(v) && v >= 0 && v <= 65535);
  const dataDir = optionalString(values, 'data') ?? DEFAULT_DATA_DIR;
  const limitText = optionalString(values, 'body-limit');
  const bodyLimit = limitText === undefined ? DEFAULT_BODY_LIMIT : Math.round(parseChecked(limitText, 'body-limit', 'a positive number of MB', (v) => v > 0) * 1048576);
  const pointsText = optionalString(values, 'max-points');
  const maxPoints = pointsText === undefined ? DEFAULT_MAX_POINTS : parseWholeNumber(pointsText, 'max-points', 1);
  const threadsText = optionalString(values, 'threads');
  const threads = threadsText === undefined ? undefined : checkThreadCount(parseWholeNumber(threadsText, 'threads', 1));
  const queue = queueFromOptions(values);
  const basemapText = optionalString(values, 'basemap');
  const basemap = basemapText === undefined ? undefined : parseBasemapUrl(basemapText);

  const warning = bindWarning(host);
  if (warning !== null) io.stderr(warning);
  const unlock = lockDataFolder(dataDir);
  let app: Awaited<ReturnType<typeof buildApp>>;
  try {
    app = await buildApp({ dataDir, host, bodyLimit, maxPoints, threads, queue, basemap, logger: { level: 'error' } });
  } catch (error) {
    unlock();
    throw error;
  }
  const services = app.gridshake;
  if (services.interruptedAtStart.length > 0) {
    io.stderr(`gridshake: ${services.interruptedAtStart.length} sweep(s) stopped by the last shutdown are marked interrupted; rerun them from the page\n`);
  }
  try {
    if (values['no-demo'] !== true && services.store.datasets.count() === 0) {
      const loaded = await loadDemoScenarios(services, SAMPLES_DIR);
      io.stderr(`gridshake: loaded ${loaded.length} invented demo scenarios from ${SAMPLES_DIR}\n`);
    }
    await app.listen({ host, port }).catch((error: unknown) => {
      throw new GridshakeError('GS_ERR_LISTEN', `cannot listen on ${host}:${port}: ${(error as Error).message}`);
    });
  } catch (error) {
    await app.close();
    unlock();
    throw error;
  }
  const address = app.server.address() as AddressInfo;
  if (queue !== null) io.stderr(`gridshake: sweeps go to the Redis queue at ${queue.display}; start workers with: gridshake worker --queue <URL>\n`);
  io.stdout(`gridshake serving at http://${urlHost(host)}:${address.port}/  (database ${services.store.path})\n`);
  const signal = await untilSignal();
  io.stderr(`gridshake: ${signal}: stopping\n`);
  await app.close();
  unlock();
  return 0;
}

export const serveCommand: CliCommand = {
  name: 'serve',
  summary: 'start the local server; open the address it prints in a browser',
  usage: 'Usage: gridshake serve [--host 127.0.0.1] [--port 5178] [--data DIR] [--queue URL] [--basemap URL]',
  options: OPTIONS,
  run,
};
