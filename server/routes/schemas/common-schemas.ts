/**
 * JSON schemas shared by the routes: ids, bounding boxes, warnings, dataset summaries.
 * Response schemas list the fields clients rely on and allow more (the contracts may grow).
 */
import { CELL_SHAPES } from '../../../workers/lattice/cell-shape.js';
import { PLAN_LIMITS } from '../../../shared/plan-rules.js';

export const ID_PARAMS = {
  type: 'object',
  required: ['id'],
  properties: { id: { type: 'string', pattern: '^[0-9a-f-]{36}$' } },
  additionalProperties: false,
} as const;

export const BBOX_SCHEMA = {
  type: 'object',
  required: ['minX', 'minY', 'maxX', 'maxY'],
  properties: { minX: { type: 'number' }, minY: { type: 'number' }, maxX: { type: 'number' }, maxY: { type: 'number' } },
} as const;

export const WARNING_SCHEMA = {
  type: 'object',
  required: ['code', 'message'],
  properties: { code: { type: 'string' }, message: { type: 'string' }, ids: { type: 'array', items: { type: 'string' } } },
} as const;

export const DATASET_SUMMARY_SCHEMA = {
  $id: 'gsDatasetSummary',
  type: 'object',
  required: ['id', 'name', 'crs', 'n', 'nInside', 'nOutside', 'validArea', 'bbox', 'warnings', 'suggestedCellSizes'],
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
    areaIsDefault: { type: 'boolean' },
    warnings: { type: 'array', items: WARNING_SCHEMA },
    suggestedCellSizes: {
      type: 'array',
      items: {
        type: 'object',
        required: ['perCell', 'cellSize', 'rule'],
        properties: { perCell: { type: 'number' }, cellSize: { type: 'number' }, rule: { type: 'string' } },
      },
    },
    createdAt: { type: 'string' },
    sample: { type: ['string', 'null'] },
  },
} as const;

export const SWEEP_PROGRESS_SCHEMA = {
  type: 'object',
  required: ['done', 'total', 'elapsedSeconds'],
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
  properties: { work: { type: 'number' }, surfaceWork: { type: 'number' }, budget: { type: 'number' }, tasks: { type: 'integer' } },
} as const;

/** A plan as JSON: the CLI's names in camelCase (shared/design.md); the ranges of shared/plan-rules.ts, checked again by normalizePlan. */
export const PLAN_SCHEMA = {
  type: 'object',
  additionalProperties: false,
  properties: {
    cells: { type: 'array', minItems: 1, maxItems: PLAN_LIMITS.maxCellSizes, items: { type: 'number', exclusiveMinimum: 0 } },
    perCell: { type: 'array', minItems: 1, maxItems: PLAN_LIMITS.maxCellSizes, items: { type: 'number', exclusiveMinimum: 0 } },
    placements: { type: 'integer', minimum: PLAN_LIMITS.placements.min, maximum: PLAN_LIMITS.placements.max },
    rotation: { type: 'boolean' },
    design: { type: 'string', enum: ['halton', 'lattice'] },
    minCoverage: { type: 'number', exclusiveMinimum: 0, maximum: PLAN_LIMITS.minCoverageMax },
    alpha: { type: 'number', exclusiveMinimum: 0, maximum: PLAN_LIMITS.alphaMax },
    sims: { type: 'integer', minimum: PLAN_LIMITS.sims.min, maximum: PLAN_LIMITS.sims.max },
    seed: { type: 'integer' },
    // one cell shape or a list of different ones (workers/lattice CELL_SHAPES)
    shape: {
      anyOf: [
        { type: 'string', enum: [...CELL_SHAPES] },
        { type: 'array', minItems: 1, maxItems: CELL_SHAPES.length, uniqueItems: true, items: { type: 'string', enum: [...CELL_SHAPES] } },
      ],
    },
  },
} as const;

export const SWEEP_SCHEMA = {
  $id: 'gsSweep',
  type: 'object',
  required: ['id', 'datasetId', 'status', 'plan', 'estimate', 'progress', 'createdAt'],
  additionalProperties: true,
  properties: {
    id: { type: 'string' },
    datasetId: { type: 'string' },
    datasetName: { type: ['string', 'null'] },
    status: { type: 'string', enum: ['queued', 'running', 'done', 'failed', 'cancelled', 'interrupted'] },
    plan: { type: 'object', additionalProperties: true },
    estimate: SWEEP_ESTIMATE_SCHEMA,
    progress: SWEEP_PROGRESS_SCHEMA,
    queuePosition: { type: ['integer', 'null'] },
    summary: { type: ['object', 'null'], additionalProperties: true },
    conclusion: { type: ['string', 'null'] },
    error: { type: ['string', 'null'] },
    rerunOf: { type: ['string', 'null'] },
    createdAt: { type: 'string' },
    startedAt: { type: ['string', 'null'] },
    finishedAt: { type: ['string', 'null'] },
  },
} as const;
