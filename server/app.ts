/**
 * buildApp(options): the gridshake HTTP app (Fastify), apart from listen (server/cli/serve-command.ts listens).
 * Opens the store, marks sweeps left running by an earlier process `interrupted`, builds the services and the sweep
 * queue on one worker pool, installs the request guards and the one error handler, and registers the routes.
 * Closing the app stops the queue (running sweeps become `interrupted`, event streams get their end), then the
 * connections, the pools and the store.
 * Limits (server/limits.ts): JSON bodies JSON_BODY_LIMIT, uploads --body-limit (multipart only on the upload route),
 * headers and bodies timed (server/security/request-timeouts.ts), worker threads at most MAX_THREADS_PER_CORE per core.
 */
import fastifyMultipart from '@fastify/multipart';
import Fastify, { type FastifyInstance, type FastifyServerOptions } from 'fastify';
import type { AddressInfo } from 'node:net';
import { registerClientStatic } from './routes/client-static.js';
import type { Basemap } from './security/basemap-url.js';
import { pagePolicy } from './security/content-security-policy.js';
import { registerDatasetRoutes, MAX_NO_DATA_FILES, uploadFileHandler } from './routes/dataset-routes.js';
import { installErrorHandling } from './routes/error-handler.js';
import { registerHealthRoutes } from './routes/health-routes.js';
import { DATASET_SUMMARY_SCHEMA, ERROR_SCHEMA, SWEEP_SCHEMA } from '../shared/http-schemas.js';
import { registerSweepEventsRoute } from './routes/sweep-events-route.js';
import { registerSweepExportRoutes } from './routes/sweep-export-routes.js';
import { registerSweepRoutes } from './routes/sweep-routes.js';
import { formatValidationErrors } from './routes/validation-message.js';
import { lazySchemaController } from './routes/lazy-schema-compilers.js';
import { createHostPolicy } from './security/allowed-hosts.js';
import { installRequestGuards } from './security/request-guards.js';
import { DatasetService } from './services/dataset-service.js';
import { DEFAULT_CLIENT_DIR, PACKAGE_VERSION } from './services/project-paths.js';
import { SweepExports } from './services/sweep-exports.js';
import { SweepQueue } from './services/sweep-queue.js';
import { RoutedSweepRunner } from './services/routed-runner.js';
import type { SweepRunner } from './services/sweep-runner.js';
import { SweepService } from './services/sweep-service.js';
import { GridshakeStore } from './store/store.js';
import type { QueueConnection } from './queue/queue-url.js';
import { SweepPool } from './sweeps/sweep-pool.js';
import { workBudgetFromEnv } from './sweeps/sweep-budget.js';
import { BODY_TIMEOUT_MS, DEFAULT_BODY_LIMIT, DEFAULT_MAX_POINTS, HEADERS_TIMEOUT_MS, JSON_BODY_LIMIT } from './limits.js';
import { installBodyTimeout, serverTimeoutOptions, type RequestTimeouts } from './security/request-timeouts.js';
import { DatasetParser } from './services/dataset-parser.js';
import { UploadFolder } from './services/upload-folder.js';
import { checkThreadCount } from './sweeps/thread-count.js';


export interface AppOptions {
  /** data folder of the SQLite store (default ./.gridshake); ':memory:' for a throw-away store */
  dataDir?: string;
  /** the address the server binds to, accepted in Host headers besides localhost (default 127.0.0.1) */
  host?: string;
  /** largest request body and largest uploaded file, bytes (default 64 MB) */
  bodyLimit?: number;
  /** most points in one dataset (default 2e6) */
  maxPoints?: number;
  /** work budget of a sweep in point-placements (default GRIDSHAKE_WORK_BUDGET or the sweeps' default) */
  workBudget?: number;
  /** worker threads of the pool (default: one per core; at most MAX_THREADS_PER_CORE per core) */
  threads?: number;
  /** time limits for request headers and bodies (default HEADERS_TIMEOUT_MS, BODY_TIMEOUT_MS) */
  timeouts?: Partial<RequestTimeouts>;
  /** folder of the built page (default dist/client) */
  clientDir?: string;
  /** send sweeps to this Redis queue instead of the local pool (keys prefixed per data folder) */
  queue?: QueueConnection | null;
  /** a sweep runner to use instead of a new SweepPool (it is destroyed with the app) */
  runner?: SweepRunner;
  /** the analyst's own XYZ tile server for the page's optional basemap (serve --basemap); absent: none, nothing fetched */
  basemap?: Basemap;
  logger?: FastifyServerOptions['logger'];
}

export interface GridshakeServices {
  store: GridshakeStore;
  queue: SweepQueue;
  datasets: DatasetService;
  sweeps: SweepService;
  runner: SweepRunner;
  /** ids of the sweeps found queued or running at start and marked interrupted */
  interruptedAtStart: string[];
}

