/**
 * What the sweep queue needs from the worker pool (server/sweeps/sweep-runner.ts implements it
 * on an executor: the local pool or the Redis queue):
 * run one sweep with cancellation and progress, and shut down.
 */
import type { Dataset, ExecutorChoice, PlacementRow, Plan, SweepSummary } from '../../shared/contracts.js';
import type { StabilitySurface } from '../stability/stability-accumulator.js';

export type { ExecutorChoice };

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
  /** the stored dataset's id, so that its shared copy is kept per dataset rather than per sweep */
  datasetId?: string;
  /** also compute the stability surfaces (server/stability) */
  stability?: boolean;
  /** where the tasks run, for a runner with a choice (routed-runner.ts); others ignore it */
  executor?: ExecutorChoice;
}

export interface SweepRunner {
  runSweep(dataset: Dataset, plan: Plan, options: SweepRunOptions): Promise<{ rows: PlacementRow[]; summary: SweepSummary; stability?: StabilitySurface[] }>;
  destroy(): Promise<void>;
  /** worker threads, for /api/health */
  readonly threads?: number;
  /** the executors a sweep may choose, the default first; absent: the local pool only */
  readonly executors?: readonly ExecutorChoice[];
}
