/**
 * Step 2: the plan. Cell sides suggested from the dataset's rules of thumb (each labelled with its rule, editable,
 * with room for more), the cell shape (squares, hexagons or both side by side), placements, design, rotation, minCoverage, alpha, sims and seed; a live cost estimate and
 * the budget refusal before anything starts.
 */
import { smallestWorkingSims } from '../../../shared/monte-carlo-rule.js';
import { DEFAULT_PLAN, isPlacementDesign, PLACEMENT_DESIGN_LABELS, PLACEMENT_DESIGNS, PLAN_LIMITS } from '../../../shared/plan-rules.js';
import { api, ApiError } from '../api/api-client.js';
import type { Store } from '../app-state.js';
import { formatNumber } from '../../../shared/format.js';
import { planCost } from '../plan/plan-estimate.js';
import { PLAN_FORM_DEFAULTS, readPlan, type PlanFormValues, type ShapeChoice } from '../plan/plan-values.js';
import { shapeList } from '../../../workers/lattice/cell-shape.js';
import { clear, el, field, message, select } from '../ui/dom.js';
import { executorField } from './executor-choice.js';

export function initPlanPanel(container: HTMLElement, store: Store): void {
  store.subscribe((state, changed) => {
    if (changed.has('dataset') && state.dataset) buildForm(container, store);
    if (changed.has('dataset') && !state.dataset) clear(container, el('p', { class: 'hint' }, 'Choose a dataset first.'));
    if (changed.has('health') && state.dataset) container.querySelector('form')?.dispatchEvent(new Event('change'));
  });
}