declare module 'fastify' {
  interface FastifyInstance {
    gridshake: GridshakeServices;
  }
}

export async function buildApp(options: AppOptions = {}): Promise<FastifyInstance> {
  const bodyLimit = options.bodyLimit ?? DEFAULT_BODY_LIMIT;
  const maxPoints = options.maxPoints ?? DEFAULT_MAX_POINTS;
  const workBudget = options.workBudget ?? workBudgetFromEnv();
  const timeouts: RequestTimeouts = { headersMs: HEADERS_TIMEOUT_MS, bodyMs: BODY_TIMEOUT_MS, ...options.timeouts };
  if (options.threads !== undefined) checkThreadCount(options.threads);
  const dataDir = options.dataDir ?? './.gridshake';
  const store = GridshakeStore.open(dataDir);
  const interruptedAtStart = store.sweeps.markInterrupted();
  const uploads = new UploadFolder(dataDir);
  uploads.clearLeftovers();
  const localPool = (): SweepPool => new SweepPool({ threads: options.threads, budget: workBudget });
  const runner: SweepRunner =
    options.runner ??
    (options.queue
      ? // loaded only when asked for: the local pool does not load BullMQ; it stays available per sweep (executor "local")
        new RoutedSweepRunner((await import('./queue/queue-runner.js')).queueSweepRunner(options.queue, dataDir, workBudget), localPool)
      : localPool());
  const parser = new DatasetParser(store);

  const app = Fastify({
    logger: options.logger ?? false,
    // JSON bodies (plans, ids); the upload route has its own limit
    bodyLimit: JSON_BODY_LIMIT,
    ...serverTimeoutOptions(timeouts),
    ajv: { customOptions: { removeAdditional: false, allErrors: false } },
    // route schemas compile on first use: a (re)start does not wait for thirty routes' compilers
    schemaController: lazySchemaController(),
    schemaErrorFormatter: formatValidationErrors,
    return503OnClosing: true,
    // event streams and idle keep-alive sockets must not hold a shutdown
    forceCloseConnections: true,
  });
  const queue = new SweepQueue(store, runner, app.log);
  const datasets = new DatasetService(store, queue, maxPoints, parser);
  const sweeps = new SweepService(store, queue, workBudget, runner.executors);
  app.decorate('gridshake', { store, queue, datasets, sweeps, runner, interruptedAtStart });

  const policy = createHostPolicy(options.host ?? '127.0.0.1', () => {
    const address = app.server.address() as AddressInfo | string | null;
    return address !== null && typeof address === 'object' ? address.port : null;
  });
  installRequestGuards(app, policy);
  installBodyTimeout(app, timeouts);
  installErrorHandling(app, { bodyLimit: JSON_BODY_LIMIT, fileLimit: bodyLimit });
  app.addHook('onSend', async (_request, reply) => {
    reply.header('x-content-type-options', 'nosniff');
    reply.header('x-frame-options', 'DENY');
    reply.header('referrer-policy', 'no-referrer');
  });
  app.addSchema(ERROR_SCHEMA);
  app.addSchema(DATASET_SUMMARY_SCHEMA);
  app.addSchema(SWEEP_SCHEMA);
  await app.register(fastifyMultipart, {
    attachFieldsToBody: true,
    onFile: uploadFileHandler(uploads, bodyLimit),
    limits: { fileSize: bodyLimit, files: 2 + MAX_NO_DATA_FILES, fields: 10, fieldSize: 4096, parts: 4 + MAX_NO_DATA_FILES + 10 },
  });

  registerHealthRoutes(app, () => ({
    version: PACKAGE_VERSION,
    databasePath: store.path,
    poolSize: runner.threads ?? 1,
    datasets: store.datasets.count(),
    workBudget,
    ...(options.basemap === undefined ? {} : { basemap: options.basemap.template }),
    executors: [...(runner.executors ?? ['local'])],
  }));
  registerDatasetRoutes(app, datasets, bodyLimit, uploads);
  registerSweepRoutes(app, sweeps);
  registerSweepEventsRoute(app, sweeps, queue);
  registerSweepExportRoutes(app, new SweepExports(store, datasets, sweeps));
  await registerClientStatic(app, options.clientDir ?? DEFAULT_CLIENT_DIR, pagePolicy(options.basemap?.origin));

  // before the server stops accepting: stop the queue, so that open event streams get their `end` event
  app.addHook('preClose', async () => {
    await queue.close();
  });
  app.addHook('onClose', async () => {
    await queue.close();
    await runner.destroy();
    await parser.destroy();
    store.close();
  });
  return app;
}
