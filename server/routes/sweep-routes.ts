/**
 * Sweep routes: start (202 with the estimate; plan and budget refusals are 400 before queuing, a full queue 429),
 * list (newest first, paged: ?limit=1..500, default 100, &offset; the x-total-count header gives the whole count),
 * get, cancel (409 once finished), rerun from the stored plan, delete.
 */
import type { FastifyInstance } from 'fastify';
import type { SweepService } from '../services/sweep-service.js';
import { SWEEP_PAGE_DEFAULT, SWEEP_PAGE_MAX } from '../limits.js';
import { registerDeleteRoute } from './delete-route.js';
import { errorResponses } from './error-handler.js';
import { ID_PARAMS, SWEEP_START_BODY_SCHEMA, SWEEP_STARTED_SCHEMA } from '../../shared/http-schemas.js';
import type { FromSchema } from '../../shared/schema-type.js';

export function registerSweepRoutes(app: FastifyInstance, sweeps: SweepService): void {
  app.post<{ Body: FromSchema<typeof SWEEP_START_BODY_SCHEMA> }>(
    '/api/sweeps',
    { schema: { body: SWEEP_START_BODY_SCHEMA, response: { 202: SWEEP_STARTED_SCHEMA, ...errorResponses(400, 404, 429) } } },
    async (request, reply) => reply.code(202).send(sweeps.start(request.body.datasetId, request.body.plan, null, request.body.executor)),
  );

  app.get<{ Querystring: { datasetId?: string; limit: number; offset: number } }>(
    '/api/sweeps',
    {
      schema: {
        querystring: {
          type: 'object',
          additionalProperties: false,
          properties: {
            datasetId: ID_PARAMS.properties.id,
            limit: { type: 'integer', minimum: 1, maximum: SWEEP_PAGE_MAX, default: SWEEP_PAGE_DEFAULT },
            offset: { type: 'integer', minimum: 0, default: 0 },
          },
        },
        response: { 200: { type: 'array', items: { $ref: 'gsSweep#' } }, ...errorResponses(400) },
      },
    },
    async (request, reply) => {
      const { datasetId, limit, offset } = request.query;
      const page = sweeps.list(datasetId, { limit, offset });
      return reply.header('x-total-count', String(page.total)).send(page.sweeps);
    },
  );

  app.get<{ Params: { id: string } }>(
    '/api/sweeps/:id',
    { schema: { params: ID_PARAMS, response: { 200: { $ref: 'gsSweep#' }, ...errorResponses(400, 404) } } },
    async (request) => sweeps.get(request.params.id),
  );

  app.post<{ Params: { id: string } }>(
    '/api/sweeps/:id/cancel',
    { schema: { params: ID_PARAMS, response: { 200: { $ref: 'gsSweep#' }, ...errorResponses(400, 404, 409) } } },
    async (request) => sweeps.cancel(request.params.id),
  );

  app.post<{ Params: { id: string } }>(
    '/api/sweeps/:id/rerun',
    { schema: { params: ID_PARAMS, response: { 202: SWEEP_STARTED_SCHEMA, ...errorResponses(400, 404, 409, 429) } } },
    async (request, reply) => reply.code(202).send(sweeps.rerun(request.params.id)),
  );

  registerDeleteRoute(app, '/api/sweeps/:id', (id) => sweeps.delete(id));
}
