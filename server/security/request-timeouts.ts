/**
 * Time limits on what a client sends, so that slow or stalled requests cannot hold connections (and file
 * descriptors) open for good:
 * - headers: Node's `headersTimeout` closes a connection whose request headers have not all arrived in time (Node
 *   answers 408 itself; no route has been chosen yet);
 * - body: once the headers are in, the body must arrive within `bodyMs`; otherwise the server answers
 *   408 GS_ERR_TIMEOUT and closes the connection. Node's `requestTimeout` (a little longer) is the backstop.
 * A request whose body has fully arrived is no longer timed: parsing a large upload may take longer.
 * Node checks its own timeouts every `connectionsCheckingInterval`, set to a second here (the default is 30 s).
 */
import type { FastifyInstance, FastifyReply, FastifyRequest } from 'fastify';
import type { ServerOptions } from 'node:http';
import { timeoutError } from '../errors.js';

export interface RequestTimeouts {
  headersMs: number;
  bodyMs: number;
}

/** The http.createServer options and Fastify's requestTimeout for these limits. */
export function serverTimeoutOptions(timeouts: RequestTimeouts): { http: ServerOptions; requestTimeout: number } {
  const requestTimeout = timeouts.headersMs + timeouts.bodyMs + 5000;
  return {
    http: {
      headersTimeout: timeouts.headersMs,
      requestTimeout,
      connectionsCheckingInterval: Math.min(1000, timeouts.headersMs),
    },
    requestTimeout,
  };
}

function expectsBody(request: FastifyRequest): boolean {
  const length = request.headers['content-length'];
  if (length !== undefined) return Number(length) > 0;
  return request.headers['transfer-encoding'] !== undefined;
}

function seconds(ms: number): string {
  return `${Number((ms / 1000).toPrecision(3))} s`;
}

/** Time every request body from the end of its headers; install before the routes. */
export function installBodyTimeout(app: FastifyInstance, timeouts: RequestTimeouts): void {
  app.server.headersTimeout = timeouts.headersMs;
  const timers = new WeakMap<FastifyRequest, NodeJS.Timeout>();
  const stop = async (request: FastifyRequest): Promise<void> => {
    clearTimeout(timers.get(request));
    timers.delete(request);
  };
  app.addHook('onRequest', async (request: FastifyRequest, reply: FastifyReply) => {
    if (!expectsBody(request) || request.raw.complete) return;
    const timer = setTimeout(() => {
      timers.delete(request);
      if (request.raw.complete || request.raw.destroyed) return;
      const error = timeoutError(
        `the request body did not arrive within ${seconds(timeouts.bodyMs)}; send it again on a faster connection`,
      );
      if (!reply.sent) {
        reply.header('connection', 'close');
        void reply.send(error);
        reply.raw.once('finish', () => request.raw.destroy());
      } else request.raw.destroy();
    }, timeouts.bodyMs);
    timer.unref();
    timers.set(request, timer);
    request.raw.once('end', () => void stop(request));
  });
  app.addHook('onResponse', stop);
  app.addHook('onRequestAbort', stop);
}
