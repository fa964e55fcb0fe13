/**
 * The live cost estimate of a plan, the same formula as the server's (server/sweeps/sweep-budget.ts):
 * work = points inside x placements x sizes x (1 + sims) point-placements, and evaluations = sizes x placements x
 * (1 + sims) grid evaluations, where "sizes" counts every (shape, cell size) pair. Cost O(1).
 */
import type { Plan } from '../../../server/contracts.js';
import { shapeList } from '../../../workers/lattice/cell-shape.js';

/** Most grid evaluations a sweep may hold (the server's MAX_EVALUATIONS). */
export const MAX_EVALUATIONS = 2e7;

export interface PlanCost {
  work: number;
  evaluations: number;
  /** work / budget; null when the budget is unknown */
  shareOfBudget: number | null;
  /** why the server will refuse the plan, or null */
  refusal: string | null;
}

export function planCost(plan: Plan, nInside: number, budget: number | null): PlanCost {
  const sizes = (plan.cells ?? plan.perCell ?? []).length * shapeList(plan.shape).length;
  const patterns = 1 + plan.sims;
  const work = nInside * plan.placements * sizes * patterns;
  const evaluations = sizes * plan.placements * patterns;
  let refusal: string | null = null;
  if (budget !== null && work > budget) {
    const factor = work / budget;
    refusal = `Too large: ${work.toExponential(2)} point-placements is ${factor.toFixed(1)} times the budget of ${budget.toExponential(2)}. Shrink it at least ${Math.ceil(factor)}-fold: fewer placements, fewer simulations, fewer cell sides or one cell shape.`;
  } else if (evaluations > MAX_EVALUATIONS) {
    const factor = evaluations / MAX_EVALUATIONS;
    refusal = `Too large: ${evaluations.toExponential(2)} grid evaluations is ${factor.toFixed(1)} times the limit of ${MAX_EVALUATIONS.toExponential(2)}. Use fewer placements, simulations or cell sides.`;
  }
  return { work, evaluations, shareOfBudget: budget === null ? null : work / budget, refusal };
}
