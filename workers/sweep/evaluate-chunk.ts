/**
 * The pure work of one chunk task: for each placement of the chunk, the coverage of its cells (computed once),
 * the kept cells, the observed counts and all statistics, then the dispersion chi-square of every simulated
 * pattern (CSR, or the baseline's null: workers/baseline) at the same kept cells with the same expected weights.
 */
import { compactKeptCounts, createPlacementBuffers, evaluatePlacement, type CellCounter } from '../placement/index.js';
import { dispersionChiSquare, gatheredDispersionChiSquare, isSignificant } from '../stats/index.js';
import type { CellShape } from '../lattice/cell-shape.js';
import type { Origin, Placement, Region } from '../types.js';
import type { BaselineWeigher } from '../baseline/baseline-weights.js';
import { poolCounts, relabelledChiSquare } from '../baseline/relabelled-chi-square.js';
import { keptIndexOfCoverage, RelabelledFlagInput } from '../baseline/relabelled-flags.js';
import { pixelCellLocator, squarePixelFrame } from '../stability/pixel-cells.js';
import { StabilityChunk, type SquareCellPixels } from '../stability/stability-chunk.js';
import { criticalLower, criticalUpper, summarizeWeights, type WeightSummary } from '../stability/cell-flags.js';
import type { ExtremeCells } from '../stats/index.js';
import type { StabilityRaster } from '../stability/stability-raster.js';
import { encodeStatistics, STATISTICS_FIELDS } from './statistics-codec.js';
import { chunkResultLength, simulatedFlagOffset, simulatedValueOffset } from './sweep-task.js';

/** Counts the points of one pattern per cell of a coverage grid (workers/placement createCellCounter). */
export type PatternCounter = Pick<CellCounter, 'count' | 'pointCount' | 'countBuffer' | 'ownsCountBuffer'>;

export interface ChunkContext {
  region: Region;
  origin: Origin;
  observed: PatternCounter;
  simulated: readonly PatternCounter[];
  cellSize: number;
  /** the cells' shape (workers/lattice); absent means square */
  shape?: CellShape;
  minCoverage: number;
  alpha: number;
  /** expected counts proportional to this baseline (workers/baseline) instead of area; absent means area */
  baseline?: BaselineWeigher;
  /** the stability surface's raster and its valid pixels (workers/stability); absent: no surface */
  stability?: { raster: StabilityRaster; pixels: Uint32Array; squareCells?: SquareCellPixels };
}

/**
 * The arrays of one placement (grid band, kept cells, counts), one set per thread, kept from chunk to chunk and
 * between sweeps (about 60 MB per thread after a sweep of 1e7 points; with simulations and the surface also the
 * float64 counts of a simulated pattern, 8 bytes per grid cell, and THREAD_EXTREMES, 4 bytes per kept cell: about
 * 45 MB more at 1e7 points, one CSR pattern of 1e7 points itself taking 160 MB). Made anew per chunk, a thread dropped that much
 * per chunk, which stayed in the process's resident memory (measured: 45 MB more peak at 1e7 points, and a second
 * slower). evaluateChunk is synchronous, so one chunk at a time uses them.
 */
const THREAD_BUFFERS = createPlacementBuffers();

/** The thread's list of a simulated pattern's extreme cells (extremeBounds), grown to the largest placement's cells. */
const THREAD_EXTREMES: ExtremeCells = { from: 0, to: 0, cells: new Int32Array(0), count: 0 };

/**
 * Bounds for listing a CSR pattern's extreme cells while its chi-square is summed (workers/stability/cell-flags.ts
 * KnownSums): the critical counts of the rates the pattern's points in the kept cells N can give. N <= n, so
 * `to` = the lower critical count at rate n / A is at least the pattern's own; N below its expectation n p
 * (p = A s^2 / region area, the kept cells' share of the region) by more than 6 binomial standard deviations is
 * so rare that `from` is the upper critical count there, and a pattern beyond it (flagCells then finds `from` too
 * high) gets the full pass. Cost: a few Poisson tails per placement.
 */
function extremeBounds(weights: WeightSummary, pointCount: number, regionCells: number, alpha: number, m: number): ExtremeCells {
  const share = Math.min(1, weights.area / regionCells);
  const expected = pointCount * share;
  const spread = Math.sqrt(expected * (1 - share));
  const extremes = THREAD_EXTREMES;
  if (extremes.cells.length < m) extremes.cells = new Int32Array(Math.ceil(m * 1.3));
  extremes.from = criticalUpper(Math.max(0, expected - 6 * spread - 1) / weights.area, alpha);
  extremes.to = criticalLower(pointCount / weights.area, alpha);
  extremes.count = 0;
  return extremes;
}

/**
 * Evaluates the placements (u, v, angle triples) of one chunk; returns the chunk result laid out as in
 * sweep-task.ts. Coverage is computed once per placement and reused by every simulated pattern.
 * Cost: O(P (C + n (1 + R) + m R)) for P placements, C coverage work, n points, R sims, m kept cells.
 * @throws EngineError TOO_FEW_KEPT_CELLS when a placement keeps fewer than 2 cells (workers/engine-error.ts)
 */
