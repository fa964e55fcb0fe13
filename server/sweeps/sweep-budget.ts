/**
 * Work estimate of a sweep and the budget that refuses plans too large to finish in reasonable time or memory.
 * work = points x placements x sizes x (1 + sims): one point tested against one placement of one pattern; "sizes"
 * counts every (shape, cell size) pair of the plan; a baseline adds its own work in the same unit (baselineWork). A
 * sweep that also computes the stability surface has surfaceWork = raster pixels x placements x SURFACE_PIXEL_WEIGHT
 * (shared/plan-rules.ts) besides (every placement may find the cell of every pixel: hexagons and baselines do; squares
 * without a baseline locate only the pixels near the boundary, so for them this is an upper bound, kept so that the
 * budget's answers do not change); the budget holds work + surfaceWork.
 */
import type { Plan, SweepEstimate } from '../../shared/contracts.js';
import type { BaselineSize } from '../../workers/baseline/baseline.js';
import type { BBox } from '../../workers/types.js';
import { budgetError } from '../errors.js';
import { planShapes } from './plan.js';
import { DEFAULT_WORK_BUDGET, MAX_EVALUATIONS, MAX_SIMULATED_BYTES, planWork, SURFACE_PIXEL_WEIGHT, surfacePixelCount } from '../../shared/plan-rules.js';

export { DEFAULT_WORK_BUDGET } from '../../shared/plan-rules.js';

/** Work of one chunk task, in point-placements: small enough that a cancelled sweep stops within a second. */
export const CHUNK_WORK = 1e7;

/** Most placements in one chunk task. */
export const MAX_CHUNK_PLACEMENTS = 64;

/** The work budget from the environment (GRIDSHAKE_WORK_BUDGET, point-placements) or the default. */
export function workBudgetFromEnv(env: Record<string, string | undefined> = process.env): number {
  const raw = env.GRIDSHAKE_WORK_BUDGET;
  if (raw === undefined || raw === '') return DEFAULT_WORK_BUDGET;
  const value = Number(raw);
  if (!Number.isFinite(value) || value <= 0) {
    throw budgetError(`GRIDSHAKE_WORK_BUDGET must be a positive number of point-placements, got ${JSON.stringify(raw)}`);
  }
  return value;
}

/** Placements per chunk task for n points and R sims: CHUNK_WORK / (n (1 + R)), between 1 and MAX_CHUNK_PLACEMENTS. */
export function chunkPlacements(nInside: number, sims: number): number {
  const perPlacement = Math.max(1, nInside) * (1 + sims);
  return Math.max(1, Math.min(MAX_CHUNK_PLACEMENTS, Math.floor(CHUNK_WORK / perPlacement)));
}

/** (shape, cell size) pairs of the plan. */
function sizeCount(plan: Plan): number {
  return (plan.cells ?? plan.perCell ?? []).length * planShapes(plan).length;
}

/** The stability surface a sweep computes: over this bounding box (planar metres), one raster per cell side. */
export interface SurfacePlan {
  /** the valid region's bounding box, or a box holding it (the estimate is then an upper bound) */
  bbox: BBox;
  /** the plan's resolved cell sides (metres), each computed once per shape */
  cellSizes: readonly number[];
}

/** Raster pixels of the stability surfaces of a plan: the raster of each cell side, once per shape. Cost O(sides). */
export function surfacePixels(plan: Plan, surface: SurfacePlan): number {
  return surfacePixelCount(surface.bbox, surface.cellSizes, planShapes(plan).length);
}

/**
 * Estimates a sweep: work = nInside x placements x sizes x (1 + sims) plus what a baseline adds (areal weighting per
 * placement and the polygon-intensity simulation, or the controls counted per placement: shared/plan-rules.ts
 * baselineWork), the stability surface's work when `extra.surface` is given, the number of chunk tasks, the
 * evaluations held for the summary (sizes x placements x (1 + sims)) and the bytes of simulated coordinates.
 * Cost O(sizes).
 */
