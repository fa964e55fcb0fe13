/**
 * GET /api/health: version, database path, worker pool size, work budget and where sweeps may run (the executors,
 * the default first: the page offers the choice only on a server with a Redis queue), for the page and for scripts.
 */
import type { FastifyInstance } from 'fastify';
import { EXECUTOR_CHOICES, type ExecutorChoice } from '../services/sweep-runner.js';
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
  /** where a sweep may run (`executor` of POST /api/sweeps), the default first: ["local"], or ["queue", "local"] */
  executors?: readonly ExecutorChoice[];
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
              executors: { type: 'array', items: { type: 'string', enum: EXECUTOR_CHOICES } },
            },
          },
          ...errorResponses(),
        },
      },
    },
    async () => ({ status: 'ok' as const, ...health() }),
  );
}
