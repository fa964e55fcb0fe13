/**
 * Dataset routes: upload (multipart: points, area, noData files; crs, name, x, y fields), list, summary, geometry
 * for drawing, delete. Multipart parts arrive as body fields (@fastify/multipart attachFieldsToBody) and are checked
 * by the body schema before the handler runs; file parts are streamed to the request's upload folder as they arrive
 * (uploadFileHandler), never held in memory, and parsed in a worker thread (DatasetParser).
 * The upload and the baseline field list (POST /api/datasets/baseline-fields: the numeric properties of a polygon
 * file, for the page's picker) are the only routes that take multipart (config.multipart), with the --body-limit; at
 * most MAX_CONCURRENT_UPLOADS are received at once, more are refused before their body is read.
 */
import type { FastifyInstance, FastifyReply, FastifyRequest } from 'fastify';
import type { MultipartFile, MultipartValue } from '@fastify/multipart';
import { GridshakeError, tooLargeError, tooManyUploadsError } from '../errors.js';
import { MAX_CONCURRENT_UPLOADS } from '../limits.js';
import type { UploadedFile } from '../services/dataset-parser.js';
import type { DatasetService } from '../services/dataset-service.js';
import type { UploadFolder } from '../services/upload-folder.js';
import { registerDeleteRoute } from './delete-route.js';
import { errorResponses } from './error-handler.js';
import { DATASET_GEOMETRY_SCHEMA, ID_PARAMS } from '../../shared/http-schemas.js';

/** Most no-data files in one upload. */
export const MAX_NO_DATA_FILES = 16;

const FILE_PART = {
  type: 'object',
  required: ['type', 'filename'],
  properties: { type: { const: 'file' }, filename: { type: 'string', maxLength: 255 } },
} as const;

function fieldPart(value: Record<string, unknown>): Record<string, unknown> {
  return { type: 'object', required: ['type', 'value'], properties: { type: { const: 'field' }, value } };
}

const UPLOAD_BODY = {
  type: 'object',
  required: ['points'],
  additionalProperties: false,
  properties: {
    points: FILE_PART,
    area: FILE_PART,
    noData: { anyOf: [FILE_PART, { type: 'array', maxItems: MAX_NO_DATA_FILES, items: FILE_PART }] },
    /** population at risk (issue 15): polygons with a count in baselineField, or control points */
    baseline: FILE_PART,
    baselineField: fieldPart({ type: 'string', minLength: 1, maxLength: 200 }),
    controls: FILE_PART,
    crs: fieldPart({ type: 'string', maxLength: 40 }),
    name: fieldPart({ type: 'string', maxLength: 200 }),
    x: fieldPart({ type: 'string', maxLength: 100 }),
    y: fieldPart({ type: 'string', maxLength: 100 }),
    id: fieldPart({ type: 'string', maxLength: 100 }),
    /** "true" to leave out CSV rows whose coordinates are blank or n/a (the page's checkbox) */
    skipBadRows: fieldPart({ type: 'string', enum: ['true', 'false', 'on', ''] }),
  },
} as const;

type SavedPart = MultipartFile & { savedPath?: string };

interface UploadBody {
  points: SavedPart;
  area?: SavedPart;
  noData?: SavedPart | SavedPart[];
  baseline?: SavedPart;
  baselineField?: MultipartValue<string>;
  controls?: SavedPart;
  crs?: MultipartValue<string>;
  name?: MultipartValue<string>;
  x?: MultipartValue<string>;
  y?: MultipartValue<string>;
  id?: MultipartValue<string>;
  skipBadRows?: MultipartValue<string>;
}

function megabytes(bytes: number): string {
  return `${Number((bytes / 1048576).toPrecision(3))} MB`;
}

interface UploadState {
  folder: string | null;
  parts: number;
  counted: boolean;
}

const uploadStates = new WeakMap<FastifyRequest, UploadState>();

function stateOf(request: FastifyRequest): UploadState {
  let state = uploadStates.get(request);
  if (state === undefined) {
    state = { folder: null, parts: 0, counted: false };
    uploadStates.set(request, state);
  }
  return state;
}

/**
 * The multipart plugin's onFile: stream a file part into the request's upload folder (created on the first part).
 * A part cut at the file size limit is refused with 413.
 */
export function uploadFileHandler(uploads: UploadFolder, fileLimit: number) {
  return async function onFile(this: FastifyRequest, part: MultipartFile): Promise<void> {
    const state = stateOf(this);
    state.folder ??= uploads.newRequestFolder();
    state.parts += 1;
    (part as SavedPart).savedPath = await uploads.save(state.folder, state.parts, part.file);
    if (part.file.truncated) {
      throw tooLargeError(`${part.filename}: the file is larger than the limit of ${megabytes(fileLimit)} (--body-limit)`);
    }
  };
}

function uploaded(part: SavedPart): UploadedFile {
  if (part.savedPath === undefined) throw new GridshakeError('GS_ERR_UPLOAD', `${part.filename}: the file did not arrive whole; send it again`);
  return { name: part.filename, path: part.savedPath };
}

function fieldValue(part: MultipartValue<string> | undefined): string | undefined {
  const value = part?.value.trim();
  return value === undefined || value === '' ? undefined : value;
}

