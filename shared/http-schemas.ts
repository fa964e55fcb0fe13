/**
 * The HTTP contract, written once: the JSON schemas (`as const`) of the bodies the API takes and sends. The server's
 * routes hand these very objects to Fastify (validation, serialization); shared/contracts.ts derives the TypeScript
 * types from them (shared/schema-type.ts), and the page reads those types. A field is added here, nowhere else.
 *
 * Response schemas list every field the server sends; those marked `additionalProperties: true` let more through
 * (the contract may grow), while test/server/http-contract.test.ts fails when a real response carries a field not
 * described here or misses a described one. Fastify's serializer (fast-json-stringify) sends only the described
 * fields of an object without `additionalProperties: true`, and refuses to send a body without a `required` field.
 */
import { CELL_SHAPES } from '../workers/lattice/cell-shape.js';
import { PLACEMENT_DESIGNS, PLAN_LIMITS } from './plan-rules.js';

/** A dataset's or a sweep's id (a UUID). */
export const ID_SCHEMA = { type: 'string', pattern: '^[0-9a-f-]{36}$' } as const;

/** The `:id` of a route's path. */
export const ID_PARAMS = {
  type: 'object',
  required: ['id'],
  properties: { id: ID_SCHEMA },
  additionalProperties: false,
} as const;

/** A rectangle in planar metres. */
export const BBOX_SCHEMA = {
  type: 'object',
  required: ['minX', 'minY', 'maxX', 'maxY'],
  properties: { minX: { type: 'number' }, minY: { type: 'number' }, maxX: { type: 'number' }, maxY: { type: 'number' } },
} as const;

/** A warning about the input (the server also keeps a `cliMessage` for the command line, not sent). */
export const WARNING_SCHEMA = {
  type: 'object',
  required: ['code', 'message'],
  properties: {
    code: { type: 'string' },
    /** in the page's words (its field labels) */
    message: { type: 'string' },
    /** record ids or feature numbers concerned, possibly truncated */
    ids: { type: 'array', items: { type: 'string' } },
  },
} as const;

/** How input coordinates were turned into planar metres. */
export const PROJECTION_SCHEMA = {
  anyOf: [
    { type: 'object', required: ['kind'], properties: { kind: { const: 'planar' } } },
    { type: 'object', required: ['kind', 'code', 'proj4'], properties: { kind: { const: 'epsg' }, code: { type: 'number' }, proj4: { type: 'string' } } },
    {
      type: 'object',
      required: ['kind', 'lon0', 'lat0', 'proj4'],
      properties: { kind: { const: 'laea' }, lon0: { type: 'number' }, lat0: { type: 'number' }, proj4: { type: 'string' } },
    },
  ],
} as const;

/** What a dataset records about its baseline (summary.json, count --json, the report, the dataset summary). */
export const BASELINE_INFO_SCHEMA = {
  type: 'object',
  required: ['kind', 'file', 'features', 'totalInside', 'total', 'outsideFeatures', 'uncoveredShare'],
  additionalProperties: true,
  properties: {
    kind: { type: 'string', enum: ['polygons', 'controls'] },
    /** the file's name as given */
    file: { type: 'string' },
    /** the count property (polygons only) */
    field: { type: 'string' },
    /** polygons: features read; controls: points read */
    features: { type: 'number' },
    /** polygons: Σ P_p over the polygons with |p ∩ V| > 0; controls: controls inside V */
    totalInside: { type: 'number' },
    /** polygons: Σ P_p over every polygon */
    total: { type: 'number' },
    /** polygons: 1-based numbers of the features with |p ∩ V| = 0 (reported and ignored) */
    outsideFeatures: { type: 'array', items: { type: 'number' } },
    /** polygons: share of V outside every polygon (weight 0 there); controls: 0 */
    uncoveredShare: { type: 'number' },
    /** controls: how many lie outside V (never counted) */
    controlsOutside: { type: 'number' },
    /**
     * polygons: the pieces p ∩ V kept (|p ∩ V| > 0) and their ring vertices, what the areal weighting costs per placement
     * (the work budget, shared/plan-rules.ts baselineWork); absent in datasets stored before the budget counted them
     */
    pieces: { type: 'number' },
    vertices: { type: 'number' },
  },
} as const;

