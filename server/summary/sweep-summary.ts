import type { DatasetSummary, Plan, SizeSummary, SweepSummary } from '../contracts.js';
import { overallConclusion } from './conclusion.js';
import { sweepWarnings } from './sweep-warnings.js';

export interface SweepSummaryInput {
  plan: Plan;
  dataset: DatasetSummary;
  sizes: SizeSummary[];
  versions: Record<string, string>;
  startedAt: Date;
  finishedAt: Date;
}

/** Assembles the summary of a whole sweep: per-size summaries, overall conclusion, warnings, versions, timings. */
export function buildSweepSummary(input: SweepSummaryInput): SweepSummary {
  return {
    plan: input.plan,
    dataset: input.dataset,
    sizes: input.sizes,
    conclusion: overallConclusion(input.sizes, input.plan.alpha),
    warnings: sweepWarnings(input.dataset, input.sizes),
    versions: input.versions,
    timings: {
      startedAt: input.startedAt.toISOString(),
      finishedAt: input.finishedAt.toISOString(),
      seconds: (input.finishedAt.getTime() - input.startedAt.getTime()) / 1000,
    },
  };
}
