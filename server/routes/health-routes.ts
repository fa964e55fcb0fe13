/** GET /api/health: version, database path and worker pool size, for the page header and for scripts. */
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
