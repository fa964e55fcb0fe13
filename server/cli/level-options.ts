/** The options `gridshake count` and `gridshake sweep` share, with the plan's ranges and defaults (shared/plan-rules.ts). */
import { DEFAULT_PLAN, PLAN_RANGE_WORDS } from '../../shared/plan-rules.js';
import type { OptionSpecs } from './args.js';

export const LEVEL_OPTIONS: OptionSpecs = {
  'min-coverage': {
    type: 'string',
    value: 'T',
    description: `least share of a cell in the valid region, ${PLAN_RANGE_WORDS.minCoverage}; default ${DEFAULT_PLAN.minCoverage}`,
  },
  alpha: { type: 'string', value: 'A', description: `two-sided significance level, ${PLAN_RANGE_WORDS.alpha}; default ${DEFAULT_PLAN.alpha}` },
};
