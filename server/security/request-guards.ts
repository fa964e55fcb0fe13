/**
 * Request guards of the local server, run on every request before routing and body parsing:
 * - Host must name this server (stops DNS rebinding): 421 GS_ERR_HOST;
 * - an Origin header, when present, must be this server's origin (stops cross-site requests): 403 GS_ERR_ORIGIN;
 * - a state-changing request (POST, PUT, PATCH, DELETE) with a body must be application/json or multipart/form-data,
 *   which a cross-site HTML form cannot send without a CORS preflight: 415 GS_ERR_CONTENT_TYPE;
 * - multipart/form-data is taken only by routes that declare `config: { multipart: true }` (the upload); any other
 *   route refuses it with 415 GS_ERR_CONTENT_TYPE before a byte of the body is read, and the connection is closed so
 *   the unread body is not drained.
 * No CORS headers are ever sent, so other sites cannot read responses either.
 */
import type { FastifyInstance, FastifyRequest } from 'fastify';
import { type HostPolicy, isAllowedHost, isAllowedOrigin } from './allowed-hosts.js';
import { contentTypeError, hostError, originError } from './security-errors.js';

declare module 'fastify' {
  interface FastifyContextConfig {
    /** this route accepts multipart/form-data bodies (only the dataset upload) */
    multipart?: boolean;
  }
}

const STATE_CHANGING = new Set(['POST', 'PUT', 'PATCH', 'DELETE']);
const ALLOWED_BODY_TYPES = ['application/json', 'multipart/form-data'];

function hasBody(request: FastifyRequest): boolean {
  const length = request.headers['content-length'];
  if (length !== undefined && Number(length) > 0) return true;
  return request.headers['transfer-encoding'] !== undefined;
}

function mediaType(request: FastifyRequest): string {
  return (request.headers['content-type'] ?? '').split(';')[0]?.trim().toLowerCase() ?? '';
}

export function checkRequest(policy: HostPolicy, request: FastifyRequest): void {
  const host = request.headers.host;
  if (!isAllowedHost(policy, host)) {
    throw hostError(
      `the Host header ${JSON.stringify(host ?? '')} does not name this server; open it as http://127.0.0.1 or http://localhost with its port`,
    );
  }
  const origin = request.headers.origin;
  if (origin !== undefined && !isAllowedOrigin(policy, origin)) {
    throw originError(`requests from the origin ${JSON.stringify(origin)} are refused; only this server's own page may call it`);
  }
  const type = mediaType(request);
  if (STATE_CHANGING.has(request.method)) {
    if ((hasBody(request) || type !== '') && !ALLOWED_BODY_TYPES.includes(type)) {
      throw contentTypeError(
        `${request.method} ${request.url.split('?')[0]} needs a body of type application/json or ` +
          `multipart/form-data, got ${JSON.stringify(type === '' ? 'none' : type)}`,
      );
    }
  }
  if (type === 'multipart/form-data' && request.routeOptions.config?.multipart !== true) {
    throw contentTypeError(
      `${request.method} ${request.url.split('?')[0]} does not take multipart/form-data; only the upload ` +
        '(POST /api/datasets) does; send JSON',
    );
  }
}

/** Install the guards as the first onRequest hook of the app. */
export function installRequestGuards(app: FastifyInstance, policy: HostPolicy): void {
  app.addHook('onRequest', async (request, reply) => {
    try {
      checkRequest(policy, request);
    } catch (error) {
      // the body of a refused request is never read: close the connection instead of draining it
      if (hasBody(request)) reply.header('connection', 'close');
      throw error;
    }
  });
}
