/**
 * GET /api/sweeps/:id/events: server-sent events (text/event-stream) of one sweep.
 * Events: `progress` with { id, status, progress } at once, on every pool report and at least once a second while
 * the sweep waits or runs; then one `end` event with { id, status, progress, error } and the stream closes.
 * A sweep that has already finished gets its `end` event at once. Client disconnects unsubscribe.
 * At most MAX_EVENT_STREAMS streams are open on the server at once; another is refused with
 * 429 GS_ERR_TOO_MANY_STREAMS (the page then polls GET /api/sweeps/:id).
 */
import type { FastifyInstance, FastifyReply } from 'fastify';
import type { SweepProgress, SweepStatus } from '../../shared/contracts.js';
import type { SweepQueue } from '../services/sweep-queue.js';
import type { SweepService } from '../services/sweep-service.js';
import { FINISHED_STATUSES } from '../store/sweep-store.js';
import { tooManyStreamsError } from '../errors.js';
import { MAX_EVENT_STREAMS } from '../limits.js';
import { errorResponses } from './error-handler.js';
import { ID_PARAMS } from '../../shared/http-schemas.js';

export const HEARTBEAT_MS = 1000;

function writeEvent(reply: FastifyReply, event: string, data: unknown): void {
  reply.raw.write(`event: ${event}\ndata: ${JSON.stringify(data)}\n\n`);
}

export function registerSweepEventsRoute(app: FastifyInstance, sweeps: SweepService, queue: SweepQueue): void {
  let open = 0;
  app.get<{ Params: { id: string } }>(
    '/api/sweeps/:id/events',
    {
      schema: {
        params: ID_PARAMS,
        response: { 200: { type: 'string', description: 'text/event-stream' }, ...errorResponses(400, 404, 429) },
      },
    },
    async (request, reply) => {
      const id = request.params.id;
      const initial = sweeps.progress(id);
      if (open >= MAX_EVENT_STREAMS) {
        throw tooManyStreamsError(
          `${open} event streams are open on this server, the most it keeps (${MAX_EVENT_STREAMS}); close some pages, ` +
            `or follow the sweep with GET /api/sweeps/${id}`,
        );
      }
      open += 1;
      let counted = true;
      const uncount = (): void => {
        if (counted) open -= 1;
        counted = false;
      };
      reply.raw.once('close', uncount);
      reply.hijack();
      reply.raw.writeHead(200, {
        'content-type': 'text/event-stream; charset=utf-8',
        'cache-control': 'no-cache, no-transform',
        connection: 'keep-alive',
        'x-content-type-options': 'nosniff',
      });
      let closed = false;
      const end = (): void => {
        if (closed) return;
        closed = true;
        clearInterval(heartbeat);
        queue.off('progress', onProgress);
        queue.off('finished', onFinished);
        const record = sweeps.find(id);
        writeEvent(
          reply,
          'end',
          record === undefined
            ? { id, status: 'cancelled', progress: null, error: 'the sweep was deleted' }
            : { id, status: record.status, progress: record.progress, error: record.error },
        );
        reply.raw.end();
      };
      const onProgress = (sweepId: string, progress: SweepProgress): void => {
        if (sweepId === id && !closed) writeEvent(reply, 'progress', { id, status: 'running', progress });
      };
      const onFinished = (sweepId: string, _status: SweepStatus): void => {
        if (sweepId === id) end();
      };
      const heartbeat = setInterval(() => {
        if (closed) return;
        const current = sweeps.find(id) === undefined ? undefined : sweeps.progress(id);
        if (current === undefined || FINISHED_STATUSES.includes(current.status)) end();
        else writeEvent(reply, 'progress', { id, ...current });
      }, HEARTBEAT_MS);
      reply.raw.on('close', () => {
        if (closed) return;
        closed = true;
        clearInterval(heartbeat);
        queue.off('progress', onProgress);
        queue.off('finished', onFinished);
      });
      if (FINISHED_STATUSES.includes(initial.status)) {
        end();
        return;
      }
      queue.on('progress', onProgress);
      queue.on('finished', onFinished);
      writeEvent(reply, 'progress', { id, ...initial });
    },
  );
}
