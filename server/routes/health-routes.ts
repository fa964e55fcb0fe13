/**
 * GET /api/health: version, database path, worker pool size, work budget and where sweeps may run (the executors,
 * the default first: the page offers the choice only on a server with a Redis queue), for the page and for scripts.
 */
import type { FastifyInstance } from 'fastify';
import type { HealthInfo } from '../../shared/contracts.js';
import { HEALTH_SCHEMA } from '../../shared/http-schemas.js';
import { errorResponses } from './error-handler.js';

export function registerHealthRoutes(app: FastifyInstance, health: () => HealthInfo): void {
  app.get(
    '/api/health',
    {
      schema: { response: { 200: HEALTH_SCHEMA, ...errorResponses() } },
    },
    async () => ({ status: 'ok' as const, ...health() }),
  );
}