/** A stored dataset as the API shows it (POST /api/datasets, GET /api/datasets, GET /api/datasets/:id). */
export const DATASET_SUMMARY_SCHEMA = {
  $id: 'gsDatasetSummary',
  type: 'object',
  required: ['id', 'name', 'crs', 'n', 'nInside', 'nOutside', 'validArea', 'studyAreaArea', 'bbox', 'areaIsDefault', 'warnings', 'suggestedCellSizes'],
  additionalProperties: true,
  properties: {
    id: { type: 'string' },
    name: { type: 'string' },
    crs: { type: 'string' },
    n: { type: 'integer' },
    nInside: { type: 'integer' },
    nOutside: { type: 'integer' },
    validArea: { type: 'number' },
    studyAreaArea: { type: 'number' },
    bbox: BBOX_SCHEMA,
    /** true when no study area was given and the points' bounding box was used */
    areaIsDefault: { type: 'boolean' },
    warnings: { type: 'array', items: WARNING_SCHEMA },
    /** how the input coordinates became planar metres (absent in summaries stored before it was recorded) */
    projection: PROJECTION_SCHEMA,
    /** the same as one line with the full proj4 definition, e.g. "EPSG:32633: +proj=utm +zone=33 ..." */
    projectionUsed: { type: 'string' },
    /** the population at risk: file, field and totals (absent: expected counts follow area) */
    baseline: BASELINE_INFO_SCHEMA,
    /** cell sides (m) for 1.6, 2 and 5 expected points per cell: side = sqrt(k * validArea / nInside) */
    suggestedCellSizes: {
      type: 'array',
      items: {
        type: 'object',
        required: ['perCell', 'cellSize', 'rule'],
        properties: { perCell: { type: 'number' }, cellSize: { type: 'number' }, rule: { type: 'string' } },
      },
    },
    createdAt: { type: 'string' },
    /** the demo scenario this dataset was loaded from, or null for an upload */
    sample: { type: ['string', 'null'] },
  },
} as const;

const CELL_SIDES = { type: 'array', minItems: 1, maxItems: PLAN_LIMITS.maxCellSizes, items: { type: 'number', exclusiveMinimum: 0 } } as const;

/**
 * A plan as JSON (the body's `plan` of POST /api/sweeps): the CLI's names in camelCase (shared/design.md); every
 * field may be left out (the defaults of shared/plan-rules.ts fill it), the ranges are shared/plan-rules.ts's,
 * checked again by normalizePlan.
 */
export const PLAN_SCHEMA = {
  type: 'object',
  additionalProperties: false,
  properties: {
    /** cell sides in metres; exactly one of cells / perCell is given */
    cells: CELL_SIDES,
    /** expected points per cell, turned into sides by sqrt(k * validArea / n) */
    perCell: CELL_SIDES,
    placements: { type: 'integer', minimum: PLAN_LIMITS.placements.min, maximum: PLAN_LIMITS.placements.max },
    rotation: { type: 'boolean' },
    design: { type: 'string', enum: PLACEMENT_DESIGNS },
    minCoverage: { type: 'number', exclusiveMinimum: 0, maximum: PLAN_LIMITS.minCoverageMax },
    alpha: { type: 'number', exclusiveMinimum: 0, maximum: PLAN_LIMITS.alphaMax },
    sims: { type: 'integer', minimum: PLAN_LIMITS.sims.min, maximum: PLAN_LIMITS.sims.max },
    seed: { type: 'integer' },
    /**
     * the cells' shape, or a list of different shapes run on the same placement design (absent: square, workers/lattice
     * DEFAULT_CELL_SHAPE); kept as given so that a square plan reads back unchanged
     */
    shape: {
      anyOf: [
        { type: 'string', enum: CELL_SHAPES },
        { type: 'array', minItems: 1, maxItems: CELL_SHAPES.length, uniqueItems: true, items: { type: 'string', enum: CELL_SHAPES } },
      ],
    },
  },
} as const;