export function registerDatasetRoutes(app: FastifyInstance, datasets: DatasetService, bodyLimit: number, uploads: UploadFolder): void {
  let receiving = 0;
  const release = async (request: FastifyRequest): Promise<void> => {
    const state = uploadStates.get(request);
    if (state === undefined) return;
    uploadStates.delete(request);
    if (state.counted) receiving -= 1;
    if (state.folder !== null) uploads.remove(state.folder);
  };
  // before the multipart parser runs: the parser limits each file, this limits the whole request
  const guardUpload = (route: string) => async (request: FastifyRequest, reply: FastifyReply): Promise<void> => {
    const type = (request.headers['content-type'] ?? '').toLowerCase();
    if (!type.startsWith('multipart/form-data')) {
      throw new GridshakeError('GS_ERR_CONTENT_TYPE', `POST ${route} needs a multipart/form-data upload`);
    }
    const length = Number(request.headers['content-length'] ?? Number.NaN);
    if (!Number.isFinite(length)) {
      throw new GridshakeError('GS_ERR_LENGTH_REQUIRED', `POST ${route} needs a Content-Length header`);
    }
    if (length > bodyLimit) {
      throw tooLargeError(
        `the upload is ${megabytes(length)}, larger than the limit of ${megabytes(bodyLimit)} (the upload limit set when the server was started)`,
      );
    }
    if (receiving >= MAX_CONCURRENT_UPLOADS) {
      reply.header('connection', 'close');
      throw tooManyUploadsError(
        `${MAX_CONCURRENT_UPLOADS} uploads are already in progress; send this one again when one of them has finished`,
      );
    }
    receiving += 1;
    stateOf(request).counted = true;
  };
  app.post<{ Body: UploadBody }>(
    '/api/datasets',
    {
      config: { multipart: true },
      bodyLimit,
      onResponse: release,
      onRequestAbort: release,
      onRequest: guardUpload('/api/datasets'),
      schema: {
        body: UPLOAD_BODY,
        response: { 201: { $ref: 'gsDatasetSummary#' }, ...errorResponses(400, 408, 411, 413, 429) },
      },
    },
    async (request, reply) => {
      const body = request.body;
      const noDataParts = body.noData === undefined ? [] : Array.isArray(body.noData) ? body.noData : [body.noData];
      const input = {
        points: uploaded(body.points),
        area: body.area === undefined ? undefined : uploaded(body.area),
        noData: noDataParts.map(uploaded),
        ...(body.baseline === undefined ? {} : { baseline: uploaded(body.baseline) }),
        ...(body.controls === undefined ? {} : { controls: uploaded(body.controls) }),
      };
      const summary = await datasets.createFromUpload(input, {
        crs: fieldValue(body.crs),
        name: fieldValue(body.name),
        x: fieldValue(body.x),
        y: fieldValue(body.y),
        id: fieldValue(body.id),
        skipBadRows: ['true', 'on'].includes(fieldValue(body.skipBadRows) ?? ''),
        baselineField: fieldValue(body.baselineField),
      });
      return reply.code(201).send(summary);
    },
  );

  // the numeric properties of a baseline polygon file (GeoJSON or GeoPackage), for the page's field picker (issue 15):
  // the same upload limits and guards as the upload itself; nothing is stored
  app.post<{ Body: { baseline: SavedPart } }>(
    '/api/datasets/baseline-fields',
    {
      config: { multipart: true },
      bodyLimit,
      onResponse: release,
      onRequestAbort: release,
      onRequest: guardUpload('/api/datasets/baseline-fields'),
      schema: {
        body: { type: 'object', required: ['baseline'], additionalProperties: false, properties: { baseline: FILE_PART } },
        response: {
          200: { type: 'object', required: ['fields'], properties: { fields: { type: 'array', items: { type: 'string' } } } },
          ...errorResponses(400, 408, 411, 413, 429),
        },
      },
    },
    async (request) => ({ fields: await datasets.baselineFields(uploaded(request.body.baseline)) }),
  );

  app.get(
    '/api/datasets',
    { schema: { response: { 200: { type: 'array', items: { $ref: 'gsDatasetSummary#' } }, ...errorResponses() } } },
    async () => datasets.list(),
  );

  app.get<{ Params: { id: string } }>(
    '/api/datasets/:id',
    { schema: { params: ID_PARAMS, response: { 200: { $ref: 'gsDatasetSummary#' }, ...errorResponses(400, 404) } } },
    async (request) => datasets.get(request.params.id),
  );

  app.get<{ Params: { id: string }; Querystring: { maxPoints?: number } }>(
    '/api/datasets/:id/geometry',
    {
      schema: {
        params: ID_PARAMS,
        querystring: {
          type: 'object',
          additionalProperties: false,
          properties: { maxPoints: { type: 'integer', minimum: 1, maximum: 100000 } },
        },
        response: { 200: DATASET_GEOMETRY_SCHEMA, ...errorResponses(400, 404) },
      },
    },
    async (request) => datasets.geometry(request.params.id, request.query.maxPoints),
  );

  registerDeleteRoute(app, '/api/datasets/:id', (id) => datasets.delete(id));
}
