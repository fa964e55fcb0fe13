/**
 * The one error handler of the HTTP API: every failure leaves as `{ statusCode, code: "GS_ERR_...", message }`.
 * GridshakeErrors keep their code and status; Fastify's schema validation becomes GS_ERR_VALIDATION (400) naming
 * the field; body, file and part limits become GS_ERR_TOO_LARGE (413); anything unexpected is GS_ERR_INTERNAL (500),
 * logged, with no internals in the message. Every status comes from the registry (shared/error-codes.ts), except
 * that GS_ERR_REQUEST keeps the web framework's own 4xx status.
 */
import type { FastifyError, FastifyInstance, FastifyReply, FastifyRequest } from 'fastify';
import { statusOf, type ErrorCode } from '../../shared/error-codes.js';
import type { ERROR_SCHEMA } from '../../shared/http-schemas.js';
import type { FromSchema } from '../../shared/schema-type.js';
import { GridshakeError, isGridshakeError } from '../errors.js';
import { storageWriteError } from '../store/write-failure.js';

/** An error response (shared/http-schemas.ts ERROR_SCHEMA), its code one of the registry's. */
export type ErrorBody = Omit<FromSchema<typeof ERROR_SCHEMA>, 'code'> & { code: ErrorCode };

/** The body of a coded error with the registry's status for its code. */
function coded(code: ErrorCode, message: string): ErrorBody {
  return { statusCode: statusOf(code), code, message };
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
    return coded('GS_ERR_VALIDATION', `invalid request: ${fastifyError.message ?? ''}`);
  }
  const code = fastifyError.code ?? '';
  if (TOO_LARGE_CODES.has(code)) {
    const what =
      code === 'FST_ERR_CTP_BODY_TOO_LARGE'
        ? `the request body is larger than the limit of ${limits.bodyLimit / 1024} KB for a JSON request (a plan is a few hundred bytes)`
        : code === 'FST_REQ_FILE_TOO_LARGE'
          ? `an uploaded file is larger than the limit of ${megabytes(limits.fileLimit)} (the upload limit set when the server was started)`
          : `the upload has too many files or fields (${fastifyError.message ?? code})`;
    return coded('GS_ERR_TOO_LARGE', what);
  }
  if (code === 'FST_ERR_CTP_INVALID_JSON_BODY' || code === 'FST_ERR_CTP_EMPTY_JSON_BODY' || error instanceof SyntaxError) {
    return coded('GS_ERR_VALIDATION', `the body is not valid JSON: ${fastifyError.message ?? ''}`);
  }
  if (code === 'FST_ERR_CTP_INVALID_MEDIA_TYPE' || code === 'FST_INVALID_MULTIPART_CONTENT_TYPE') {
    return coded('GS_ERR_CONTENT_TYPE', `unsupported content type: ${fastifyError.message ?? ''}`);
  }
  if (fastifyError.statusCode === undefined && MALFORMED_MULTIPART.test(fastifyError.message ?? '')) {
    return coded('GS_ERR_UPLOAD', `the upload is not a complete multipart/form-data body (${fastifyError.message ?? ''}); send it again`);
  }
  const storage = storageWriteError(error);
  if (storage !== null) return { statusCode: storage.statusCode, code: storage.code, message: storage.message };
  const status = fastifyError.statusCode ?? 500;
  if (status >= 400 && status < 500) {
    return { statusCode: status, code: 'GS_ERR_REQUEST', message: fastifyError.message ?? 'bad request' };
  }
  return coded('GS_ERR_INTERNAL', 'internal error; the server log has the details');
}

export function installErrorHandling(app: FastifyInstance, limits: LimitsForMessages): void {
  app.setErrorHandler((error: unknown, request: FastifyRequest, reply: FastifyReply) => {
    const body = toErrorBody(error, limits);
    if (body.statusCode >= 500) request.log.error({ err: error }, 'request failed');
    // a body left half read (an upload refused while it streams, e.g. a full disk) would hold the connection: the
    // client's next request on it waits behind bytes nobody reads, so the connection closes after this answer
    if (!request.raw.complete) reply.header('connection', 'close');
    void reply.code(body.statusCode).type('application/json; charset=utf-8').send(body);
  });
  app.setNotFoundHandler((request: FastifyRequest, reply: FastifyReply) => {
    const path = request.url.split('?')[0] ?? '';
    const body = toErrorBody(new GridshakeError('GS_ERR_NOT_FOUND', `no such route: ${request.method} ${path}`), limits);
    void reply.code(body.statusCode).send(body);
  });
}

/** The error responses of a route, for its `response` schema. */
export function errorResponses(...statuses: number[]): Record<number, { $ref: string }> {
  const responses: Record<number, { $ref: string }> = {};
  const everyRoute: ErrorCode[] = ['GS_ERR_HOST', 'GS_ERR_ORIGIN', 'GS_ERR_CONTENT_TYPE', 'GS_ERR_INTERNAL', 'GS_ERR_STORAGE'];
  for (const status of [...statuses, ...everyRoute.map(statusOf)]) responses[status] = { $ref: 'gsError#' };
  return responses;
}
