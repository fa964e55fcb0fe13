/**
 * The plan's rules, written once and used by the HTTP schema (server/routes/schemas/common-schemas.ts), the plan
 * validation (server/sweeps/plan.ts), the CLI parser and help (server/cli/sweep-command.ts), the sweep budget
 * (server/sweeps/sweep-budget.ts) and the page's form and live estimate (client/src/plan, client/src/panels):
 * the allowed ranges, the defaults, the work budget and the limits on evaluations and simulation memory.
 * Pure: numbers in, numbers and words out.
 */
import type { Plan } from './contracts.js';

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

/** The defaults of every plan field but the cell sizes. */
export const DEFAULT_PLAN: Readonly<Omit<Plan, 'cells' | 'perCell'>> = Object.freeze({
  placements: 256,
  rotation: true,
  design: 'halton',
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
 * Point-placements of the budget that one pixel-placement of the stability surface counts for: finding a raster
 * pixel's cell in one placement (and adding its flags) costs about as much as counting this many points in one
 * placement of one pattern. An upper bound of the figure measured by `npm run bench -- surface` (the "surface
 * weight" rows check that the measured figure stays below it): 7 to 9 for squares and about 4 for hexagons on the
 * 2-core test machine under load (load average 8 to 12).
 */
export const SURFACE_PIXEL_WEIGHT = 12;

/** What a sweep costs: the quantities the budget and the limits are checked against. */
export interface PlanWork {
  /** points inside x placements x sizes x (1 + sims): one point tested against one placement of one pattern */
  work: number;
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
 * The cost of `sizes` (shape, cell size) pairs of `placements` placements with `sims` simulations, and of a
 * stability surface with `surfacePixels` raster pixels over all the sizes (0: no surface). Cost O(1).
 */
export function planWork(nInside: number, placements: number, sizes: number, sims: number, surfacePixels = 0): PlanWork {
  const patterns = 1 + sims;
  const surfaceWork = surfacePixels * placements * SURFACE_PIXEL_WEIGHT;
  return {
    work: nInside * placements * sizes * patterns,
    surfaceWork,
    evaluations: sizes * placements * patterns,
    simulatedBytes: nInside * 16 * sims,
  };
}
