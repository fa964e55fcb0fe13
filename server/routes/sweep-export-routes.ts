/**
 * Sweep exports: placements.csv, placements.json, grid.geojson?size=K&placement=J[&coordinates=planar],
 * grid.gpkg?size=K&placement=J, grid-frame?size=K&placement=J and stability-surface?size=K (the page's typed frames),
 * report.html (add ?download=1 for an attachment). Only done sweeps have them (409 otherwise). The report runs its inline chart script under a
 * content security policy that allows no network access at all.
 */
import type { FastifyInstance } from 'fastify';
import type { SweepExports } from '../services/sweep-exports.js';
import { errorResponses } from './error-handler.js';
import { ID_PARAMS } from '../../shared/http-schemas.js';
import { REPORT_POLICY } from '../security/content-security-policy.js';


const GRID_QUERY_PROPERTIES = { size: { type: 'integer', minimum: 0 }, placement: { type: 'integer', minimum: 0 } } as const;

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
        .header('content-disposition', attachment(exportsOf.downloadName(request.params.id, 'placements', 'csv')))
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

  app.get<{ Params: { id: string }; Querystring: { size: number; placement: number; coordinates?: 'lonlat' | 'planar' } }>(
    '/api/sweeps/:id/grid.geojson',
    {
      schema: {
        params: ID_PARAMS,
        querystring: {
          type: 'object',
          required: ['size', 'placement'],
          additionalProperties: false,
          properties: { ...GRID_QUERY_PROPERTIES, coordinates: { type: 'string', enum: ['lonlat', 'planar'] } },
        },
        response: errorResponses(400, 404, 409, 422),
      },
    },
    async (request, reply) => {
      const { size, placement, coordinates } = request.query;
      const stream = exportsOf.gridGeoJson(request.params.id, size, placement, coordinates);
      return reply.type('application/geo+json; charset=utf-8').send(stream);
    },
  );

  app.get<{ Params: { id: string }; Querystring: { size: number; placement: number } }>(
    '/api/sweeps/:id/grid.gpkg',
    {
      schema: {
        params: ID_PARAMS,
        querystring: { type: 'object', required: ['size', 'placement'], additionalProperties: false, properties: GRID_QUERY_PROPERTIES },
        response: errorResponses(400, 404, 409, 422, 429),
      },
    },
    async (request, reply) => {
      const { size, placement } = request.query;
      const stream = await exportsOf.gridGeoPackage(request.params.id, size, placement);
      return reply
        .type('application/geopackage+sqlite3')
        .header('content-disposition', attachment(`grid-${request.params.id.slice(0, 8)}-size${size}-placement${placement}.gpkg`))
        .send(stream);
    },
  );

  // the page's compact grid and stability surface (typed frames, shared/binary/page-frames.ts)
  app.get<{ Params: { id: string }; Querystring: { size: number; placement: number } }>(
    '/api/sweeps/:id/grid-frame',
    {
      schema: {
        params: ID_PARAMS,
        querystring: { type: 'object', required: ['size', 'placement'], additionalProperties: false, properties: GRID_QUERY_PROPERTIES },
        response: errorResponses(400, 404, 409, 422),
      },
    },
    async (request, reply) => {
      const { size, placement } = request.query;
      return reply.type('application/octet-stream').send(Buffer.from(exportsOf.gridFrame(request.params.id, size, placement).buffer));
    },
  );

  app.get<{ Params: { id: string }; Querystring: { size: number } }>(
    '/api/sweeps/:id/stability-surface',
    {
      schema: {
        params: ID_PARAMS,
        querystring: { type: 'object', required: ['size'], additionalProperties: false, properties: { size: GRID_QUERY_PROPERTIES.size } },
        response: errorResponses(400, 404, 409),
      },
    },
    async (request, reply) => {
      const frame = await exportsOf.stabilitySurface(request.params.id, request.query.size);
      return reply.type('application/octet-stream').send(Buffer.from(frame.buffer, frame.byteOffset, frame.byteLength));
    },
  );

  // the stability files of issue 17, under the names `sweep --out` writes (server/stability/stability-files.ts)
  app.get<{ Params: { id: string; file: string } }>(
    '/api/sweeps/:id/:file',
    {
      schema: {
        params: {
          type: 'object',
          required: ['id', 'file'],
          additionalProperties: false,
          properties: {
            ...ID_PARAMS.properties,
            file: { type: 'string', maxLength: 80, pattern: '^(stability-[a-z0-9.-]+m\\.tif|excess-areas-[a-z0-9.-]+m\\.geojson)$' },
          },
        },
        response: errorResponses(400, 404, 409),
      },
    },
    async (request, reply) => {
      const { type, body } = exportsOf.stabilityFile(request.params.id, request.params.file);
      return reply.type(type).header('content-disposition', attachment(request.params.file)).send(body);
    },
  );

  app.get<{ Params: { id: string }; Querystring: { download?: number } }>(
    '/api/sweeps/:id/report.html',
    { schema: { params: ID_PARAMS, querystring: DOWNLOAD_QUERY, response: { 200: { type: 'string' }, ...errorResponses(400, 404, 409) } } },
    async (request, reply) => {
      const html = exportsOf.report(request.params.id);
      reply.type('text/html; charset=utf-8').header('content-security-policy', REPORT_POLICY);
      if (request.query.download === 1) {
        reply.header('content-disposition', attachment(exportsOf.downloadName(request.params.id, 'report', 'html')));
      }
      return reply.send(html);
    },
  );
}
