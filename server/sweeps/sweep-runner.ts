/**
 * The sweep runner: turns a plan into tasks (simulated CSR patterns, then chunks of placements per cell size),
 * hands them to an executor (executor.ts) with a bounded number in flight, folds the results into per-size
 * results in any order of arrival, and summarises. What runs the tasks (local threads or a Redis queue) does
 * not change a single number of the result.
 */
import { setMaxListeners } from 'node:events';
import type { Dataset, PlacementRow, Plan, StabilitySizeSummary, SweepProgress, SweepSummary } from '../../shared/contracts.js';
import { summarizeDataset } from '../inputs/summarize-dataset.js';
import { insideCount } from '../inputs/inside-points.js';
import { PACKAGE_VERSION } from '../services/project-paths.js';
import { buildSweepSummary } from '../summary/sweep-summary.js';
import { datasetRef } from './dataset-key.js';
import type { ChunkWork, DatasetRef, SimulateWork, SimulationRef, SweepExecutor } from './executor.js';
import { planPlacements } from './placement-design.js';
import { planShapes, resolveCellSizes, validatedPlan } from './plan.js';
import { latticeOf } from '../../workers/lattice/registry.js';
import { runBounded } from './bounded-tasks.js';
import { SizeResults } from './size-results.js';
import type { StabilitySurface } from '../stability/stability-accumulator.js';
import { stabilitySummary } from '../stability/stability-summary.js';
import { assertWithinBudget, chunkPlacements, estimateSweep, workBudgetFromEnv } from './sweep-budget.js';
import { baselineSize } from '../../workers/baseline/baseline.js';
import { fromWorkerError, isAbortError, sweepCancelledError } from './sweep-errors.js';

/** Simulated points drawn per simulation task. */
const SIMULATED_POINTS_PER_TASK = 2e5;

export interface SweepRunOptions {
  signal?: AbortSignal;
  onProgress?: (progress: SweepProgress) => void;
  /** the stored dataset's id: with the content hash, the key its shared copy is kept under */
  datasetId?: string;
  /** also compute the stability surface of every (shape, cell size) (server/stability) */
  stability?: boolean;
}

export interface SweepResult {
  rows: PlacementRow[];
  summary: SweepSummary;
  /** one per (shape, cell size) when options.stability, in the order of summary.sizes; empty otherwise */
  stability: StabilitySurface[];
}

export class ExecutorSweepRunner {
  readonly budget: number;
  private runs = 0;

  constructor(
    readonly executor: SweepExecutor,
    budget?: number,
  ) {
    this.budget = budget ?? workBudgetFromEnv();
  }

  get threads(): number {
    return this.executor.threads;
  }

