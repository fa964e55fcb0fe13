/** DELETE of a stored thing by id: 204 once removed, 404 (from the service) for an unknown id. */
import type { FastifyInstance } from 'fastify';
import { ID_PARAMS } from '../../shared/http-schemas.js';
import { errorResponses } from './error-handler.js';

export function registerDeleteRoute(app: FastifyInstance, url: `${string}/:id`, remove: (id: string) => void): void {
  app.delete<{ Params: { id: string } }>(
    url,
    { schema: { params: ID_PARAMS, response: { 204: { type: 'null' }, ...errorResponses(400, 404) } } },
    async (request, reply) => {
      remove(request.params.id);
      return reply.code(204).send();
    },
  );
}
