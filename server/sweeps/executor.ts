/**
 * The task executor seam: what the sweep runner (sweep-runner.ts) needs from whatever runs its tasks. A task holds
 * parameters only (which dataset, which simulation, which placements of which cell size); the executor attaches
 * the data the way it moves it (shared memory for the local pool, Redis keys for the queue).
 * Executors: local-executor.ts (piscina, the default) and ../queue/queue-executor.ts (BullMQ on Redis).
 */
import type { Dataset } from '../../shared/contracts.js';
import type { CellShape } from '../../workers/lattice/cell-shape.js';
import type { StabilityRaster } from '../../workers/stability/stability-raster.js';

/** A dataset the executor has shared with its workers, under a key made of the dataset id and its content hash. */
export interface DatasetRef {
  key: string;
  /** sha256 (hex) of the dataset's counted content: inside points, region, origin (dataset-key.ts) */
  hash: string;
  /** points inside the valid region */
  pointCount: number;
}

/** The simulated CSR patterns of one sweep: pattern r drawn with deriveSeed(seed, r), r < sims. */
export interface SimulationRef {
  /** unique per sweep run */
  key: string;
  seed: number;
  sims: number;
}

/** Draws simulated patterns first .. first + count - 1 (only for executors whose simulatesInWorkers is false). */
export interface SimulateWork {
  kind: 'simulate';
  dataset: DatasetRef;
  simulation: SimulationRef;
  first: number;
  count: number;
}

/** Evaluates placements (u, v, angle triples) of one cell size on the observed and every simulated pattern. */
export interface ChunkWork {
  kind: 'chunk';
  dataset: DatasetRef;
  simulation: SimulationRef | null;
  cellSize: number;
  /** the cells' shape (absent: square) */
  shape?: CellShape;
  minCoverage: number;
  alpha: number;
  placements: Float64Array;
  /** the stability surface's raster (absent: no surface) */
  stability?: StabilityRaster;
}

export type SweepWork = SimulateWork | ChunkWork;

export interface SweepExecutor {
  /** the executor's name, recorded in summary.json's versions */
  readonly name: string;
  /** worker threads (local) or a nominal parallelism (queue), for /api/health and the versions */
  readonly threads: number;
  /** tasks the runner keeps in flight at most */
  readonly maxInFlight: number;
  /** true when workers draw the simulated patterns they need themselves, so the runner sends no simulate tasks */
  readonly simulatesInWorkers: boolean;
  /** software versions recorded in summary.json (besides gridshake and node) */
  readonly versions: Record<string, string>;
  /** Makes the dataset available to the workers, once per ref.key (later calls return at once). */
  share(dataset: Dataset, ref: DatasetRef, signal: AbortSignal): Promise<void>;
  /** Runs one task: a chunk yields its result array (sweep-task.ts layout), a simulate task its pattern count. */
  run(work: ChunkWork, signal: AbortSignal): Promise<Float64Array>;
  run(work: SimulateWork, signal: AbortSignal): Promise<number>;
  /** Lets go of what a finished sweep's simulation holds. */
  release(simulation: SimulationRef): void;
  destroy(): Promise<void>;
}
