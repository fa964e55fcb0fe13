/**
 * Sweep exports: placements.csv, placements.json, grid.geojson?size=K&placement=J, report.html (add ?download=1
 * for an attachment). Only done sweeps have them (409 otherwise). The report runs its inline chart script under a
 * content security policy that allows no network access at all.
 */
import type { FastifyInstance } from 'fastify';
import type { SweepExports } from '../services/sweep-exports.js';
import { errorResponses } from './error-handler.js';
import { ID_PARAMS } from './schemas/common-schemas.js';
import { REPORT_POLICY } from '../security/content-security-policy.js';


const DOWNLOAD_QUERY = {
  type: 'object',
  additionalProperties: false,
  properties: { download: { type: 'integer', enum: [0, 1] } },
} as const;

function attachment(name: string): string {
  return `attachment; filename="${name}"`;
}

export function registerSweepExportRoutes(app: FastifyInstance, exportsOf: SweepExports): void {
  app.get<{ Params: { id: string } }>(
    '/api/sweeps/:id/placements.csv',
    { schema: { params: ID_PARAMS, response: { 200: { type: 'string' }, ...errorResponses(400, 404, 409) } } },
    async (request, reply) =>
      reply
        .type('text/csv; charset=utf-8')
        .header('content-disposition', attachment(`placements-${request.params.id.slice(0, 8)}.csv`))
        .send(exportsOf.csv(request.params.id)),
  );

  app.get<{ Params: { id: string } }>(
    '/api/sweeps/:id/placements.json',
    {
      schema: {
        params: ID_PARAMS,
        response: { 200: { type: 'array', items: { type: 'object', additionalProperties: true } }, ...errorResponses(400, 404, 409) },
      },
    },
    async (request) => exportsOf.rows(request.params.id),
  );

  app.get<{ Params: { id: string }; Querystring: { size: number; placement: number } }>(
    '/api/sweeps/:id/grid.geojson',
    {
      schema: {
        params: ID_PARAMS,
        querystring: {
          type: 'object',
          required: ['size', 'placement'],
          additionalProperties: false,
          properties: { size: { type: 'integer', minimum: 0 }, placement: { type: 'integer', minimum: 0 } },
        },
        response: {
          200: {
            type: 'object',
            required: ['type', 'features'],
            additionalProperties: true,
            properties: { type: { const: 'FeatureCollection' }, features: { type: 'array', items: { type: 'object', additionalProperties: true } } },
          },
          ...errorResponses(400, 404, 409),
        },
      },
    },
    async (request, reply) =>
      reply
        .type('application/geo+json; charset=utf-8')
        .send(exportsOf.grid(request.params.id, request.query.size, request.query.placement)),
  );

  app.get<{ Params: { id: string }; Querystring: { download?: number } }>(
    '/api/sweeps/:id/report.html',
    { schema: { params: ID_PARAMS, querystring: DOWNLOAD_QUERY, response: { 200: { type: 'string' }, ...errorResponses(400, 404, 409) } } },
    async (request, reply) => {
      const html = exportsOf.report(request.params.id);
      reply.type('text/html; charset=utf-8').header('content-security-policy', REPORT_POLICY);
      if (request.query.download === 1) {
        reply.header('content-disposition', attachment(`gridshake-report-${request.params.id.slice(0, 8)}.html`));
      }
      return reply.send(html);
    },
  );
}
