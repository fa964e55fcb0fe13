/**
 * The live cost estimate of a plan, the server's formula and limits (shared/plan-rules.ts):
 * work = points inside x placements x sizes x (1 + sims) point-placements, and evaluations = sizes x placements x
 * (1 + sims) grid evaluations, where "sizes" counts every (shape, cell size) pair; a baseline adds its own work
 * (shared/plan-rules.ts baselineWork), as the server counts it; given the dataset's box, the stability surface every
 * server sweep computes adds surfaceWork (raster pixels x placements x SURFACE_PIXEL_WEIGHT, over the study area's
 * box as the server's own check). Cost O(sizes).
 */
import type { BaselineInfo, Plan } from '../../../shared/contracts.js';
import { baselineSizeOf, MAX_EVALUATIONS, planWork, surfacePixelCount } from '../../../shared/plan-rules.js';
import type { BBox } from '../../../workers/types.js';
import { shapeList } from '../../../workers/lattice/cell-shape.js';

export interface PlanCost {
  work: number;
  /** the part of work the population at risk adds (0 against area) */
  baselineWork: number;
  /** the stability surface's work (0 without the dataset's box); the budget holds work + surfaceWork */
  surfaceWork: number;
  evaluations: number;
  /** work / budget; null when the budget is unknown */
  shareOfBudget: number | null;
  /** why the server will refuse the plan, or null */
  refusal: string | null;
}

export function planCost(plan: Plan, nInside: number, budget: number | null, baseline?: BaselineInfo, bbox?: BBox): PlanCost {
  const shapes = shapeList(plan.shape).length;
  const sizes = (plan.cells ?? plan.perCell ?? []).length * shapes;
  const pixels = bbox === undefined || plan.cells === undefined ? 0 : surfacePixelCount(bbox, plan.cells, shapes);
  const { work, baselineWork, surfaceWork, evaluations } = planWork(nInside, plan.placements, sizes, plan.sims, baselineSizeOf(baseline), pixels);
  const total = work + surfaceWork;
  let refusal: string | null = null;
  if (budget !== null && total > budget) {
    const factor = total / budget;
    refusal = `Too large: ${total.toExponential(2)} point-placements is ${factor.toFixed(1)} times the budget of ${budget.toExponential(2)}. Shrink it at least ${Math.ceil(factor)}-fold: fewer placements, fewer simulations, fewer cell sides or one cell shape${surfaceWork > 0 ? ', or larger cells (the stability surface has 4 times fewer pixels at twice the cell side)' : ''}.`;
  } else if (evaluations > MAX_EVALUATIONS) {
    const factor = evaluations / MAX_EVALUATIONS;
    refusal = `Too large: ${evaluations.toExponential(2)} grid evaluations is ${factor.toFixed(1)} times the limit of ${MAX_EVALUATIONS.toExponential(2)}. Use fewer placements, simulations or cell sides.`;
  }
  return { work, baselineWork, surfaceWork, evaluations, shareOfBudget: budget === null ? null : total / budget, refusal };
}
