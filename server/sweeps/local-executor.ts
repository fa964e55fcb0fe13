/**
 * The local executor: one piscina pool of worker threads on this machine (the default). The dataset's points and
 * region go to shared memory once per dataset key (shared-dataset.ts); each sweep's simulated CSR patterns go to
 * one shared buffer that simulate tasks fill and chunk tasks read; results come back moved, not cloned.
 */
import { availableParallelism } from 'node:os';
import { join } from 'node:path';
import type { ResourceLimits } from 'node:worker_threads';
import { Piscina } from 'piscina';
import type { Dataset } from '../../shared/contracts.js';
import { PACKAGE_ROOT } from '../services/project-paths.js';
import type { ChunkTask, SimulateTask, SweepTask } from '../../workers/sweep/sweep-task.js';
import type { ChunkWork, DatasetRef, SimulateWork, SimulationRef, SweepExecutor, SweepWork } from './executor.js';
import { shareDataset, type SharedDataset } from './shared-dataset.js';
import { createPointBuffer, type WasmMemory } from '../../workers/wasm/wasm-memory.js';

/**
 * The compiled task entry piscina loads (npm run build): a CommonJS file that lowers the thread's priority below the
 * request thread's and hands tasks to the engine's entry, which imports the ES task module, so that piscina never
 * require()s an ES module (see server/threads/sweep-thread-entry.cts, workers/pool-entry.cts). The same file whether
 * the caller runs from TypeScript or from dist/.
 */
export const POOL_TASK_FILE = join(PACKAGE_ROOT, 'dist', 'server', 'threads', 'sweep-thread-entry.cjs');

/** Datasets kept in shared memory at once (the oldest goes first); a server's sweeps mostly reuse one or two. */
const SHARED_DATASETS = 4;

export interface LocalExecutorOptions {
  /** worker threads; default os.availableParallelism() */
  threads?: number;
  /** task file; default POOL_TASK_FILE */
  filename?: string;
  /** heap limits of each worker thread: a worker over them ends with ERR_WORKER_OUT_OF_MEMORY, failing its sweep only */
  resourceLimits?: ResourceLimits;
}

export class LocalExecutor implements SweepExecutor {
  readonly name = 'local pool';
  readonly threads: number;
  /** piscina's own advice: about threads^2 tasks queued keeps every thread busy without a long queue */
  readonly maxInFlight: number;
  readonly simulatesInWorkers = false;
  readonly versions: Record<string, string>;
  private readonly pool: Piscina;
  private readonly shared = new Map<string, SharedDataset>();
  private readonly simulations = new Map<string, { buffer: SharedArrayBuffer; memory: WasmMemory | null }>();
  private shares = 0;

  constructor(options: LocalExecutorOptions = {}) {
    this.threads = Math.max(1, Math.floor(options.threads ?? availableParallelism()));
    this.maxInFlight = Math.max(4, this.threads * this.threads);
    this.versions = { piscina: Piscina.version, threads: String(this.threads) };
    this.pool = new Piscina({
      filename: options.filename ?? POOL_TASK_FILE,
      minThreads: this.threads,
      maxThreads: this.threads,
      idleTimeout: 60_000,
      resourceLimits: options.resourceLimits,
    });
  }

  /** Sorts and shares the dataset once per key; later sweeps of the same dataset (same id and content) reuse it. */
  async share(dataset: Dataset, ref: DatasetRef): Promise<void> {
    this.sharedFor(ref, dataset);
  }

  run(work: ChunkWork, signal: AbortSignal): Promise<Float64Array>;
  run(work: SimulateWork, signal: AbortSignal): Promise<number>;
  run(work: SweepWork, signal: AbortSignal): Promise<Float64Array | number> {
    const shared = this.sharedFor(work.dataset);
    let task: SweepTask;
    if (work.kind === 'simulate') {
      task = {
        kind: 'simulate',
        regionKey: shared.key,
        region: shared.region,
        pointCount: shared.pointCount,
        seed: work.simulation.seed,
        first: work.first,
        count: work.count,
        simulated: this.simulationBuffer(work.simulation, shared.pointCount).buffer,
        ...(shared.baseline === null ? {} : { baseline: { key: shared.key, buffer: shared.baseline, points: shared.points } }),
      } satisfies SimulateTask;
    } else {
      const simulated = work.simulation === null ? undefined : this.simulationBuffer(work.simulation, shared.pointCount);
      task = {
        kind: 'chunk',
        datasetKey: shared.key,
        points: shared.points,
        pointCount: shared.pointCount,
        pointsMemory: shared.memory,
        region: shared.region,
        origin: shared.origin,
        simulationKey: work.simulation?.key ?? null,
        simulated: simulated?.buffer ?? null,
        simulatedMemory: simulated?.memory ?? null,
        sims: work.simulation?.sims ?? 0,
        cellSize: work.cellSize,
        shape: work.shape,
        minCoverage: work.minCoverage,
        alpha: work.alpha,
        placements: work.placements,
        ...(shared.baseline === null ? {} : { baseline: { key: shared.key, buffer: shared.baseline } }),
        ...(work.stability === undefined ? {} : { stability: work.stability }),
      } satisfies ChunkTask;
    }
    return this.pool.run(task, { signal }) as Promise<Float64Array | number>;
  }

  /** How many times a dataset was sorted and put in shared memory (once per dataset key while it stays cached). */
  get sharedCopies(): number {
    return this.shares;
  }

  release(simulation: SimulationRef): void {
    this.simulations.delete(simulation.key);
  }

  async destroy(): Promise<void> {
    await this.pool.destroy();
  }

  private sharedFor(ref: DatasetRef, dataset?: Dataset): SharedDataset {
    let shared = this.shared.get(ref.key);
    if (shared === undefined) {
      if (dataset === undefined) throw new Error(`dataset ${ref.key} was not shared before its tasks ran`);
      shared = shareDataset(dataset, ref.key);
      this.shares += 1;
      this.shared.set(ref.key, shared);
      while (this.shared.size > SHARED_DATASETS) this.shared.delete(this.shared.keys().next().value as string);
    } else {
      // most recently used last
      this.shared.delete(ref.key);
      this.shared.set(ref.key, shared);
    }
    return shared;
  }

  /** The patterns' shared buffer, in a WebAssembly memory when the runtime can make one (the SIMD counting kernel). */
  private simulationBuffer(simulation: SimulationRef, pointCount: number): { buffer: SharedArrayBuffer; memory: WasmMemory | null } {
    let patterns = this.simulations.get(simulation.key);
    if (patterns === undefined) {
      patterns = createPointBuffer(simulation.sims * pointCount * 16);
      this.simulations.set(simulation.key, patterns);
    }
    return patterns;
  }
}
