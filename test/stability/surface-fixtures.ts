/**
 * Runs the stability surface in-process, exactly as a sweep's chunk tasks and its size results do
 * (workers/sweep evaluateChunk with a stability raster, then server/stability StabilityAccumulator), on patterns the
 * test gives: the observed points and the simulated null patterns, so that a transformed copy of a data set can be
 * given the transformed copies of the same simulated patterns. Invented data only.
 */
import type { CellShape } from '../../workers/lattice/cell-shape.js';
import type { BaselineWeigher } from '../../workers/baseline/baseline-weights.js';
import { createCellCounter } from '../../workers/placement/index.js';
import { createCsrSampler, createRandom, deriveSeed } from '../../workers/random/index.js';
import { stabilityRaster, validPixels } from '../../workers/stability/stability-raster.js';
import { evaluateChunk } from '../../workers/sweep/evaluate-chunk.js';
import { chunkResultLength } from '../../workers/sweep/sweep-task.js';
import type { Origin, Region } from '../../workers/types.js';
import { StabilityAccumulator, type StabilitySurface } from '../../server/stability/stability-accumulator.js';

export interface SurfaceInput {
  region: Region;
  observed: Float64Array;
  simulated: Float64Array[];
  cellSize: number;
  /** u, v, angle triples */
  placements: Float64Array;
  shape?: CellShape;
  minCoverage?: number;
  alpha?: number;
  /** placements per chunk (the result must not depend on it) */
  chunk?: number;
  /** expected counts from a baseline (workers/baseline) instead of area; the simulated patterns must follow its null */
  baseline?: BaselineWeigher;
}

/** The grid origin of shared/design.md: the region's bounding box's lower-left corner. */
export function originOf(region: Region): Origin {
  return { x: region.bbox.minX, y: region.bbox.minY };
}

export function runSurface(input: SurfaceInput): StabilitySurface {
  const { region, cellSize } = input;
  const origin = originOf(region);
  const alpha = input.alpha ?? 0.05;
  const raster = stabilityRaster(region, cellSize);
  const pixels = validPixels(region, raster);
  const sims = input.simulated.length;
  const accumulator = new StabilityAccumulator(raster, pixels, sims);
  const context = {
    region,
    origin,
    observed: createCellCounter(input.observed, origin),
    simulated: input.simulated.map((xy) => createCellCounter(xy, origin)),
    cellSize,
    shape: input.shape,
    minCoverage: input.minCoverage ?? 0.5,
    alpha,
    stability: { raster, pixels },
    ...(input.baseline === undefined ? {} : { baseline: input.baseline }),
  };
  const count = input.placements.length / 3;
  const perChunk = input.chunk ?? count;
  for (let first = 0; first < count; first += perChunk) {
    const n = Math.min(perChunk, count - first);
    const result = evaluateChunk(context, input.placements.slice(3 * first, 3 * (first + n)));
    accumulator.addChunk(result, chunkResultLength(n, sims));
  }
  return accumulator.finish(input.shape ?? 'square', cellSize, count, alpha);
}

/** A rectangle region [x0, x1] x [y0, y1] with optional rectangular holes (clockwise), design.md orientation. */
export function rectangleRegion(x0: number, y0: number, x1: number, y1: number, holes: [number, number, number, number][] = []): Region {
  const rings = [Float64Array.from([x0, y0, x1, y0, x1, y1, x0, y1])];
  let area = (x1 - x0) * (y1 - y0);
  for (const [a, b, c, d] of holes) {
    rings.push(Float64Array.from([a, b, a, d, c, d, c, b]));
    area -= (c - a) * (d - b);
  }
  return { rings, area, bbox: { minX: x0, minY: y0, maxX: x1, maxY: y1 } };
}

/** n CSR points in the region, seeded (workers/random createCsrSampler: exact uniform given n). */
export function csrPoints(region: Region, n: number, seed: number): Float64Array {
  return createCsrSampler(region).sample(n, createRandom(seed));
}

/** R simulated CSR patterns of n points, pattern r seeded by deriveSeed(seed, r) as the sweep draws them. */
export function csrPatterns(region: Region, n: number, seed: number, sims: number): Float64Array[] {
  const sampler = createCsrSampler(region);
  return Array.from({ length: sims }, (_, r) => sampler.sample(n, createRandom(deriveSeed(seed, r))));
}

/** Offsets a/k, b/k at angle 0 (a lattice of k x k placements). */
export function offsetLattice(k: number): Float64Array {
  const values: number[] = [];
  for (let a = 0; a < k; a++) for (let b = 0; b < k; b++) values.push(a / k, b / k, 0);
  return Float64Array.from(values);
}

/** Stable pixels of a mask as planar pixel centres. */
export function maskCentres(surface: StabilitySurface, mask: Uint8Array): [number, number][] {
  const { raster } = surface;
  const out: [number, number][] = [];
  for (let p = 0; p < mask.length; p++) {
    if (mask[p] !== 1) continue;
    const row = Math.floor(p / raster.width);
    const col = p - row * raster.width;
    out.push([raster.x0 + (col + 0.5) * raster.side, raster.y0 - (row + 0.5) * raster.side]);
  }
  return out;
}
