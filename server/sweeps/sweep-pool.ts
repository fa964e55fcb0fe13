/**
 * The sweep worker pool: one piscina pool that runs sweeps (every cell size x every placement, on the observed
 * pattern and on R simulated CSR patterns) and summarises them. Points and simulated patterns live in shared
 * memory; tasks are small chunks of placements of one cell size; results come back moved, not cloned.
 */
import { setMaxListeners } from 'node:events';
import { availableParallelism } from 'node:os';
import { join } from 'node:path';
import type { ResourceLimits } from 'node:worker_threads';
import { Piscina } from 'piscina';
import type { Dataset, PlacementRow, Plan, SweepProgress, SweepSummary } from '../contracts.js';
import { summarizeDataset } from '../inputs/summarize-dataset.js';
import { PACKAGE_ROOT, PACKAGE_VERSION } from '../services/project-paths.js';
import { buildSweepSummary } from '../summary/sweep-summary.js';
import type { ChunkTask, SimulateTask } from '../../workers/sweep/sweep-task.js';
import { normalizePlan, resolveCellSizes } from './plan.js';
import { planPlacements } from './placement-design.js';
import { shareDataset, type SharedDataset } from './shared-dataset.js';
import { SizeResults } from './size-results.js';
import { assertWithinBudget, chunkPlacements, estimateSweep, workBudgetFromEnv } from './sweep-budget.js';
import { fromWorkerError, isAbortError, sweepCancelledError } from './sweep-errors.js';

/**
 * The compiled task entry piscina loads (npm run build): a CommonJS file that imports the ES task module, so that
 * piscina never require()s an ES module (see workers/pool-entry.cts). The same file whether the caller runs from
 * TypeScript or from dist/.
 */
export const POOL_TASK_FILE = join(PACKAGE_ROOT, 'dist', 'workers', 'pool-entry.cjs');

/** Simulated points drawn per simulation task. */
const SIMULATED_POINTS_PER_TASK = 2e5;

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

export interface SweepRunOptions {
  signal?: AbortSignal;
  onProgress?: (progress: SweepProgress) => void;
}

export interface SweepResult {
  rows: PlacementRow[];
  summary: SweepSummary;
}

export class SweepPool {
  readonly threads: number;
  readonly budget: number;
  private readonly pool: Piscina;
  private readonly shared = new WeakMap<Dataset, SharedDataset>();
  private runs = 0;

  constructor(options: SweepPoolOptions = {}) {
    this.threads = Math.max(1, Math.floor(options.threads ?? availableParallelism()));
    this.budget = options.budget ?? workBudgetFromEnv();
    this.pool = new Piscina({
      filename: options.filename ?? POOL_TASK_FILE,
      minThreads: this.threads,
      maxThreads: this.threads,
      idleTimeout: 60_000,
      resourceLimits: options.resourceLimits,
    });
  }

  /**
   * Runs a sweep: validates the plan and its budget, shares the points once per dataset, draws the simulated
   * patterns, evaluates every chunk and summarises. Rejects with the worker's error message when a task fails
   * (the pool stays usable), or with an AbortError when the signal fires.
   */
  async runSweep(dataset: Dataset, planInput: Plan, options: SweepRunOptions = {}): Promise<SweepResult> {
    const startedAt = new Date();
    const plan = normalizePlan(planInput);
    const cellSizes = resolveCellSizes(plan, dataset.region.area, dataset.inside.length);
    const estimate = estimateSweep(plan, dataset.inside.length, this.budget);
    assertWithinBudget(estimate);
    if (options.signal?.aborted) throw sweepCancelledError();
    const shared = this.share(dataset);
    const placements = planPlacements(plan);
    const controller = new AbortController();
    // every queued task listens to the signal
    setMaxListeners(estimate.tasks + plan.sims + 16, controller.signal);
    const onAbort = (): void => controller.abort();
    options.signal?.addEventListener('abort', onAbort, { once: true });
    let failure: unknown = null;
    const guard = <T>(promise: Promise<T>): Promise<T | undefined> =>
      promise.catch((error: unknown) => {
        if (failure === null && !isAbortError(error)) failure = error;
        controller.abort();
        return undefined;
      });
    try {
      const simulated = plan.sims > 0 ? await this.simulate(shared, plan, controller.signal, guard) : null;
      const sizes = cellSizes.map((cellSize, index) => new SizeResults(index, cellSize, placements, plan.sims));
      if (!controller.signal.aborted) {
        await this.evaluate(shared, plan, sizes, placements, simulated, controller.signal, guard, options.onProgress, startedAt);
      }
      if (options.signal?.aborted) throw sweepCancelledError();
      if (failure !== null) throw fromWorkerError(failure);
      const summary = buildSweepSummary({
        plan,
        dataset: summarizeDataset(dataset),
        sizes: sizes.map((size) => size.summarize()),
        versions: { gridshake: PACKAGE_VERSION, node: process.version, piscina: Piscina.version, threads: String(this.threads) },
        startedAt,
        finishedAt: new Date(),
      });
      return { rows: sizes.flatMap((size) => size.rows), summary };
    } finally {
      options.signal?.removeEventListener('abort', onAbort);
    }
  }

