/**
 * The piscina task entry: one function of one task object. It only builds (and caches per dataset) the engine's
 * counters from shared memory and calls the pure chunk and simulation kernels of workers/sweep.
 */
import { setFlagsFromString } from 'node:v8';
import { runInNewContext } from 'node:vm';
import { move } from 'piscina';
import { createCellCounter } from './placement/index.js';
import { createCsrSampler, type CsrSampler } from './random/index.js';
import type { Region } from './types.js';
import { evaluateChunk, type PatternCounter } from './sweep/evaluate-chunk.js';
import { unpackRegion } from './sweep/region-buffer.js';
import { simulatePatterns } from './sweep/simulate-patterns.js';
import type { ChunkTask, SimulateTask, SweepTask } from './sweep/sweep-task.js';
import { TaskCache } from './sweep/task-cache.js';
import { unpackBaseline } from './baseline/baseline-buffer.js';
import { createBaselineWeigher, type BaselineWeigher } from './baseline/baseline-weights.js';
import { createLabellingSampler, createPolygonSampler, type PatternSampler } from './baseline/baseline-sampler.js';
import { validPixels, type StabilityRaster } from './stability/stability-raster.js';
import { pixelRuns } from './stability/pixel-runs.js';
import { pixelsNearBoundary, squareCellReach } from './stability/boundary-pixels.js';
import type { SquareCellPixels } from './stability/stability-chunk.js';

interface DatasetEntry {
  region: Region;
  observed: PatternCounter;
}

const datasets = new TaskCache<DatasetEntry>();
const samplers = new TaskCache<CsrSampler | PatternSampler>();
const weighers = new TaskCache<BaselineWeigher>();
// one simulation at a time: its patterns can be large, and a sweep's patterns are not reused by the next
const simulations = new TaskCache<PatternCounter[]>(1);
// the valid pixels of a stability raster, per dataset and raster, and for squares without a baseline their runs and
// those near the boundary, per cell size too (12 bytes per run of a raster row, 4 per pixel near the boundary: a few
// MB for the largest rasters)
const rasterPixels = new TaskCache<Uint32Array>(4);
const squarePixels = new TaskCache<SquareCellPixels>(4);

function stabilityOf(task: ChunkTask, region: Region): { raster: StabilityRaster; pixels: Uint32Array; squareCells?: SquareCellPixels } | undefined {
  const raster = task.stability;
  if (raster === undefined) return undefined;
  const key = `${task.datasetKey}:${raster.x0},${raster.y0},${raster.side},${raster.width},${raster.height}`;
  const pixels = rasterPixels.get(key, () => validPixels(region, raster));
  // a baseline's kept cells are not all the whole cells (stability-chunk.ts beginPlacement): no shortcut
  if ((task.shape ?? 'square') !== 'square' || task.baseline !== undefined) return { raster, pixels };
  const squareCells = squarePixels.get(`${key}:${task.cellSize}`, () => ({
    runs: pixelRuns(pixels, raster.width, raster.height),
    nearBoundary: pixelsNearBoundary(region, raster, pixels, squareCellReach(task.cellSize)),
  }));
  return { raster, pixels, squareCells };
}

function runChunk(task: ChunkTask): Float64Array {
  const dataset = datasets.get(task.datasetKey, () => ({
    region: unpackRegion(task.region),
    observed: createCellCounter(new Float64Array(task.points, 0, 2 * task.pointCount), task.origin, task.pointsMemory),
  }));
  let simulated: PatternCounter[] = [];
  if (task.simulated !== null && task.simulationKey !== null && task.sims > 0) {
    const buffer = task.simulated;
    const memory = task.simulatedMemory;
    const length = 2 * task.pointCount;
    simulated = simulations.get(task.simulationKey, () =>
      Array.from({ length: task.sims }, (_, r) => createCellCounter(new Float64Array(buffer, r * length * 8, length), task.origin, memory)),
    );
  }
  const baseline = task.baseline;
  const weigher =
    baseline === undefined ? undefined : weighers.get(baseline.key, () => createBaselineWeigher(unpackBaseline(baseline.buffer), task.origin));
  return evaluateChunk(
    { region: dataset.region, origin: task.origin, observed: dataset.observed, simulated, cellSize: task.cellSize, shape: task.shape, minCoverage: task.minCoverage, alpha: task.alpha, baseline: weigher, stability: stabilityOf(task, dataset.region) },
    task.placements,
  );
}

function runSimulate(task: SimulateTask): number {
  const baseline = task.baseline;
  const sampler =
    baseline === undefined
      ? samplers.get(task.regionKey, () => createCsrSampler(unpackRegion(task.region)))
      : samplers.get(`${baseline.key}:null`, () => {
          const unpacked = unpackBaseline(baseline.buffer);
          return unpacked.kind === 'polygons'
            ? createPolygonSampler(unpacked)
            : createLabellingSampler(new Float64Array(baseline.points, 0, 2 * task.pointCount), unpacked.controls);
        });
  simulatePatterns(sampler, task.pointCount, task.seed, task.first, task.count, new Float64Array(task.simulated));
  return task.count;
}

/** Points from which a chunk's garbage (coverage grids of millions of cells) is collected at once. */
const COLLECT_FROM_POINTS = 2e6;

/**
 * A full garbage collection after a chunk over a very large dataset: its per-placement grids are external memory
 * that V8 would otherwise keep a while, in every worker at once (server/sweeps/collect-garbage.ts does the same on
 * the main thread).
 */
function collectGarbage(): void {
  setFlagsFromString('--expose-gc');
  (runInNewContext('gc') as () => void)();
}

export default function poolTask(task: SweepTask): unknown {
  if (task.kind === 'simulate') return runSimulate(task);
  const result = runChunk(task);
  if (task.pointCount >= COLLECT_FROM_POINTS) collectGarbage();
  return move(result);
}
