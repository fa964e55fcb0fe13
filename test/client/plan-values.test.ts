import { describe, it, expect } from 'vitest';
import { DEFAULT_PLAN } from '../../shared/plan-rules.js';
import { estimateSweep } from '../../server/sweeps/sweep-budget.js';
import { normalizePlan } from '../../server/sweeps/plan.js';
import { planCost } from '../../client/src/plan/plan-estimate.js';
import { PLAN_FORM_DEFAULTS, readPlan, type PlanFormValues } from '../../client/src/plan/plan-values.js';

function form(overrides: Partial<PlanFormValues>): PlanFormValues {
  return {
    sizes: [
      { text: '190', include: true, label: '1.6 per cell' },
      { text: '213', include: false, label: '2 per cell' },
    ],
    extraSides: '400, 150 400',
    ...PLAN_FORM_DEFAULTS,
    ...overrides,
  };
}

describe('readPlan(values)', () => {
  it('collects included and extra sides, sorted without repeats, and the other fields as numbers', () => {
    const reading = readPlan(form({}));
    expect(reading.errors).toEqual([]);
    expect(reading.plan).toEqual({ cells: [150, 190, 400], placements: 256, rotation: true, design: 'halton', minCoverage: 0.5, alpha: 0.05, sims: 99, seed: 1 });
    // the server's own validation accepts what the page sends
    expect(normalizePlan(reading.plan)).toEqual(reading.plan);
  });

  it('maps the shape choice to the plan\'s shape: none for squares (the default), "hex", or both in a list', () => {
    expect(readPlan(form({ shape: 'square' })).plan).not.toHaveProperty('shape');
    const hex = readPlan(form({ shape: 'hex' })).plan!;
    expect(hex.shape).toBe('hex');
    const both = readPlan(form({ shape: 'both' })).plan!;
    expect(both.shape).toEqual(['square', 'hex']);
    // the server's own validation accepts what the page sends, and counts both shapes in its estimate
    expect(normalizePlan(both)).toEqual(both);
    expect(planCost(both, 564, 2e10).work).toBe(estimateSweep(both, 564, 2e10).work);
    expect(planCost(both, 564, 2e10).work).toBe(2 * planCost(readPlan(form({})).plan!, 564, 2e10).work);
  });

  it('starts from the server defaults', () => {
    const plan = readPlan(form({})).plan!;
    const { cells: _cells, ...rest } = plan;
    expect(rest).toEqual({ ...DEFAULT_PLAN });
  });

  it('shows the smallest number of simulations that can reject at the chosen alpha (1/(R+1) <= alpha)', () => {
    const reading = readPlan(form({ sims: '9', alpha: '0.05' }));
    expect(reading.plan).toBeNull();
    expect(reading.errors.join(' ')).toContain('use at least 19');
    expect(readPlan(form({ sims: '9', alpha: '0.01' })).errors.join(' ')).toContain('use at least 99');
    expect(readPlan(form({ sims: '0' })).errors).toEqual([]);
    expect(readPlan(form({ sims: '19' })).errors).toEqual([]);
  });

  it('names every field at fault', () => {
    const reading = readPlan(form({ extraSides: 'ten', placements: '2.5', minCoverage: '0', alpha: '0.7', sims: '-1', seed: 'x' }));
    expect(reading.plan).toBeNull();
    expect(reading.errors).toEqual([
      'More cell sides: "ten" is not a positive number of metres (write e.g. 150, 400)',
      'Placements must be a whole number from 1 to 65536, got "2.5"',
      'minCoverage must be a number above 0 and at most 1, got "0"',
      'alpha must be a number above 0 and at most 0.5, got "0.7"',
      'CSR simulations must be a whole number from 0 to 9999, got "-1"',
      'Seed must be a whole number, got "x"',
    ]);
  });

  it('reads sides written with their unit and says one message per problem, never the same twice', () => {
    expect(readPlan(form({ extraSides: '150 m, 400m; 90' })).plan?.cells).toEqual([90, 150, 190, 400]);
    const reading = readPlan(form({ extraSides: 'm, m, 5 km, x' }));
    expect(reading.errors).toEqual(['More cell sides: "m", "km", "x" are not positive numbers of metres (write e.g. 150, 400)']);
  });

  it('asks for at least one cell side', () => {
    const reading = readPlan(form({ sizes: [{ text: '190', include: false, label: 'a' }], extraSides: '' }));
    expect(reading.errors).toEqual(['Choose at least one cell side']);
  });
});

describe('planCost(plan, nInside, budget)', () => {
  const plan = { cells: [100, 200, 300], placements: 64, rotation: true, design: 'halton' as const, minCoverage: 0.5, alpha: 0.05, sims: 19, seed: 1 };

  it('equals the server estimate: points x placements x sizes x (1 + sims)', () => {
    const cost = planCost(plan, 564, 2e10);
    // 564 x 64 x 3 x 20 = 2165760
    expect(cost.work).toBe(2165760);
    expect(cost.work).toBe(estimateSweep(plan, 564, 2e10).work);
    expect(cost.evaluations).toBe(estimateSweep(plan, 564, 2e10).evaluations);
    expect(cost.shareOfBudget).toBeCloseTo(2165760 / 2e10, 15);
    expect(cost.refusal).toBeNull();
  });

  it('counts the stability surface over the dataset box as the server does, and refuses when the surface tips it over', () => {
    const bbox = { minX: 0, minY: 0, maxX: 1000, maxY: 800 };
    const cost = planCost(plan, 564, 2e10, undefined, bbox);
    const server = estimateSweep(plan, 564, 2e10, { surface: { bbox, cellSizes: plan.cells } });
    // cells 100, 200, 300 m: pixels of 12.5, 25 and 37.5 m: 80 x 64 + 40 x 32 + 27 x 22 = 6994, x 64 placements x 12
    expect(cost.surfaceWork).toBe(6994 * 64 * 12);
    expect(cost.surfaceWork).toBe(server.surfaceWork);
    expect(cost.work).toBe(server.work);
    const budget = cost.work + cost.surfaceWork;
    expect(planCost(plan, 564, budget, undefined, bbox).refusal).toBeNull();
    expect(planCost(plan, 564, budget - 1, undefined, bbox).refusal).toMatch(/^Too large: .* or larger cells/);
    // without the box (no dataset yet) the surface is not counted
    expect(planCost(plan, 564, budget - 1).refusal).toBeNull();
  });

  it('refuses above the budget with the shrink factor, and above the evaluation limit', () => {
    const large = { ...plan, placements: 65536, sims: 9999 };
    const cost = planCost(large, 564, 2e10);
    // 564 x 65536 x 3 x 10000 = 1.1088e12 -> 55.4 times 2e10, shrink at least 56-fold
    expect(cost.refusal).toContain('55.4 times the budget');
    expect(cost.refusal).toContain('at least 56-fold');
    const manyEvaluations = planCost({ ...plan, placements: 65536, sims: 199 }, 1, 2e10);
    // 3 x 65536 x 200 = 39321600 > 2e7
    expect(manyEvaluations.refusal).toContain('grid evaluations');
    expect(planCost(large, 564, null).shareOfBudget).toBeNull();
  });
});
