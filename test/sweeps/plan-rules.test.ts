import { describe, expect, it } from 'vitest';
import { PLAN_LIMITS } from '../../shared/plan-rules.js';
import { PLAN_SCHEMA } from '../../shared/http-schemas.js';
import { normalizePlan } from '../../server/sweeps/plan.js';
import { parseAlpha, parseMinCoverage } from '../../server/cli/args.js';
import { sweepCommand } from '../../server/cli/sweep-command.js';
import { PLAN_FORM_DEFAULTS, readPlan } from '../../client/src/plan/plan-values.js';

// The plan's rules are written once (shared/plan-rules.ts); the HTTP schema, the plan validation, the CLI parser and
// help, and the page's form all follow them, at the open and closed ends of each range.
const form = (overrides: Record<string, string>) => ({ sizes: [{ text: '150', include: true, label: 'side' }], extraSides: '', ...PLAN_FORM_DEFAULTS, ...overrides });

describe('one set of plan rules', () => {
  it('gives the HTTP schema its ranges', () => {
    const { properties } = PLAN_SCHEMA;
    expect(properties.placements).toMatchObject({ minimum: PLAN_LIMITS.placements.min, maximum: PLAN_LIMITS.placements.max });
    expect(properties.sims).toMatchObject({ minimum: PLAN_LIMITS.sims.min, maximum: PLAN_LIMITS.sims.max });
    expect(properties.minCoverage).toMatchObject({ exclusiveMinimum: 0, maximum: PLAN_LIMITS.minCoverageMax });
    expect(properties.alpha).toMatchObject({ exclusiveMinimum: 0, maximum: PLAN_LIMITS.alphaMax });
    expect(properties.cells.maxItems).toBe(PLAN_LIMITS.maxCellSizes);
  });

  it('minCoverage is (0, 1] in the plan validation, the CLI parser and the page form alike', () => {
    for (const [value, ok] of [[0.01, true], [1, true], [0, false], [1.01, false]] as const) {
      if (ok) expect(normalizePlan({ cells: [100], minCoverage: value }).minCoverage).toBe(value);
      else expect(() => normalizePlan({ cells: [100], minCoverage: value })).toThrow(/must be a number in \(0, 1\]/);
      if (ok) expect(parseMinCoverage(String(value))).toBe(value);
      else expect(() => parseMinCoverage(String(value))).toThrow();
      expect(readPlan(form({ minCoverage: String(value) })).plan !== null, `page ${value}`).toBe(ok);
    }
  });

  it('alpha is (0, 0.5] in the CLI parser and the page form alike', () => {
    expect(parseAlpha('0.5')).toBe(0.5);
    expect(() => parseAlpha('0.51')).toThrow();
    expect(readPlan(form({ alpha: '0.51' })).plan).toBeNull();
    expect(readPlan(form({ alpha: '0.5' })).plan?.alpha).toBe(0.5);
  });

  it('writes the ranges and defaults into the CLI help', () => {
    const options = sweepCommand.options;
    expect(options.placements.description).toBe('placements per cell size, 1..65536; default 256');
    expect(options['min-coverage'].description).toBe('least share of a cell in the valid region, (0, 1]; default 0.5');
    expect(options.alpha.description).toBe('two-sided significance level, (0, 0.5]; default 0.05');
    expect(options.sims.description).toBe('simulated CSR patterns for the Monte Carlo test, 0..9999; default 99');
  });
});
