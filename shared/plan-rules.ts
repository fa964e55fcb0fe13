/**
 * The plan's rules, written once and used by the HTTP schema (shared/http-schemas.ts), the plan
 * validation (server/sweeps/plan.ts), the CLI parser and help (server/cli/sweep-command.ts), the sweep budget
 * (server/sweeps/sweep-budget.ts) and the page's form and live estimate (client/src/plan, client/src/panels):
 * the allowed ranges, the defaults, the work budget and the limits on evaluations and simulation memory.
 * Pure: numbers in, numbers and words out.
 */
import type { BaselineSize } from '../workers/baseline/baseline.js';
import type { BBox } from '../workers/types.js';
import { stabilityRaster } from '../workers/stability/stability-raster.js';

/** Allowed ranges of the plan fields. */
export const PLAN_LIMITS = Object.freeze({
  placements: { min: 1, max: 65536 },
  sims: { min: 0, max: 9999 },
  /** alpha in (0, 0.5] */
  alphaMax: 0.5,
  /** minCoverage in (0, 1] */
  minCoverageMax: 1,
  maxCellSizes: 16,
  /** a cell size must leave at least this many whole cells' worth of area in the valid region */
  minCellsInRegion: 2,
  /**
   * and at most this many: the work budget counts point-placements only, while coverage costs O(cells) time and
   * memory per placement (1e8 cells took 50 s and 4 GB for one placement)
   */
  maxCellsInRegion: 1 << 22,
});

/**
 * The placement designs: the list behind the HTTP schema
 * (shared/http-schemas.ts), the plan validation, the CLI help and the page's choices. How each one places the grid:
 * server/sweeps/placement-design.ts.
 */
export const PLACEMENT_DESIGNS = ['halton', 'lattice'] as const;

export type PlacementDesign = (typeof PLACEMENT_DESIGNS)[number];

/** Each design as the page's form names it. */
export const PLACEMENT_DESIGN_LABELS: Readonly<Record<PlacementDesign, string>> = Object.freeze({
  halton: 'Halton sequence (spread evenly, any count)',
  lattice: 'regular lattice',
});

/** Whether a value names a placement design. */
export function isPlacementDesign(value: unknown): value is PlacementDesign {
  return typeof value === 'string' && (PLACEMENT_DESIGNS as readonly string[]).includes(value);
}

/** The defaults of every plan field but the cell sizes and the shape (the fields every normalized plan has). */
export const DEFAULT_PLAN = Object.freeze({
  placements: 256,
  rotation: true,
  design: 'halton' as PlacementDesign,
  minCoverage: 0.5,
  alpha: 0.05,
  sims: 99,
  seed: 1,
});

/** The ranges as read in help texts and messages: "1..65536", "(0, 1]". */
export const PLAN_RANGE_WORDS = Object.freeze({
  placements: `${PLAN_LIMITS.placements.min}..${PLAN_LIMITS.placements.max}`,
  sims: `${PLAN_LIMITS.sims.min}..${PLAN_LIMITS.sims.max}`,
  alpha: `(0, ${PLAN_LIMITS.alphaMax}]`,
  minCoverage: `(0, ${PLAN_LIMITS.minCoverageMax}]`,
});

/**
 * Default work budget (point-placements), holding the counts' work and the stability surface's (surfaceWork). A
 * whole sweep measured about 6 ns per point-placement on two threads of the benchmark machine at 1e6 points (npm run
 * bench; simulated patterns cost less, the statistics of their cells being only the chi-square), so the default
 * allows a few minutes of work on two cores. It was 2e10 before the surface was counted; the default plan on 1e5
 * points (3 sizes at 2, 5 and 10 expected points per cell, 256 placements, 99 sims) needs 7.7e9 for the counts and
 * about 2.1e10 for the surfaces (their pixels x placements x SURFACE_PIXEL_WEIGHT), and stays within it.
 */
export const DEFAULT_WORK_BUDGET = 4e10;

/** Most (size, placement, pattern) evaluations a sweep may hold: each keeps a chi-square value until summarised. */
export const MAX_EVALUATIONS = 2e7;

/** Most bytes of simulated CSR coordinates held at once (n x sims x 16 bytes). */
export const MAX_SIMULATED_BYTES = 1024 * 1024 * 1024;

/**
 * The work of one baseline polygon piece per (size, placement), in point-placements: its own exact coverage on the
 * grid (a set-up and the cells of its bounding box). Measured on the development machine by timing evaluatePlacement
 * (dist build) with and without a baseline of 1600 and 10000 pieces: about 1.1-1.6 µs per piece against
 * 25-45 ns per point-placement (load average 6-10 while measured), so 50 rounded up.
 */
export const BASELINE_PIECE_WORK = 64;

