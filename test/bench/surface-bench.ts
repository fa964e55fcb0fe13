/**
 * Measurement 7: what the stability surface (issue 17) adds to a sweep, one thread, and whether the work budget
 * weighs it enough. The same chunk of placements is evaluated by the production per-task kernel (workers/sweep
 * evaluateChunk) without and with the surface; the surface's time is the difference. Baseline measured in the same
 * run: the sweep's own evaluation of those placements (observed pattern and R simulated CSR patterns).
 * Budget check: the surface's time per pixel-placement over the sweep's time per point-placement of one pattern is the
 * weight the budget must give one pixel-placement; SURFACE_PIXEL_WEIGHT (shared/plan-rules.ts) must be at least that
 * (target: measured weight / SURFACE_PIXEL_WEIGHT <= 1), else plans whose surface dominates pass a budget they exceed.
 * Invented data (bench-data.ts): clustered points, 5 expected points per cell, raster pixel side s / 8.
 */
import { SURFACE_PIXEL_WEIGHT } from '../../shared/plan-rules.js';
import { latticeOf } from '../../workers/lattice/registry.js';
import { createCellCounter, mortonSort } from '../../workers/placement/index.js';
import { createCsrSampler, createRandom, deriveSeed, haltonPlacements } from '../../workers/random/index.js';
import { stabilityRaster, validPixels } from '../../workers/stability/stability-raster.js';
import { evaluateChunk, type ChunkContext } from '../../workers/sweep/evaluate-chunk.js';
import { BENCH_ORIGIN, BENCH_REGION, cellSideForExpected, clusteredDataset } from './bench-data.js';
import { bestSeconds, pass, printTable, type Cell } from './bench-table.js';
import { ratioFigure, type TargetFigure } from './targets.js';

const N = 1e5;
const SIMS = 19;
const PLACEMENTS = 16;

export function runSurfaceBench(): TargetFigure {
  const xy = mortonSort(clusteredDataset(N, 7).xy);
  const cellSize = cellSideForExpected(5, N);
  const sampler = createCsrSampler(BENCH_REGION);
  const simulated = Array.from({ length: SIMS }, (_, r) => createCellCounter(mortonSort(sampler.sample(N, createRandom(deriveSeed(17, r)))), BENCH_ORIGIN));
  const observed = createCellCounter(xy, BENCH_ORIGIN);
  const raster = stabilityRaster(BENCH_REGION, cellSize);
  const pixels = validPixels(BENCH_REGION, raster);
  const rows: Cell[][] = [];
  let worstWeight = 0;
  for (const shape of ['square', 'hex'] as const) {
    const design = haltonPlacements(PLACEMENTS, true, latticeOf(shape).anglePeriod);
    const placements = Float64Array.from(design.flatMap((p) => [p.u, p.v, p.angle]));
    const context: ChunkContext = { region: BENCH_REGION, origin: BENCH_ORIGIN, observed, simulated, cellSize, shape, minCoverage: 0.5, alpha: 0.05 };
    const withSurface: ChunkContext = { ...context, stability: { raster, pixels } };
    // alternated, best of three each, so that a change of background load hits both
    let sweep = Infinity;
    let both = Infinity;
    for (let round = 0; round < 3; round++) {
      sweep = Math.min(sweep, bestSeconds(() => evaluateChunk(context, placements), 1));
      both = Math.min(both, bestSeconds(() => evaluateChunk(withSurface, placements), 1));
    }
    const surface = Math.max(0, both - sweep);
    const perPointPlacement = sweep / (N * PLACEMENTS * (1 + SIMS));
    const perPixelPlacement = surface / (pixels.length * PLACEMENTS);
    const weight = perPixelPlacement / perPointPlacement;
    worstWeight = Math.max(worstWeight, weight);
    rows.push([shape, 'sweep evaluation (baseline), ns per point-placement of one pattern', perPointPlacement * 1e9, 1, '', '']);
    rows.push([shape, `surface, ns per pixel-placement (${pixels.length} valid pixels)`, perPixelPlacement * 1e9, surface / sweep, '', '']);
    rows.push([shape, 'surface weight: pixel-placement / point-placement', weight, weight / SURFACE_PIXEL_WEIGHT, `<= ${SURFACE_PIXEL_WEIGHT}`, pass(weight <= SURFACE_PIXEL_WEIGHT)]);
  }
  printTable(
    `7. Stability surface against the sweep's evaluation, one thread (${N} points, ${SIMS} sims, ${PLACEMENTS} placements, pixel side s/8)`,
    ['shape', 'variant', 'ns', 'time vs sweep', 'target', 'status'],
    rows,
  );
  return ratioFigure(worstWeight, SURFACE_PIXEL_WEIGHT, 1);
}