/** The plan fields every normalized (stored, answered) plan has: all but the cell sizes and the shape. */
export const PLAN_FILLED_FIELDS = ['placements', 'rotation', 'design', 'minCoverage', 'alpha', 'sims', 'seed'] as const;

/** A normalized plan as the API answers it (the request's plan with its defaults filled in). */
const STORED_PLAN_SCHEMA = { ...PLAN_SCHEMA, required: PLAN_FILLED_FIELDS, additionalProperties: true } as const;

/** Where a server may run a sweep's tasks: its own worker pool, or the Redis queue of `serve --queue`. */
export const EXECUTOR_CHOICES = ['local', 'queue'] as const;

/** POST /api/sweeps; `executor` absent: the server's default (the queue on a server with one). */
export const SWEEP_START_BODY_SCHEMA = {
  type: 'object',
  required: ['datasetId', 'plan'],
  additionalProperties: false,
  properties: { datasetId: ID_SCHEMA, plan: PLAN_SCHEMA, executor: { type: 'string', enum: EXECUTOR_CHOICES } },
} as const;

export const SWEEP_STATUSES = ['queued', 'running', 'done', 'failed', 'cancelled', 'interrupted'] as const;

export const SWEEP_PROGRESS_SCHEMA = {
  type: 'object',
  required: ['done', 'total', 'elapsedSeconds', 'remainingSeconds'],
  properties: {
    done: { type: 'number' },
    total: { type: 'number' },
    elapsedSeconds: { type: 'number' },
    remainingSeconds: { type: ['number', 'null'] },
  },
} as const;

export const SWEEP_ESTIMATE_SCHEMA = {
  type: 'object',
  required: ['work', 'budget', 'tasks'],
  additionalProperties: true,
  properties: {
    /** points x placements x sizes x (1 + sims), plus baselineWork */
    work: { type: 'number' },
    /**
     * the stability surface's work in the same unit: raster pixels x placements x SURFACE_PIXEL_WEIGHT
     * (shared/plan-rules.ts); the budget holds work + surfaceWork
     */
    surfaceWork: { type: 'number' },
    budget: { type: 'number' },
    tasks: { type: 'integer' },
    /** sizes x placements x (1 + sims): grid evaluations held until summarised */
    evaluations: { type: 'number' },
    /** bytes of simulated CSR coordinates: points x sims x 16 */
    simulatedBytes: { type: 'number' },
    /** the part of `work` the population at risk adds (shared/plan-rules.ts baselineWork); 0 or absent against area */
    baselineWork: { type: 'number' },
  },
} as const;

/**
 * A sweep as the API shows it (GET /api/sweeps, /api/sweeps/:id, POST …/cancel). `summary` (GET one sweep only) is the
 * summary.json contract, SweepSummary in shared/contracts.ts, passed through whole.
 */
export const SWEEP_SCHEMA = {
  $id: 'gsSweep',
  type: 'object',
  required: [
    'id', 'datasetId', 'datasetName', 'status', 'plan', 'estimate', 'progress', 'queuePosition', 'conclusion', 'error', 'rerunOf',
    'executor', 'createdAt', 'startedAt', 'finishedAt',
  ],
  additionalProperties: true,
  properties: {
    id: { type: 'string' },
    datasetId: { type: 'string' },
    datasetName: { type: ['string', 'null'] },
    status: { type: 'string', enum: SWEEP_STATUSES },
    plan: STORED_PLAN_SCHEMA,
    estimate: SWEEP_ESTIMATE_SCHEMA,
    progress: SWEEP_PROGRESS_SCHEMA,
    /** place in the queue (0 = next) while queued, else null */
    queuePosition: { type: ['integer', 'null'] },
    summary: { type: ['object', 'null'], additionalProperties: true },
    /** the summary's overall conclusion (also when the summary itself is not sent) */
    conclusion: { type: ['string', 'null'] },
    error: { type: ['string', 'null'] },
    rerunOf: { type: ['string', 'null'] },
    /** where the sweep runs (null: stored before it was recorded; a rerun then uses the server's default) */
    executor: { type: ['string', 'null'], enum: [...EXECUTOR_CHOICES, null] },
    createdAt: { type: 'string' },
    startedAt: { type: ['string', 'null'] },
    finishedAt: { type: ['string', 'null'] },
  },
} as const;

