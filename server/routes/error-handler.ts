/**
 * The one error handler of the HTTP API: every failure leaves as `{ statusCode, code: "GS_ERR_...", message }`.
 * GridshakeErrors keep their code and status; Fastify's schema validation becomes GS_ERR_VALIDATION (400) naming
 * the field; body, file and part limits become GS_ERR_TOO_LARGE (413); anything unexpected is GS_ERR_INTERNAL (500),
 * logged, with no internals in the message.
 */
import type { FastifyError, FastifyInstance, FastifyReply, FastifyRequest } from 'fastify';
import { GridshakeError, isGridshakeError } from '../errors.js';
import { storageFailure } from '../store/storage-failure.js';

export interface ErrorBody {
  statusCode: number;
  code: string;
  message: string;
}

export interface LimitsForMessages {
  /** largest JSON body, bytes */
  bodyLimit: number;
  fileLimit: number;
}

const TOO_LARGE_CODES = new Set([
  'FST_ERR_CTP_BODY_TOO_LARGE',
  'FST_REQ_FILE_TOO_LARGE',
  'FST_FILES_LIMIT',
  'FST_PARTS_LIMIT',
  'FST_FIELDS_LIMIT',
]);

function megabytes(bytes: number): string {
  return `${Number((bytes / 1048576).toPrecision(3))} MB`;
}

/** Messages of the multipart parser (@fastify/busboy) for a body that breaks off or is malformed. */
const MALFORMED_MULTIPART = /unexpected end of (multipart|form)|malformed part header|boundary not found|part terminated early/i;

/** Turn any thrown value into the coded error body sent to the client. */
export function toErrorBody(error: unknown, limits: LimitsForMessages): ErrorBody {
  if (isGridshakeError(error)) return { statusCode: error.statusCode, code: error.code, message: error.message };
  const fastifyError = error as Partial<FastifyError> & { validationContext?: string };
  if (fastifyError.validation !== undefined) {
    return { statusCode: 400, code: 'GS_ERR_VALIDATION', message: `invalid request: ${fastifyError.message ?? ''}` };
  }
  const code = fastifyError.code ?? '';
  if (TOO_LARGE_CODES.has(code)) {
    const what =
      code === 'FST_ERR_CTP_BODY_TOO_LARGE'
        ? `the request body is larger than the limit of ${limits.bodyLimit / 1024} KB for a JSON request (a plan is a few hundred bytes)`
        : code === 'FST_REQ_FILE_TOO_LARGE'
          ? `an uploaded file is larger than the limit of ${megabytes(limits.fileLimit)} (the upload limit set when the server was started)`
          : `the upload has too many files or fields (${fastifyError.message ?? code})`;
    return { statusCode: 413, code: 'GS_ERR_TOO_LARGE', message: what };
  }
  if (code === 'FST_ERR_CTP_INVALID_JSON_BODY' || code === 'FST_ERR_CTP_EMPTY_JSON_BODY' || error instanceof SyntaxError) {
    return { statusCode: 400, code: 'GS_ERR_VALIDATION', message: `the body is not valid JSON: ${fastifyError.message ?? ''}` };
  }
  if (code === 'FST_ERR_CTP_INVALID_MEDIA_TYPE' || code === 'FST_INVALID_MULTIPART_CONTENT_TYPE') {
    return { statusCode: 415, code: 'GS_ERR_CONTENT_TYPE', message: `unsupported content type: ${fastifyError.message ?? ''}` };
  }
  if (fastifyError.statusCode === undefined && MALFORMED_MULTIPART.test(fastifyError.message ?? '')) {
    return {
      statusCode: 400,
      code: 'GS_ERR_UPLOAD',
      message: `the upload is not a complete multipart/form-data body (${fastifyError.message ?? ''}); send it again`,
    };
  }
  const storage = storageFailure(code);
  if (storage !== null) return storage;
  const status = fastifyError.statusCode ?? 500;
  if (status >= 400 && status < 500) {
    return { statusCode: status, code: 'GS_ERR_REQUEST', message: fastifyError.message ?? 'bad request' };
  }
  return { statusCode: 500, code: 'GS_ERR_INTERNAL', message: 'internal error; the server log has the details' };
}

export function installErrorHandling(app: FastifyInstance, limits: LimitsForMessages): void {
  app.setErrorHandler((error: unknown, request: FastifyRequest, reply: FastifyReply) => {
    const body = toErrorBody(error, limits);
    if (body.statusCode >= 500) request.log.error({ err: error }, 'request failed');
    void reply.code(body.statusCode).type('application/json; charset=utf-8').send(body);
  });
  app.setNotFoundHandler((request: FastifyRequest, reply: FastifyReply) => {
    const path = request.url.split('?')[0] ?? '';
    const body = toErrorBody(new GridshakeError('GS_ERR_NOT_FOUND', 404, `no such route: ${request.method} ${path}`), limits);
    void reply.code(404).send(body);
  });
}

/** JSON schema of an error response, shared by every route ($ref: 'gsError#'). */
export const ERROR_SCHEMA = {
  $id: 'gsError',
  type: 'object',
  required: ['statusCode', 'code', 'message'],
  properties: {
    statusCode: { type: 'integer' },
    code: { type: 'string' },
    message: { type: 'string' },
  },
} as const;

/** The error responses of a route, for its `response` schema. */
export function errorResponses(...statuses: number[]): Record<number, { $ref: string }> {
  const responses: Record<number, { $ref: string }> = {};
  for (const status of [...statuses, 421, 403, 415, 500, 507]) responses[status] = { $ref: 'gsError#' };
  return responses;
}
