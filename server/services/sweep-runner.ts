/**
 * What the sweep queue needs from the worker pool (server/sweeps/sweep-pool.ts implements it):
 * run one sweep with cancellation and progress, and shut down.
 */
import type { Dataset, PlacementRow, Plan, SweepSummary } from '../contracts.js';

/** Progress as the pool reports it: at least placements done and total. */
export interface RunnerProgress {
  done: number;
  total: number;
  elapsedSeconds?: number;
  remainingSeconds?: number | null;
}

export interface SweepRunOptions {
  signal?: AbortSignal;
  onProgress?: (progress: RunnerProgress) => void;
}

export interface SweepRunner {
  runSweep(dataset: Dataset, plan: Plan, options: SweepRunOptions): Promise<{ rows: PlacementRow[]; summary: SweepSummary }>;
  destroy(): Promise<void>;
  /** worker threads, for /api/health */
  readonly threads?: number;
}
