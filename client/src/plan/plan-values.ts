/**
 * Reading the plan form: the raw field texts become a Plan (shared/design.md: `{ cells, placements, rotation,
 * design, minCoverage, alpha, sims, seed }`, and `shape` of issue 16: "square", "hex" or both side by side) or a list of messages naming the field at fault. The server checks
 * the plan again; this only lets the page refuse early and say why.
 */
import type { Plan, PlacementDesign } from '../../../shared/contracts.js';
import { simsCanReject, smallestWorkingSims } from '../../../shared/monte-carlo-rule.js';
import { DEFAULT_PLAN, PLAN_LIMITS } from '../../../shared/plan-rules.js';
import type { CellShape } from '../../../workers/lattice/cell-shape.js';

/** The form's shape choice: squares, hexagons, or both on the same placements side by side. */
export type ShapeChoice = 'square' | 'hex' | 'both';

/**
 * The plan's `shape` for a choice: "hex", the list of both (squares first), or none for squares (the plan's default,
 * so a square-only plan stays what it was before shapes existed).
 */
export function planShapeOf(choice: ShapeChoice): CellShape | CellShape[] | undefined {
  return choice === 'both' ? ['square', 'hex'] : choice === 'hex' ? 'hex' : undefined;
}

export interface PlanFormValues {
  /** suggested or typed cell sides: text of the number field and whether it is included */
  sizes: { text: string; include: boolean; label: string }[];
  /** more cell sides, comma or space separated, metres */
  extraSides: string;
  placements: string;
  design: PlacementDesign;
  shape: ShapeChoice;
  rotation: boolean;
  minCoverage: string;
  alpha: string;
  sims: string;
  seed: string;
}

export interface PlanReading {
  plan: Plan | null;
  errors: string[];
}

function numberIn(name: string, text: string, test: (value: number) => boolean, range: string, errors: string[]): number {
  const value = Number(text.trim());
  if (text.trim() === '' || !Number.isFinite(value) || !test(value)) errors.push(`${name} must be ${range}, got "${text}"`);
  return value;
}

/** Parses and checks the plan form; cell sides are de-duplicated and sorted. */
export function readPlan(values: PlanFormValues): PlanReading {
  const errors: string[] = [];
  const sides: number[] = [];
  for (const size of values.sizes) {
    if (!size.include) continue;
    sides.push(numberIn(`Cell side (${size.label})`, size.text, (value) => value > 0, 'a positive number of metres', errors));
  }
  // "150, 400 m" and "150m; 400m" are read as metres; every token that is not a positive number goes into one message
  const tokens = values.extraSides.replace(/(\d)\s*m\b/gi, '$1').split(/[\s,;]+/).filter((part) => part !== '');
  const bad: string[] = [];
  for (const token of tokens) {
    const value = Number(token);
    if (Number.isFinite(value) && value > 0) sides.push(value);
    else if (!bad.includes(token)) bad.push(token);
  }
  if (bad.length > 0) {
    errors.push(`More cell sides: ${bad.map((token) => `"${token}"`).join(', ')} ${bad.length === 1 ? 'is not a' : 'are not'} positive number${bad.length === 1 ? '' : 's'} of metres (write e.g. 150, 400)`);
  }
  const cells = [...new Set(sides.filter((side) => side > 0))].sort((a, b) => a - b);
  if (cells.length === 0 && errors.length === 0) errors.push('Choose at least one cell side');
  if (cells.length > PLAN_LIMITS.maxCellSizes) errors.push(`At most ${PLAN_LIMITS.maxCellSizes} cell sides, got ${cells.length}`);
  const integer = (value: number) => Number.isInteger(value);
  const { placements: placementRange, sims: simsRange, minCoverageMax, alphaMax } = PLAN_LIMITS;
  const placements = numberIn('Placements', values.placements, (value) => integer(value) && value >= placementRange.min && value <= placementRange.max, `a whole number from ${placementRange.min} to ${placementRange.max}`, errors);
  const minCoverage = numberIn('minCoverage', values.minCoverage, (value) => value > 0 && value <= minCoverageMax, `a number above 0 and at most ${minCoverageMax}`, errors);
  const alpha = numberIn('alpha', values.alpha, (value) => value > 0 && value <= alphaMax, `a number above 0 and at most ${alphaMax}`, errors);
  const sims = numberIn('CSR simulations', values.sims, (value) => integer(value) && value >= simsRange.min && value <= simsRange.max, `a whole number from ${simsRange.min} to ${simsRange.max}`, errors);
  const seed = numberIn('Seed', values.seed, (value) => Number.isSafeInteger(value), 'a whole number', errors);
  if (errors.length === 0 && sims > 0 && !simsCanReject(sims, alpha)) {
    errors.push(`CSR simulations: ${sims} is too few for a test at alpha ${alpha} (no p-value below 1/(R+1)); use at least ${smallestWorkingSims(alpha)}, or 0 for per-placement evidence without a test`);
  }
  if (errors.length > 0) return { plan: null, errors: [...new Set(errors)] };
  const shape = planShapeOf(values.shape);
  const plan: Plan = { cells, placements, rotation: values.rotation, design: values.design, minCoverage, alpha, sims, seed };
  return { plan: shape === undefined ? plan : { ...plan, shape }, errors };
}

/** The form's starting values: DEFAULT_PLAN (shared/plan-rules.ts), as field texts. */
export const PLAN_FORM_DEFAULTS = {
  placements: String(DEFAULT_PLAN.placements),
  design: DEFAULT_PLAN.design,
  shape: 'square' as ShapeChoice,
  rotation: DEFAULT_PLAN.rotation,
  minCoverage: String(DEFAULT_PLAN.minCoverage),
  alpha: String(DEFAULT_PLAN.alpha),
  sims: String(DEFAULT_PLAN.sims),
  seed: String(DEFAULT_PLAN.seed),
};
