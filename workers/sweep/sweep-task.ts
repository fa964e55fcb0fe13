/**
 * The messages between server/sweeps and the piscina task file (workers/pool-task.ts). Tasks carry references to
 * shared memory (points, region, simulated patterns) plus placement parameters; results come back as one
 * Float64Array per chunk, moved rather than cloned.
 */
import type { CellShape } from '../lattice/cell-shape.js';
import type { StabilityRaster } from '../stability/stability-raster.js';
import type { Origin } from '../types.js';
import type { WasmMemory } from '../wasm/wasm-memory.js';
import { STATISTICS_FIELDS } from './statistics-codec.js';

/** Fills simulated CSR patterns first .. first + count - 1 of a shared buffer (pattern r seeded by deriveSeed(seed, r)). */
export interface SimulateTask {
  kind: 'simulate';
  regionKey: string;
  region: SharedArrayBuffer;
  /** points per pattern (the observed number inside the valid region) */
  pointCount: number;
  seed: number;
  first: number;
  count: number;
  /** sims x pointCount x 2 float64 values, pattern r at r * pointCount * 2 */
  simulated: SharedArrayBuffer;
  /**
   * the baseline (workers/baseline/baseline-buffer.ts) whose null the patterns follow instead of CSR, with the key
   * workers cache its sampler under and the observed inside points (random labelling pools them with the controls;
   * pointCount of them from byte 0, the buffer may be longer)
   */
  baseline?: { key: string; buffer: SharedArrayBuffer; points: SharedArrayBuffer };
}

/** Evaluates a chunk of placements of one cell size on the observed pattern and on every simulated pattern. */
export interface ChunkTask {
  kind: 'chunk';
  /** identifies the observed points and the region: workers cache what they build from them under this key */
  datasetKey: string;
  /** the observed points inside the region, x y float64 each, from byte 0 (the buffer may be longer) */
  points: SharedArrayBuffer;
  pointCount: number;
  /** the shared WebAssembly memory whose buffer `points` is (workers/wasm/wasm-memory.ts), or null */
  pointsMemory: WasmMemory | null;
  region: SharedArrayBuffer;
  origin: Origin;
  /** identifies the simulated patterns (null without sims) */
  simulationKey: string | null;
  simulated: SharedArrayBuffer | null;
  /** the shared WebAssembly memory whose buffer `simulated` is (workers/wasm/wasm-memory.ts), or null */
  simulatedMemory: WasmMemory | null;
  sims: number;
  cellSize: number;
  /** the cells' shape (workers/lattice); absent means square */
  shape?: CellShape;
  minCoverage: number;
  alpha: number;
  /** u, v, angle of each placement of the chunk */
  placements: Float64Array;
  /** expected counts proportional to this baseline (workers/baseline/baseline-buffer.ts) instead of area */
  baseline?: { key: string; buffer: SharedArrayBuffer };
  /** the stability surface's raster (workers/stability); absent: no surface is computed */
  stability?: StabilityRaster;
}

export type SweepTask = SimulateTask | ChunkTask;

/**
 * Layout of a chunk result for P placements and R sims: P blocks of STATISTICS_FIELDS (observed pattern), then
 * chi2/df on pattern r at placement j at P * F + j * R + r, then the significance flags (0/1) at
 * P * F + P * R + j * R + r. With a stability raster, the stability part follows
 * (workers/stability/stability-chunk.ts), from offset chunkResultLength(P, R).
 */
export function chunkResultLength(placements: number, sims: number): number {
  return placements * (STATISTICS_FIELDS + 2 * sims);
}

export function simulatedValueOffset(placements: number, sims: number, placement: number, pattern: number): number {
  return placements * STATISTICS_FIELDS + placement * sims + pattern;
}

export function simulatedFlagOffset(placements: number, sims: number, placement: number, pattern: number): number {
  return placements * STATISTICS_FIELDS + placements * sims + placement * sims + pattern;
}