function buildForm(container: HTMLElement, store: Store): void {
  const dataset = store.state.dataset!;
  const sizeRows = dataset.suggestedCellSizes.map((suggestion, k) => {
    const include = el('input', { type: 'checkbox', id: `size-include-${k}`, checked: true });
    const side = el('input', { type: 'number', id: `size-side-${k}`, min: 0, step: 'any', value: String(Math.round(suggestion.cellSize)), 'aria-label': `Cell side in metres for ${formatNumber(suggestion.perCell)} expected points per cell` });
    const row = el(
      'div',
      { class: 'size-row' },
      include,
      el('label', { for: include.id }, `${formatNumber(suggestion.perCell)} points per cell`),
      side,
      el('span', {}, 'm'),
      el('span', { class: 'field-hint' }, suggestion.rule),
    );
    return { include, side, label: `${formatNumber(suggestion.perCell)} per cell`, row };
  });
  const extra = el('input', { type: 'text', id: 'plan-extra-sides', placeholder: 'e.g. 150, 400' });
  const placements = el('input', { type: 'number', id: 'plan-placements', min: PLAN_LIMITS.placements.min, max: PLAN_LIMITS.placements.max, step: 1, value: PLAN_FORM_DEFAULTS.placements });
  const design = select({ id: 'plan-design' }, PLACEMENT_DESIGNS.map((name) => [name, PLACEMENT_DESIGN_LABELS[name]] as const));
  const shape = select({ id: 'plan-shape' }, [
    ['square', 'squares'],
    ['hex', 'hexagons (area = side², pointy-top)'],
    ['both', 'both, side by side on the same placements'],
  ]);
  shape.value = PLAN_FORM_DEFAULTS.shape;
  const rotation = el('input', { type: 'checkbox', id: 'plan-rotation', checked: PLAN_FORM_DEFAULTS.rotation });
  const rotationLabel = el('label', { for: rotation.id });
  // minCoverage and alpha are in (0, max]: the input's min is the open end 0 (readPlan refuses 0 itself)
  const minCoverage = el('input', { type: 'number', id: 'plan-min-coverage', min: 0, max: PLAN_LIMITS.minCoverageMax, step: 'any', value: PLAN_FORM_DEFAULTS.minCoverage });
  const alpha = el('input', { type: 'number', id: 'plan-alpha', min: 0, max: PLAN_LIMITS.alphaMax, step: 'any', value: PLAN_FORM_DEFAULTS.alpha });
  const sims = el('input', { type: 'number', id: 'plan-sims', min: PLAN_LIMITS.sims.min, max: PLAN_LIMITS.sims.max, step: 1, value: PLAN_FORM_DEFAULTS.sims });
  const seed = el('input', { type: 'number', id: 'plan-seed', step: 1, value: PLAN_FORM_DEFAULTS.seed });
  const estimate = el('div', { id: 'plan-estimate', class: 'estimate', 'aria-live': 'polite' });
  const start = el('button', { type: 'submit', class: 'button button-primary', id: 'start-sweep' }, 'Start the sweep');
  const feedback = el('div', { 'aria-live': 'assertive' });
  const where = executorField();
  where.update(store.state.health);

  const values = (): PlanFormValues => ({
    sizes: sizeRows.map((row) => ({ text: row.side.value, include: row.include.checked, label: row.label })),
    extraSides: extra.value,
    placements: placements.value,
    design: isPlacementDesign(design.value) ? design.value : DEFAULT_PLAN.design,
    shape: (['square', 'hex', 'both'] as const).find((choice) => choice === shape.value) ?? 'square',
    rotation: rotation.checked,
    minCoverage: minCoverage.value,
    alpha: alpha.value,
    sims: sims.value,
    seed: seed.value,
  });

  const refresh = () => {
    where.update(store.state.health);
    const current = values();
    rotationLabel.textContent = rotationText(current.shape);
    const reading = readPlan(current);
    if (!reading.plan) {
      clear(estimate, ...reading.errors.map((text) => message('error', text)));
      start.disabled = true;
      return null;
    }
    const budget = store.state.health?.workBudget ?? null;
    const cost = planCost(reading.plan, dataset.nInside, budget, dataset.baseline, dataset.bbox);
    const share = cost.shareOfBudget === null ? '' : ` (${formatNumber(100 * cost.shareOfBudget, 2)} % of the budget of ${budget!.toExponential(1)})`;
    clear(
      estimate,
      el('p', {}, `Cost: ${dataset.nInside} points x ${reading.plan.placements} placements x ${reading.plan.cells!.length} cell sides${shapeCount(reading.plan.shape)} x (1 + ${reading.plan.sims}) patterns${cost.baselineWork > 0 ? ` + ${cost.baselineWork.toExponential(2)} for the population at risk` : ''} = ${cost.work.toExponential(2)} point-placements${cost.surfaceWork > 0 ? `, plus ${cost.surfaceWork.toExponential(2)} for the stability surface` : ''}${share}.`),
      cost.refusal ? message('error', cost.refusal) : null,
    );
    start.disabled = cost.refusal !== null;
    return reading.plan;
  };

  const form = el(
    'form',
    { class: 'plan-form', 'aria-label': 'Sweep plan', novalidate: true },
    el('fieldset', {}, el('legend', {}, 'Cell sides (suggested from the rules of thumb; edit freely)'), ...sizeRows.map((row) => row.row), field('More cell sides (m)', extra, 'Comma separated.')),
    el(
      'fieldset',
      {},
      el('legend', {}, 'Placements and test'),
      el('div', { class: 'field-grid' },
        field('Placements per cell side', placements),
        field('Placement design', design),
        field('Cell shape', shape, 'Hexagons have the area of the square of the same side; both runs the two shapes on the same placements and says whether the conclusion depends on the shape.'),
        field('minCoverage (0-1)', minCoverage, 'Cells with less of their area in the valid region are left out; 1 = whole cells only.'),
        field('alpha (two-sided)', alpha),
        field('CSR simulations', sims, `At least ${smallestWorkingSims(0.05)} at alpha 0.05, ${smallestWorkingSims(0.01)} at 0.01 (no p-value below 1/(R+1)); 0 = per-placement evidence only, no test.`),
        field('Seed', seed),
      ),
      el('div', { class: 'check-row' }, rotation, rotationLabel),
    ),
    where.element,
    estimate,
    start,
    feedback,
  );
  form.addEventListener('input', () => void refresh());
  form.addEventListener('change', () => void refresh());
  form.addEventListener('submit', async (event) => {
    event.preventDefault();
    const plan = refresh();
    if (!plan) return;
    start.disabled = true;
    clear(feedback);
    try {
      const started = await api.startSweep(dataset.id, plan, where.value());
      store.update({ sweepId: started.id, summary: null, rows: [], sizeIndex: null, placement: null });
      document.getElementById('step-run')?.scrollIntoView({ behavior: 'smooth', block: 'start' });
    } catch (error) {
      const refusal = error instanceof ApiError && error.code === 'GS_ERR_BUDGET' ? 'The server refused the plan: ' : '';
      clear(feedback, message('error', `${refusal}${error instanceof Error ? error.message : String(error)}`));
    } finally {
      start.disabled = false;
      refresh();
    }
  });
  clear(container, form);
  refresh();
}

/** The rotation checkbox's label: each shape turns over its own period (90 degrees for squares, 60 for hexagons). */
function rotationText(choice: ShapeChoice): string {
  if (choice === 'hex') return 'Rotate the grids (angles 0 to 60 degrees)';
  if (choice === 'both') return 'Rotate the grids (angles 0 to 90 degrees for squares, 0 to 60 for hexagons)';
  return 'Rotate the grids (angles 0 to 90 degrees)';
}

/** " x 2 shapes" in the cost line when the plan runs more than one shape. */
function shapeCount(shape: Parameters<typeof shapeList>[0]): string {
  const count = shapeList(shape).length;
  return count > 1 ? ` x ${count} shapes` : '';
}
