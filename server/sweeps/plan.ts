/**
 * Sweep plans: validation of a plan given as JSON (HTTP) or built from CLI flags, with the defaults of
 * DEFAULT_PLAN, and the resolution of "expected points per cell" into cell sides.
 * Every bad value is a GS_ERR_PARAMETER error naming the field and the allowed range.
 */
import type { Plan } from '../../shared/contracts.js';
import { DEFAULT_PLAN, isPlacementDesign, PLACEMENT_DESIGNS, PLAN_LIMITS } from '../../shared/plan-rules.js';
import { parameterError, tooFewSimsError } from '../errors.js';
import { fieldRef, twoWays, type FieldName } from '../messages/field-names.js';
import { tooFewSimsMessage } from '../../shared/monte-carlo-rule.js';
import { formatMetres, significant } from '../../shared/format.js';
import { cellSizeForExpected } from '../../workers/stats/expected-per-cell.js';
import { CELL_SHAPES, isCellShape, shapeList, type CellShape } from '../../workers/lattice/cell-shape.js';

export { PLAN_LIMITS } from '../../shared/plan-rules.js';

const PLAN_FIELDS = new Set(['cells', 'perCell', 'placements', 'rotation', 'design', 'minCoverage', 'alpha', 'sims', 'seed', 'shape']);

function isRecord(value: unknown): value is Record<string, unknown> {
  return typeof value === 'object' && value !== null && !Array.isArray(value);
}

function integerField(name: FieldName, value: unknown, min: number, max: number): number {
  if (typeof value !== 'number' || !Number.isInteger(value) || value < min || value > max) {
    throw parameterError(`${fieldRef(name)} must be an integer from ${min} to ${max}, got ${JSON.stringify(value)}`);
  }
  return value;
}

function openClosedField(name: FieldName, value: unknown, max: number): number {
  if (typeof value !== 'number' || !Number.isFinite(value) || value <= 0 || value > max) {
    throw parameterError(`${fieldRef(name)} must be a number in (0, ${max}], got ${JSON.stringify(value)}`);
  }
  return value;
}

function sizeList(name: 'cells' | 'perCell', value: unknown): number[] {
  const unit = name === 'cells' ? 'cell sides in metres' : 'expected points per cell';
  if (!Array.isArray(value) || value.length === 0 || value.length > PLAN_LIMITS.maxCellSizes) {
    throw parameterError(`${fieldRef(name)} must be a list of 1 to ${PLAN_LIMITS.maxCellSizes} ${unit}, got ${JSON.stringify(value)}`);
  }
  value.forEach((entry, index) => {
    if (typeof entry !== 'number' || !Number.isFinite(entry) || entry <= 0) {
      throw parameterError(`${fieldRef(name, index)} must be a positive finite number (${unit}), got ${JSON.stringify(entry)}`);
    }
  });
  return [...(value as number[])];
}

/** The plan's `shape`: one shape, or a list of 1 to CELL_SHAPES.length different shapes, kept as given. */
function shapeField(value: unknown): CellShape | CellShape[] {
  const allowed = `one of ${CELL_SHAPES.join(', ')} or a list of them`;
  if (isCellShape(value)) return value;
  if (!Array.isArray(value) || value.length === 0 || value.length > CELL_SHAPES.length) {
    throw parameterError(`${fieldRef('shape')} must be ${allowed}, got ${JSON.stringify(value)}`);
  }
  value.forEach((entry, index) => {
    if (!isCellShape(entry)) throw parameterError(`${fieldRef('shape', index)} must be one of ${CELL_SHAPES.join(', ')}, got ${JSON.stringify(entry)}`);
    if (value.indexOf(entry) !== index) throw parameterError(`${fieldRef('shape')} names ${entry} twice`);
  });
  return [...(value as CellShape[])];
}

/** The shapes a plan runs, in its order (a plan without `shape` runs squares only). */
export function planShapes(plan: Pick<Plan, 'shape'>): CellShape[] {
  return shapeList(plan.shape);
}

/**
 * Validates a plan and fills in the defaults of DEFAULT_PLAN. Exactly one of `cells` (metres) or `perCell`
 * (expected points per cell) must be given. Unknown fields are refused so that typos do not pass silently.
 * A plan whose Monte Carlo test could never reject (1/(R+1) > alpha with R = sims > 0) is refused with
 * GS_ERR_TOO_FEW_SIMS (shared/monte-carlo-rule.ts).
 * @throws GridshakeError GS_ERR_PARAMETER naming the field and its allowed range, or GS_ERR_TOO_FEW_SIMS
 */