/**
 * The work of one baseline ring vertex per (size, placement), in point-placements: one edge of the exact coverage.
 * Measured as above with 1600 pieces of 4 to 512 vertices: 70-200 ns per vertex against 28-40 ns per point-placement
 * (load average 8-10), so about 2.5-7, rounded up.
 */
export const BASELINE_VERTEX_WORK = 8;

/**
 * Point-placements of the budget that one pixel-placement of the stability surface counts for: finding a raster
 * pixel's cell in one placement (and adding its flags) costs about as much as counting this many points in one
 * placement of one pattern. An upper bound of the figure measured by `npm run bench -- surface` (the "surface
 * weight" rows check that the measured figure stays below it): 7 to 9 for squares and about 4 for hexagons on the
 * 2-core test machine under load (load average 8 to 12).
 */
export const SURFACE_PIXEL_WEIGHT = 12;

/**
 * Raster pixels of the stability surfaces of a sweep over `bbox` (planar metres): the raster of each cell side
 * (workers/stability/stability-raster.ts), once per shape. The server and the page's estimate both count with it.
 * Cost O(sides).
 */
export function surfacePixelCount(bbox: BBox, cellSizes: readonly number[], shapes: number): number {
  let pixels = 0;
  for (const side of cellSizes) {
    const raster = stabilityRaster({ bbox }, side);
    pixels += raster.width * raster.height;
  }
  return pixels * shapes;
}

/** What a sweep costs: the quantities the budget and the limits are checked against. */
export interface PlanWork {
  /** points inside x placements x sizes x (1 + sims), plus baselineWork: the work budget's measure */
  work: number;
  /** the part of work the baseline adds (0 against area) */
  baselineWork: number;
  /**
   * the stability surface's work, in the same unit: raster pixels (summed over sizes) x placements x
   * SURFACE_PIXEL_WEIGHT; the budget holds work + surfaceWork
   */
  surfaceWork: number;
  /** sizes x placements x (1 + sims): grid evaluations held until summarised */
  evaluations: number;
  /** points inside x sims x 16: bytes of simulated CSR coordinates */
  simulatedBytes: number;
}

/**
 * What the population at risk (issue 15) adds to a sweep, in point-placements:
 * - polygons: sizes x placements x (BASELINE_PIECE_WORK x pieces + BASELINE_VERTEX_WORK x vertices), the areal
 *   weighting of every piece onto every placement's grid, plus sims x points x ceil(log2(pieces + 1)), the
 *   polygon-intensity simulation (a binary search over the pieces per simulated point);
 * - controls: sizes x placements x controls, the controls counted into every placement's cells (the cases' rule);
 *   the relabellings are counted like the simulated points already are.
 * Cost O(1).
 */
export function baselineWork(size: BaselineSize | undefined, nInside: number, placements: number, sizes: number, sims: number): number {
  if (size === undefined) return 0;
  if (size.kind === 'controls') return sizes * placements * size.controls;
  const weighting = sizes * placements * (BASELINE_PIECE_WORK * size.pieces + BASELINE_VERTEX_WORK * size.vertices);
  return weighting + sims * nInside * Math.ceil(Math.log2(size.pieces + 1));
}

/** What the budget reads of a dataset's baseline record (BaselineInfo of shared/contracts.ts, which imports this file). */
export interface BaselineRecordSize {
  kind: 'polygons' | 'controls';
  features: number;
  totalInside: number;
  pieces?: number;
  vertices?: number;
}

/**
 * The budget's view of a dataset's baseline record (its summary, as the page and the API see it): controls from the
 * count inside V; polygons from the recorded pieces and vertices, or, in a record stored before they were counted,
 * the features read and 4 vertices each (the sweep itself is checked against the engine data: baselineSize).
 */
export function baselineSizeOf(info: BaselineRecordSize | undefined): BaselineSize | undefined {
  if (info === undefined) return undefined;
  if (info.kind === 'controls') return { kind: 'controls', pieces: 0, vertices: 0, controls: info.totalInside };
  const pieces = info.pieces ?? info.features;
  return { kind: 'polygons', pieces, vertices: info.vertices ?? 4 * pieces, controls: 0 };
}

/**
 * The cost of `sizes` (shape, cell size) pairs of `placements` placements with `sims` simulations, against area or
 * against a baseline of the given size, and of a stability surface with `surfacePixels` raster pixels over all the
 * sizes (0: no surface). Cost O(1).
 */
export function planWork(
  nInside: number,
  placements: number,
  sizes: number,
  sims: number,
  baseline?: BaselineSize,
  surfacePixels = 0,
): PlanWork {
  const patterns = 1 + sims;
  const extra = baselineWork(baseline, nInside, placements, sizes, sims);
  return {
    work: nInside * placements * sizes * patterns + extra,
    baselineWork: extra,
    surfaceWork: surfacePixels * placements * SURFACE_PIXEL_WEIGHT,
    evaluations: sizes * placements * patterns,
    simulatedBytes: nInside * 16 * sims,
  };
}
