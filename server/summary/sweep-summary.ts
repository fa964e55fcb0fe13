import type { DatasetSummary, Plan, SizeSummary, SweepSummary } from '../../shared/contracts.js';
import { overallConclusion, sizeConclusion } from './conclusion.js';
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
  const baseline = input.dataset.baseline;
  // against a baseline every sentence names the null (issue 15)
  const sizes = baseline === undefined ? input.sizes : input.sizes.map((size) => ({ ...size, conclusion: sizeConclusion(size, baseline) }));
  return {
    plan: input.plan,
    dataset: input.dataset,
    ...(baseline === undefined ? {} : { expectedFrom: baseline.kind === 'polygons' ? 'baseline' : 'controls', baseline }),
    sizes,
    overallTest,
    conclusion: overallConclusion(sizes, input.plan.alpha, overallTest, baseline),
    warnings: sweepWarnings(input.dataset, input.sizes),
    versions: input.versions,
    timings: {
      startedAt: input.startedAt.toISOString(),
      finishedAt: input.finishedAt.toISOString(),
      seconds: (input.finishedAt.getTime() - input.startedAt.getTime()) / 1000,
    },
  };
}