/** POST /api/sweeps and POST /api/sweeps/:id/rerun (202). */
export const SWEEP_STARTED_SCHEMA = {
  type: 'object',
  required: ['id', 'status', 'estimate'],
  properties: {
    id: { type: 'string' },
    status: { type: 'string', enum: SWEEP_STATUSES },
    estimate: SWEEP_ESTIMATE_SCHEMA,
    queuePosition: { type: ['integer', 'null'] },
    rerunOf: { type: ['string', 'null'] },
  },
} as const;

const RINGS = { type: 'array', items: { type: 'array', items: { type: 'array', items: { type: 'number' } } } } as const;
const MULTIPOLYGON = { type: 'array', items: RINGS } as const;

/** GET /api/datasets/:id/geometry: what the page draws of a dataset (server/services/dataset-geometry.ts). */
export const DATASET_GEOMETRY_SCHEMA = {
  type: 'object',
  required: ['points', 'pointInside', 'totalPoints', 'stride', 'studyArea', 'noDataZones', 'bbox', 'origin'],
  properties: {
    /** points drawn, x,y interleaved (planar metres) */
    points: { type: 'array', items: { type: 'number' } },
    /** 1 when the drawn point is inside the valid region, 0 when it lies outside (never counted) */
    pointInside: { type: 'array', items: { type: 'integer' } },
    /** points in the dataset, and the stride used (1 = every point drawn) */
    totalPoints: { type: 'integer' },
    stride: { type: 'integer' },
    /**
     * the population-at-risk polygons inside the valid region (p ∩ V, closed rings) with their density P_p / |p ∩ V| per
     * km², for the map's choropleth (issue 15); absent without baseline polygons
     */
    baseline: {
      type: 'object',
      required: ['polygons', 'maxDensity'],
      properties: {
        polygons: {
          type: 'array',
          items: { type: 'object', required: ['rings', 'density'], properties: { rings: RINGS, density: { type: 'number' } } },
        },
        maxDensity: { type: 'number' },
      },
    },
    /**
     * the control points inside the valid region (issue 15), x,y interleaved (planar metres), decimated like the points
     * (every stride-th of total drawn); absent without controls
     */
    controls: {
      type: 'object',
      required: ['points', 'total', 'stride'],
      properties: { points: { type: 'array', items: { type: 'number' } }, total: { type: 'integer' }, stride: { type: 'integer' } },
    },
    studyArea: MULTIPOLYGON,
    noDataZones: MULTIPOLYGON,
    bbox: BBOX_SCHEMA,
    origin: { type: 'object', required: ['x', 'y'], properties: { x: { type: 'number' }, y: { type: 'number' } } },
  },
} as const;

/** GET /api/health: version, database path and worker pool size, for the page header and for scripts. */
export const HEALTH_SCHEMA = {
  type: 'object',
  required: ['status', 'version', 'databasePath', 'poolSize'],
  properties: {
    status: { type: 'string', enum: ['ok'] },
    version: { type: 'string' },
    databasePath: { type: 'string' },
    poolSize: { type: 'integer' },
    /** datasets in the store */
    datasets: { type: 'integer' },
    /** work budget of one sweep in point-placements, for the page's live cost estimate */
    workBudget: { type: 'number' },
    /** the analyst's own XYZ tile server (serve --basemap), when configured */
    basemap: { type: 'string' },
    /** where a sweep may run (`executor` of POST /api/sweeps), the default first: ["local"], or ["queue", "local"] */
    executors: { type: 'array', items: { type: 'string', enum: EXECUTOR_CHOICES } },
  },
} as const;

/** Every error response: `{ statusCode, code: "GS_ERR_…", message }` ($ref: 'gsError#'). */
export const ERROR_SCHEMA = {
  $id: 'gsError',
  type: 'object',
  required: ['statusCode', 'code', 'message'],
  properties: {
    statusCode: { type: 'integer' },
    /** a code of shared/error-codes.ts */
    code: { type: 'string' },
    message: { type: 'string' },
  },
} as const;
