/** GET /api/health: version, database path and worker pool size, for the page header and for scripts. */
import type { FastifyInstance } from 'fastify';
import { errorResponses } from './error-handler.js';

export interface HealthInfo {
  version: string;
  databasePath: string;
  poolSize: number;
  /** datasets in the store */
  datasets?: number;
  /** work budget of one sweep in point-placements, for the page's live cost estimate */
  workBudget?: number;
  /** the analyst's own XYZ tile server (serve --basemap), when configured */
  basemap?: string;
}

export function registerHealthRoutes(app: FastifyInstance, health: () => HealthInfo): void {
  app.get(
    '/api/health',
    {
      schema: {
        response: {
          200: {
            type: 'object',
            required: ['status', 'version', 'databasePath', 'poolSize'],
            properties: {
              status: { type: 'string', enum: ['ok'] },
              version: { type: 'string' },
              databasePath: { type: 'string' },
              poolSize: { type: 'integer' },
              datasets: { type: 'integer' },
              workBudget: { type: 'number' },
              basemap: { type: 'string' },
            },
          },
          ...errorResponses(),
        },
      },
    },
    async () => ({ status: 'ok' as const, ...health() }),
  );
}