export function normalizePlan(input: unknown): Plan {
  if (!isRecord(input)) throw parameterError(`plan must be an object, got ${JSON.stringify(input)}`);
  for (const key of Object.keys(input)) {
    if (!PLAN_FIELDS.has(key)) throw parameterError(`${twoWays(`plan.${key}`, `plan.${key}`)} is not a plan field (allowed: ${[...PLAN_FIELDS].join(', ')})`);
  }
  const hasCells = input.cells !== undefined;
  const hasPerCell = input.perCell !== undefined;
  if (hasCells === hasPerCell) {
    throw parameterError(
      `${twoWays('give', 'the plan needs')} exactly one of ${fieldRef('cells')} (cell sides in metres) or ${fieldRef('perCell')} (expected points per cell)`,
    );
  }
  const merged = { ...DEFAULT_PLAN, ...input } as Record<string, unknown>;
  if (typeof merged.rotation !== 'boolean') {
    throw parameterError(`${fieldRef('rotation')} must be true or false, got ${JSON.stringify(merged.rotation)}`);
  }
  if (!isPlacementDesign(merged.design)) {
    throw parameterError(`${fieldRef('design')} must be one of ${PLACEMENT_DESIGNS.join(', ')}, got ${JSON.stringify(merged.design)}`);
  }
  if (typeof merged.seed !== 'number' || !Number.isSafeInteger(merged.seed)) {
    throw parameterError(`${fieldRef('seed')} must be an integer, got ${JSON.stringify(merged.seed)}`);
  }
  const plan: Plan = {
    placements: integerField('placements', merged.placements, PLAN_LIMITS.placements.min, PLAN_LIMITS.placements.max),
    rotation: merged.rotation,
    design: merged.design,
    minCoverage: openClosedField('minCoverage', merged.minCoverage, PLAN_LIMITS.minCoverageMax),
    alpha: openClosedField('alpha', merged.alpha, PLAN_LIMITS.alphaMax),
    sims: integerField('sims', merged.sims, PLAN_LIMITS.sims.min, PLAN_LIMITS.sims.max),
    seed: merged.seed,
  };
  if (hasCells) plan.cells = sizeList('cells', input.cells);
  else plan.perCell = sizeList('perCell', input.perCell);
  // absent stays absent (squares), so that a plan without shapes reads back exactly as before shapes existed
  if (input.shape !== undefined) plan.shape = shapeField(input.shape);
  const refusal = tooFewSimsMessage(plan.sims, plan.alpha);
  if (refusal !== null) {
    // the rule's sentence starts "sims R is too few ...": the field named per audience
    const rest = refusal.replace(/^sims /, '');
    throw tooFewSimsError(twoWays(`--sims ${rest}`, `${fieldRef('sims')}: ${rest}`));
  }
  VALIDATED.add(plan);
  return plan;
}

/** Plans that normalizePlan returned (or that came back from the store, which holds only such plans). */
const VALIDATED = new WeakSet<Plan>();

/**
 * Marks a plan read back from the store as validated: the store only holds plans that normalizePlan returned, so
 * the sweep runner does not validate them again.
 */
export function trustStoredPlan(plan: Plan): Plan {
  VALIDATED.add(plan);
  return plan;
}

/** The plan itself when normalizePlan (or trustStoredPlan) already vouched for it, otherwise normalizePlan(input). */
export function validatedPlan(input: Plan): Plan {
  return VALIDATED.has(input) ? input : normalizePlan(input);
}

/** Cell sides in messages: six significant digits. */
const SIX = { significant: 6 };

/**
 * Cell sides in metres for a plan: `cells` as given, or `perCell` turned into sides by side = sqrt(k * A / n)
 * (A valid area in m^2, n points inside the valid region; shared/reference-values.md, "Rules of thumb").
 * Refuses sides that leave fewer than 2 cells' worth of area in the valid region (A / side^2 < 2).
 * @throws GridshakeError GS_ERR_PARAMETER
 */
export function resolveCellSizes(plan: Plan, validArea: number, nInside: number): number[] {
  if (!(validArea > 0)) throw parameterError(`the valid region has no area (${validArea} m²); check the study area and no-data zones`);
  let sizes: number[];
  if (plan.cells) {
    sizes = plan.cells;
  } else {
    if (nInside < 1) throw parameterError(`${fieldRef('perCell')} needs at least one point inside the valid region`);
    sizes = (plan.perCell ?? []).map((k) => cellSizeForExpected(k, validArea, nInside));
  }
  const largest = Math.sqrt(validArea / PLAN_LIMITS.minCellsInRegion);
  sizes.forEach((size, index) => {
    const field = plan.cells ? fieldRef('cells', index) : fieldRef('perCell', index);
    assertCellCountWithinLimit(size, validArea, field);
    if (size > largest) {
      throw parameterError(
        `${field} gives cells of ${formatMetres(size, SIX)}, which leave fewer than ${PLAN_LIMITS.minCellsInRegion} cells in the ` +
          `valid region of ${significant(validArea, 6)} m²; use cells of at most ${formatMetres(largest, SIX)}`,
      );
    }
  });
  return sizes;
}

/**
 * Refuses a cell side that puts more than PLAN_LIMITS.maxCellsInRegion cells' worth of area (A / side^2) in the
 * valid region; `field` names the value in the message (a field reference: fieldRef('cells', 0), or fieldRef('cell')).
 * @throws GridshakeError GS_ERR_PARAMETER
 */
export function assertCellCountWithinLimit(size: number, validArea: number, field: string): void {
  const smallest = Math.sqrt(validArea / PLAN_LIMITS.maxCellsInRegion);
  if (size >= smallest) return;
  const cells = validArea / (size * size);
  throw parameterError(
    `${field} gives cells of ${formatMetres(size, SIX)}, ${Number.isFinite(cells) ? `about ${significant(cells, 6)}` : 'too many'} cells in the ` +
      `valid region of ${significant(validArea, 6)} m², more than ${PLAN_LIMITS.maxCellsInRegion}; use cells of at least ` +
      `${formatMetres(smallest, SIX)}`,
  );
}
