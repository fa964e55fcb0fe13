/**
 * The default sweep runner: the sweep runner (sweep-runner.ts) on the local piscina executor (local-executor.ts).
 * `new SweepPool({ threads })` is what the server and the CLI use when no queue is given.
 */
import type { ResourceLimits } from 'node:worker_threads';
import { LocalExecutor } from './local-executor.js';
import { ExecutorSweepRunner } from './sweep-runner.js';

export { POOL_TASK_FILE } from './local-executor.js';
export type { SweepResult, SweepRunOptions } from './sweep-runner.js';

export interface SweepPoolOptions {
  /** worker threads; default os.availableParallelism() */
  threads?: number;
  /** task file; default POOL_TASK_FILE */
  filename?: string;
  /** work budget in point-placements; default GRIDSHAKE_WORK_BUDGET or DEFAULT_WORK_BUDGET */
  budget?: number;
  /** heap limits of each worker thread: a worker over them ends with ERR_WORKER_OUT_OF_MEMORY, failing its sweep only */
  resourceLimits?: ResourceLimits;
}

export class SweepPool extends ExecutorSweepRunner {
  constructor(options: SweepPoolOptions = {}) {
    super(new LocalExecutor({ threads: options.threads, filename: options.filename, resourceLimits: options.resourceLimits }), options.budget);
  }
}