  /**
   * Runs a sweep: validates the plan (unless normalizePlan already did) and its budget, shares the points once per
   * dataset, draws the simulated patterns, evaluates every chunk and summarises. Rejects with the worker's error
   * message when a task fails (the executor stays usable), or with an AbortError when the signal fires.
   */
  async runSweep(dataset: Dataset, planInput: Plan, options: SweepRunOptions = {}): Promise<SweepResult> {
    const startedAt = new Date();
    const plan = validatedPlan(planInput);
    const cellSizes = resolveCellSizes(plan, dataset.region.area, insideCount(dataset));
    // the baseline's own work from its engine data (pieces, vertices or controls), whatever its record says
    const baselineCost = dataset.baseline === undefined ? undefined : baselineSize(dataset.baseline.engine);
    const surface = options.stability === true ? { bbox: dataset.region.bbox, cellSizes } : undefined;
    assertWithinBudget(estimateSweep(plan, insideCount(dataset), this.budget, { baseline: baselineCost, surface }));
    if (options.signal?.aborted) throw sweepCancelledError();
    const controller = new AbortController();
    // every task in flight listens to the signal
    setMaxListeners(this.executor.maxInFlight + 64, controller.signal);
    const onAbort = (): void => controller.abort();
    options.signal?.addEventListener('abort', onAbort, { once: true });
    let failure: unknown = null;
    const guard = async (promise: Promise<unknown>): Promise<void> => {
      try {
        await promise;
      } catch (error) {
        if (failure === null && !isAbortError(error)) failure = error;
        controller.abort();
      }
    };
    this.runs += 1;
    const ref = datasetRef(dataset, options.datasetId);
    const simulation: SimulationRef | null =
      plan.sims > 0 ? { key: `${ref.key}:seed ${plan.seed}:sims ${plan.sims}:run ${process.pid}-${this.runs}`, seed: plan.seed, sims: plan.sims } : null;
    try {
      await guard(this.executor.share(dataset, ref, controller.signal));
      // one entry per (shape, cell size): every size of the first shape, then the next; each shape's placements
      // are the plan's design over its lattice's angle period, and every shape sees the same simulated patterns
      const sizes = planShapes(plan).flatMap((shape, shapeIndex) => {
        const placements = planPlacements(plan, latticeOf(shape).anglePeriod);
        return cellSizes.map((cellSize, index) => new SizeResults(shapeIndex * cellSizes.length + index, cellSize, placements, plan.sims, shape));
      });
      const enableStability = (): void => {
        if (options.stability === true) for (const size of sizes) size.enableStability(dataset.region);
      };
      if (simulation !== null && !this.executor.simulatesInWorkers && !controller.signal.aborted) {
        const simulating = runBounded(simulateTasks(ref, simulation), this.executor.maxInFlight, (work) => guard(this.executor.run(work, controller.signal)), () => controller.signal.aborted);
        // the valid pixels of every raster are found while the workers draw the patterns
        try {
          enableStability();
        } catch (error) {
          controller.abort();
          await simulating;
          throw error;
        }
        await simulating;
      } else enableStability();
      const bothShapes = new Set(sizes.map((size) => size.shape)).size > 1;
      // each size's surface, calibration and areas are made as soon as its last chunk is in, while the workers go on
      const stabilitySummaries = new Map<SizeResults, StabilitySizeSummary>();
      const summarizeStability = (size: SizeResults): StabilitySizeSummary => {
        let summary = stabilitySummaries.get(size);
        if (summary === undefined) {
          summary = stabilitySummary(size.stabilitySurface(plan.alpha) as StabilitySurface, size.sizeIndex, bothShapes);
          stabilitySummaries.set(size, summary);
        }
        return summary;
      };
      if (!controller.signal.aborted) {
        const total = sizes.length * plan.placements;
        let done = 0;
        const work = chunkTasks(ref, simulation, plan, sizes);
        await runBounded(
          work,
          this.executor.maxInFlight,
          ({ size, first, count, task }) =>
            guard(
              this.executor.run(task, controller.signal).then((result) => {
                size.addChunk(first, count, result);
                if (options.stability === true && size.complete) summarizeStability(size);
                done += count;
                if (options.onProgress) {
                  const elapsedSeconds = (Date.now() - startedAt.getTime()) / 1000;
                  const remainingSeconds = done > 0 ? (elapsedSeconds * (total - done)) / done : null;
                  options.onProgress({ done, total, elapsedSeconds, remainingSeconds });
                }
              }),
            ),
          () => controller.signal.aborted,
        );
      }
      if (options.signal?.aborted) throw sweepCancelledError();
      if (failure !== null) throw fromWorkerError(failure);
      // stopped otherwise, some sizes are incomplete: no summary of them
      if (controller.signal.aborted) throw sweepCancelledError();
      const summary = buildSweepSummary({
        plan,
        dataset: summarizeDataset(dataset),
        sizes: sizes.map((size) => size.summarize()),
        versions: { gridshake: PACKAGE_VERSION, node: process.version, executor: this.executor.name, ...this.executor.versions },
        startedAt,
        finishedAt: new Date(),
      });
      const stability = options.stability === true ? sizes.map((size) => size.stabilitySurface(plan.alpha) as StabilitySurface) : [];
      if (stability.length > 0) summary.stability = sizes.map(summarizeStability);
      return { rows: sizes.flatMap((size) => size.rows), summary, stability };
    } finally {
      options.signal?.removeEventListener('abort', onAbort);
      if (simulation !== null) this.executor.release(simulation);
    }
  }

  async destroy(): Promise<void> {
    await this.executor.destroy();
  }
}

/** Simulation tasks of about SIMULATED_POINTS_PER_TASK points each (also what a queue worker draws for itself). */
export function* simulateTasks(dataset: DatasetRef, simulation: SimulationRef): Generator<SimulateWork> {
  const perTask = Math.max(1, Math.floor(SIMULATED_POINTS_PER_TASK / Math.max(1, dataset.pointCount)));
  for (let first = 0; first < simulation.sims; first += perTask) {
    yield { kind: 'simulate', dataset, simulation, first, count: Math.min(perTask, simulation.sims - first) };
  }
}

interface ChunkItem {
  size: SizeResults;
  first: number;
  count: number;
  task: ChunkWork;
}

/** Chunks of chunkPlacements(n, R) placements, (shape, cell size) by (shape, cell size), made only as the runner takes them. */
function* chunkTasks(dataset: DatasetRef, simulation: SimulationRef | null, plan: Plan, sizes: SizeResults[]): Generator<ChunkItem> {
  const perChunk = chunkPlacements(dataset.pointCount, plan.sims);
  for (const size of sizes) {
    const placements = size.placements;
    const placementCount = placements.length / 3;
    for (let first = 0; first < placementCount; first += perChunk) {
      const count = Math.min(perChunk, placementCount - first);
      const task: ChunkWork = {
        kind: 'chunk',
        dataset,
        simulation,
        cellSize: size.cellSize,
        // squares name no shape, so that their tasks stay exactly as before shapes existed
        ...(size.shape === 'square' ? {} : { shape: size.shape }),
        minCoverage: plan.minCoverage,
        alpha: plan.alpha,
        placements: placements.slice(3 * first, 3 * (first + count)),
        ...(size.stabilityRaster === undefined ? {} : { stability: size.stabilityRaster }),
      };
      yield { size, first, count, task };
    }
  }
}