export function estimateSweep(
  plan: Plan,
  nInside: number,
  budget: number = DEFAULT_WORK_BUDGET,
  extra: { baseline?: BaselineSize; surface?: SurfacePlan } = {},
): SweepEstimate {
  const { baseline, surface } = extra;
  const sizes = sizeCount(plan);
  const perChunk = chunkPlacements(nInside, plan.sims);
  const pixels = surface === undefined ? 0 : surfacePixels(plan, surface);
  const { work, baselineWork, surfaceWork, evaluations, simulatedBytes } = planWork(nInside, plan.placements, sizes, plan.sims, baseline, pixels);
  return {
    work,
    ...(surface === undefined ? {} : { surfaceWork }),
    budget,
    tasks: sizes * Math.ceil(plan.placements / perChunk),
    evaluations,
    simulatedBytes,
    ...(baseline === undefined ? {} : { baselineWork }),
  };
}

function formatCount(value: number): string {
  return value >= 1e5 ? value.toExponential(2) : String(Math.round(value));
}

/**
 * Refuses an estimate above the budget, saying by how much and how to shrink the plan.
 * @throws GridshakeError GS_ERR_BUDGET
 */
export function assertWithinBudget(estimate: SweepEstimate): void {
  const shrink = 'fewer placements, fewer sims or fewer cell sizes';
  const surfaceWork = estimate.surfaceWork ?? 0;
  const total = estimate.work + surfaceWork;
  if (total > estimate.budget) {
    const factor = total / estimate.budget;
    const extra = estimate.baselineWork ?? 0;
    const terms = extra > 0
      ? `points x placements x sizes x (1 + sims), plus ${formatCount(extra)} for the population at risk`
      : 'points x placements x sizes x (1 + sims)';
    const simpler = extra > 0 ? `${shrink}, or a baseline with fewer or simpler polygons` : shrink;
    if (surfaceWork > 0) {
      // the surface's share shrinks with placements, cell sizes and the square of the cell side, not with sims
      throw budgetError(
        `the plan needs ${formatCount(total)} point-placements: ${formatCount(estimate.work)} for the counts ` +
          `(${terms}) and ${formatCount(surfaceWork)} for the stability surface ` +
          `(raster pixels x placements x ${SURFACE_PIXEL_WEIGHT}, about 64 pixels per cell), ${factor.toFixed(1)} times the budget of ` +
          `${formatCount(estimate.budget)}; shrink it at least ${Math.ceil(factor)}-fold: ${simpler}, or larger cells ` +
          '(the surface has 4 times fewer pixels at twice the cell side)',
      );
    }
    throw budgetError(
      `the plan needs ${formatCount(estimate.work)} point-placements (${terms}), ` +
        `${factor.toFixed(1)} times the budget of ${formatCount(estimate.budget)}; shrink it at least ${Math.ceil(factor)}-fold: ${simpler}`,
    );
  }
  const evaluations = estimate.evaluations ?? 0;
  if (evaluations > MAX_EVALUATIONS) {
    const factor = evaluations / MAX_EVALUATIONS;
    throw budgetError(
      `the plan needs ${formatCount(evaluations)} grid evaluations (sizes x placements x (1 + sims)), ` +
        `${factor.toFixed(1)} times the limit of ${formatCount(MAX_EVALUATIONS)}; use ${shrink}`,
    );
  }
  const simulatedBytes = estimate.simulatedBytes ?? 0;
  if (simulatedBytes > MAX_SIMULATED_BYTES) {
    const megabytes = (bytes: number): string => `${Math.ceil(bytes / 1048576)} MB`;
    throw budgetError(
      `the simulated CSR patterns would take ${megabytes(simulatedBytes)} (points x sims x 16 bytes), above the ` +
        `limit of ${megabytes(MAX_SIMULATED_BYTES)}; use fewer sims`,
    );
  }
}