export function evaluateChunk(context: ChunkContext, placements: Float64Array): Float64Array {
  const count = placements.length / 3;
  const sims = context.simulated.length;
  const result = new Float64Array(chunkResultLength(count, sims));
  const stability = context.stability === undefined ? null : new StabilityChunk(context.stability.raster, context.stability.pixels, context.alpha, context.stability.squareCells ?? null);
  const labelling = new RelabelledFlagInput();
  // the grid, kept cells and counts of one placement live in the thread's buffers until the next placement
  const buffers = THREAD_BUFFERS;
  // the observed kept counts over the start of the grid's counts, except with controls, whose labellings need the
  // grid's counts (poolCounts, relabelledChiSquare)
  const countsInKeptOrder = context.baseline?.expectedFrom !== 'controls';
  for (let j = 0; j < count; j++) {
    const placement: Placement = { u: placements[3 * j], v: placements[3 * j + 1], angle: placements[3 * j + 2] };
    const evaluated = evaluatePlacement({ ...context, counter: context.observed, placement, buffers, countsInKeptOrder });
    encodeStatistics(evaluated.stats, evaluated.expectation, result, j * STATISTICS_FIELDS);
    const scratch = evaluated.counts;
    // controls: each simulated labelling has its own controls (the rest of the pool), so its own weights
    const { expectation } = evaluated;
    const relabel = expectation.expectedFrom === 'controls' && expectation.coverageKept !== undefined && expectation.gridWeights !== undefined;
    const pool = relabel ? poolCounts(evaluated.counts, expectation.gridWeights!, expectation.coverageKept!) : null;
    // the stability flags' expected counts: E_c = N w_c / Σ w against a baseline, by area otherwise. Polygons: the
    // simulations follow the same weights. Controls: each labelling has its own controls (pool − simulated cases), so
    // its flags use its own weights over the cells where it has controls (workers/baseline/relabelled-flags.ts)
    const flagWeights = expectation.expectedFrom === 'area' ? evaluated.kept.coverage : expectation.weights;
    const keptOf = pool !== null && stability !== null ? keptIndexOfCoverage(expectation.coverageKept!, evaluated.kept) : null;
    if (stability !== null) {
      stability.beginPlacement(
        pixelCellLocator(context.shape, context.origin, context.cellSize, placement, evaluated.grid),
        evaluated.grid,
        evaluated.kept,
        squarePixelFrame(context.shape, context.origin, context.cellSize, placement),
        // without a baseline the kept cells are those of the coverage rule, every whole cell among them
        context.baseline === undefined,
      );
      stability.addObserved(evaluated.observed, flagWeights);
    }
    // the flags of every simulated pattern test the same weights (flagWeights is expectation.weights here), and each
    // pattern's total comes with its chi-square: flagCells skips its first pass (workers/stability/cell-flags.ts)
    const weightSummary = stability !== null && pool === null && sims > 0 ? summarizeWeights(flagWeights) : null;
    // CSR patterns (no baseline): their extreme cells are listed while their chi-square is summed
    const extremes =
      weightSummary !== null && expectation.expectedFrom === 'area'
        ? extremeBounds(weightSummary, context.simulated[0]!.pointCount, context.region.area / (context.cellSize * context.cellSize), context.alpha, evaluated.kept.index.length)
        : undefined;
    // with the surface, the patterns' counts in float64 (workers/types.ts CountArray): their cell flags make the per-cell
    // passes weigh; without it the counting kernel then sees int32 alone (one array kind: the Monte Carlo benchmark,
    // 1e4 points and 199 sims, ran 5 to 30 % slower with float64 patterns beside the int32 observed counts). The
    // labellings' pool is int32.
    const floatPatterns = pool === null && stability !== null;
    if (floatPatterns && sims > 0 && buffers.simulatedCounts.length < scratch.length) buffers.simulatedCounts = new Float64Array(scratch.length);
    const simulatedCounts = buffers.simulatedCounts;
    for (let r = 0; r < sims; r++) {
      if (pool === null && !floatPatterns) {
        // into the pattern counter's own array when it has one (WebAssembly memory: counted in place, no copy), else
        // the thread's: nothing after the observed statistics reads the grid's counts, so the kept counts go over
        // their start
        const into = context.simulated[r].countBuffer?.(scratch.length) ?? scratch;
        context.simulated[r].count(evaluated.grid, context.cellSize, placement, into);
        const { chi2, df } = dispersionChiSquare(compactKeptCounts(into, evaluated.kept), expectation.weights);
        result[simulatedValueOffset(count, sims, j, r)] = chi2 / df;
        result[simulatedFlagOffset(count, sims, j, r)] = isSignificant(chi2, df, context.alpha) ? 1 : 0;
        continue;
      }
      if (pool === null) {
        // the kept counts go over the start of the pattern's grid counts as its chi-square is summed
        context.simulated[r].count(evaluated.grid, context.cellSize, placement, simulatedCounts);
        const { chi2, df, points } = gatheredDispersionChiSquare(simulatedCounts, evaluated.kept.index, expectation.weights, extremes);
        const counts = simulatedCounts.subarray(0, evaluated.kept.index.length);
        result[simulatedValueOffset(count, sims, j, r)] = chi2 / df;
        result[simulatedFlagOffset(count, sims, j, r)] = isSignificant(chi2, df, context.alpha) ? 1 : 0;
        if (stability !== null) stability.addSimulated(r, counts, flagWeights, null, { total: points, weights: weightSummary!, extremes });
        continue;
      }
      context.simulated[r].count(evaluated.grid, context.cellSize, placement, scratch);
      const { chi2, df } = relabelledChiSquare(scratch, pool, expectation.coverageKept!);
      result[simulatedValueOffset(count, sims, j, r)] = chi2 / df;
      result[simulatedFlagOffset(count, sims, j, r)] = isSignificant(chi2, df, context.alpha) ? 1 : 0;
      if (stability !== null && keptOf !== null) {
        const m = labelling.fill(scratch, pool, expectation.coverageKept!, keptOf);
        stability.addSimulated(r, labelling.counts.subarray(0, m), labelling.weights.subarray(0, m), labelling.keptIndex);
      }
    }
  }
  if (stability === null) return result;
  const withStability = new Float64Array(result.length + stability.length);
  withStability.set(result);
  stability.encode(withStability, result.length);
  return withStability;
}
