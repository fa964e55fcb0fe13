import type { DatasetSummary, Plan, SizeSummary, SweepSummary } from '../../shared/contracts.js';
import { overallConclusion } from './conclusion.js';
import { overallMonteCarloTest } from './overall-test.js';
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
  const withSims = input.sizes.length > 0 && input.sizes.every((size) => size.monteCarlo !== null);
  // squares-only sweeps keep the overall test exactly as before shapes existed
  const withShapes = input.sizes.some((size) => (size.shape ?? 'square') !== 'square');
  const overallTest = withSims
    ? overallMonteCarloTest(
        input.sizes.map((size) => ({ cellSize: size.cellSize, ...(withShapes ? { shape: size.shape ?? 'square' } : {}), monteCarlo: size.monteCarlo! })),
        input.plan.alpha,
      )
    : null;
  return {
    plan: input.plan,
    dataset: input.dataset,
    sizes: input.sizes,
    overallTest,
    conclusion: overallConclusion(input.sizes, input.plan.alpha, overallTest),
    warnings: sweepWarnings(input.dataset, input.sizes),
    versions: input.versions,
    timings: {
      startedAt: input.startedAt.toISOString(),
      finishedAt: input.finishedAt.toISOString(),
      seconds: (input.finishedAt.getTime() - input.startedAt.getTime()) / 1000,
    },
  };
}
