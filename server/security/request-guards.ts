/**
 * Request guards of the local server, run on every request before routing and body parsing:
 * - Host must name this server (stops DNS rebinding): 421 GS_ERR_HOST;
 * - an Origin header, when present, must be this server's origin (stops cross-site requests): 403 GS_ERR_ORIGIN;
 * - a state-changing request (POST, PUT, PATCH, DELETE) with a body must be application/json or multipart/form-data,
 *   which a cross-site HTML form cannot send without a CORS preflight: 415 GS_ERR_CONTENT_TYPE.
 * No CORS headers are ever sent, so other sites cannot read responses either.
 */
import type { FastifyInstance, FastifyRequest } from 'fastify';
import { type HostPolicy, isAllowedHost, isAllowedOrigin } from './allowed-hosts.js';
import { contentTypeError, hostError, originError } from './security-errors.js';

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
  if (STATE_CHANGING.has(request.method)) {
    const type = mediaType(request);
    if ((hasBody(request) || type !== '') && !ALLOWED_BODY_TYPES.includes(type)) {
      throw contentTypeError(
        `${request.method} ${request.url.split('?')[0]} needs a body of type application/json or ` +
          `multipart/form-data, got ${JSON.stringify(type === '' ? 'none' : type)}`,
      );
    }
  }
}

/** Install the guards as the first onRequest hook of the app. */
export function installRequestGuards(app: FastifyInstance, policy: HostPolicy): void {
  app.addHook('onRequest', async (request) => {
    checkRequest(policy, request);
  });
}
