/**
 * The live cost estimate of a plan, the server's formula and limits (shared/plan-rules.ts):
 * work = points inside x placements x sizes x (1 + sims) point-placements, and evaluations = sizes x placements x
 * (1 + sims) grid evaluations, where "sizes" counts every (shape, cell size) pair; a baseline adds its own work
 * (shared/plan-rules.ts baselineWork), as the server counts it. Cost O(1).
 */
import type { BaselineInfo, Plan } from '../../../shared/contracts.js';
import { baselineSizeOf, MAX_EVALUATIONS, planWork } from '../../../shared/plan-rules.js';
import { shapeList } from '../../../workers/lattice/cell-shape.js';

export interface PlanCost {
  work: number;
  /** the part of work the population at risk adds (0 against area) */
  baselineWork: number;
  evaluations: number;
  /** work / budget; null when the budget is unknown */
  shareOfBudget: number | null;
  /** why the server will refuse the plan, or null */
  refusal: string | null;
}

export function planCost(plan: Plan, nInside: number, budget: number | null, baseline?: BaselineInfo): PlanCost {
  const sizes = (plan.cells ?? plan.perCell ?? []).length * shapeList(plan.shape).length;
  const { work, baselineWork, evaluations } = planWork(nInside, plan.placements, sizes, plan.sims, baselineSizeOf(baseline));
  let refusal: string | null = null;
  if (budget !== null && work > budget) {
    const factor = work / budget;
    refusal = `Too large: ${work.toExponential(2)} point-placements is ${factor.toFixed(1)} times the budget of ${budget.toExponential(2)}. Shrink it at least ${Math.ceil(factor)}-fold: fewer placements, fewer simulations, fewer cell sides or one cell shape.`;
  } else if (evaluations > MAX_EVALUATIONS) {
    const factor = evaluations / MAX_EVALUATIONS;
    refusal = `Too large: ${evaluations.toExponential(2)} grid evaluations is ${factor.toFixed(1)} times the limit of ${MAX_EVALUATIONS.toExponential(2)}. Use fewer placements, simulations or cell sides.`;
  }
  return { work, baselineWork, evaluations, shareOfBudget: budget === null ? null : work / budget, refusal };
}