  async destroy(): Promise<void> {
    await this.pool.destroy();
  }

  private share(dataset: Dataset): SharedDataset {
    let shared = this.shared.get(dataset);
    if (shared === undefined) {
      shared = shareDataset(dataset);
      this.shared.set(dataset, shared);
    }
    return shared;
  }

  private async simulate(
    shared: SharedDataset,
    plan: Plan,
    signal: AbortSignal,
    guard: <T>(promise: Promise<T>) => Promise<T | undefined>,
  ): Promise<{ key: string; buffer: SharedArrayBuffer }> {
    const buffer = new SharedArrayBuffer(plan.sims * shared.pointCount * 16);
    const perTask = Math.max(1, Math.floor(SIMULATED_POINTS_PER_TASK / Math.max(1, shared.pointCount)));
    const jobs: Promise<unknown>[] = [];
    for (let first = 0; first < plan.sims; first += perTask) {
      const task: SimulateTask = {
        kind: 'simulate',
        regionKey: shared.key,
        region: shared.region,
        pointCount: shared.pointCount,
        seed: plan.seed,
        first,
        count: Math.min(perTask, plan.sims - first),
        simulated: buffer,
      };
      jobs.push(guard(this.pool.run(task, { signal })));
    }
    await Promise.all(jobs);
    this.runs += 1;
    return { key: `${shared.key}-simulation-${this.runs}`, buffer };
  }

  private async evaluate(
    shared: SharedDataset,
    plan: Plan,
    sizes: SizeResults[],
    placements: Float64Array,
    simulated: { key: string; buffer: SharedArrayBuffer } | null,
    signal: AbortSignal,
    guard: <T>(promise: Promise<T>) => Promise<T | undefined>,
    onProgress: SweepRunOptions['onProgress'],
    startedAt: Date,
  ): Promise<void> {
    const placementCount = placements.length / 3;
    const perChunk = chunkPlacements(shared.pointCount, plan.sims);
    const total = sizes.length * placementCount;
    let done = 0;
    const jobs: Promise<unknown>[] = [];
    for (const size of sizes) {
      for (let first = 0; first < placementCount; first += perChunk) {
        const count = Math.min(perChunk, placementCount - first);
        const task: ChunkTask = {
          kind: 'chunk',
          datasetKey: shared.key,
          points: shared.points,
          region: shared.region,
          origin: shared.origin,
          simulationKey: simulated?.key ?? null,
          simulated: simulated?.buffer ?? null,
          sims: plan.sims,
          cellSize: size.cellSize,
          minCoverage: plan.minCoverage,
          alpha: plan.alpha,
          placements: placements.slice(3 * first, 3 * (first + count)),
        };
        const job = (this.pool.run(task, { signal }) as Promise<Float64Array>).then((result) => {
          size.addChunk(first, count, result);
          done += count;
          if (onProgress) {
            const elapsedSeconds = (Date.now() - startedAt.getTime()) / 1000;
            const remainingSeconds = done > 0 ? (elapsedSeconds * (total - done)) / done : null;
            onProgress({ done, total, elapsedSeconds, remainingSeconds });
          }
        });
        jobs.push(guard(job));
      }
    }
    await Promise.all(jobs);
  }
}
