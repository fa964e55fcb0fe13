/**
 * One placement end to end (any lattice, workers/lattice): exact coverage of its cells, the kept cells, the point counts and every dispersion
 * statistic of the kept cells (shared/design.md, "Statistics of one placement").
 * Cost O(cells + edge crossings + n) per call.
 */
import { EngineError } from '../engine-error.js';
import { dispersionChiSquare, dispersionVerdict, placementStatistics } from '../stats/index.js';
import type { BandBuffers, GridExtent, KeptCells, Origin, Placement, PlacementStatistics, Region, Verdict } from '../types.js';
import type { CellShape } from '../lattice/cell-shape.js';
import { latticeOf } from '../lattice/registry.js';
import type { CellCounter } from './cell-counter.js';
import { selectCells } from './select-cells.js';
import { createBandBuffers } from './select-cells-by-band.js';
import type { ExpectedFrom } from '../baseline/baseline.js';
import type { BaselineWeigher } from '../baseline/baseline-weights.js';
import { keepBaselineCells } from '../baseline/keep-baseline-cells.js';
import { baselineStatistics } from '../baseline/baseline-statistics.js';

export interface EvaluatePlacementInput {
  counter: Pick<CellCounter, 'count' | 'countBuffer' | 'ownsCountBuffer'>;
  region: Region;
  origin: Origin;
  cellSize: number;
  placement: Placement;
  minCoverage: number;
  alpha: number;
  /** The cells' shape (workers/lattice); absent means square. */
  shape?: CellShape;
  /** Expected counts proportional to this baseline instead of to area (workers/baseline); absent means area. */
  baseline?: BaselineWeigher;
  /** Arrays to reuse (createPlacementBuffers); absent: new arrays for this placement. */
  buffers?: PlacementBuffers;
  /**
   * True: the kept counts are written over the start of the per-grid-cell counts (compactKeptCounts), so no m-long
   * array of them is needed (16 MB less per thread at 1e7 points); `counts` then no longer holds the grid's counts.
   */
  countsInKeptOrder?: boolean;
}

/**
 * Arrays one thread reuses from placement to placement (evaluateChunk keeps one set per thread): one band of the
 * coverage grid (lattices with Lattice.keptCells), the kept cells and their counts. A placement
 * evaluated with them returns views of them, valid until the next placement; each array is replaced by a larger one
 * when a placement needs more. Reuse saves the fresh allocations, whose pages the system zeroes and maps: 0.3 to
 * 1 ms for each 2 MB array, measured against 0.05 ms to refill one.
 */
export interface PlacementBuffers extends BandBuffers {
  /** per-grid-cell counts; grown with 30 % more room, as the grids of other angles are larger (up to 26 % measured) */
  counts: Int32Array;
  /** kept counts in kept order, when they are not written over `counts` (countsInKeptOrder) */
  observed: Int32Array;
  /** a simulated pattern's per-grid-cell counts (workers/types.ts CountArray: float64), sized as `counts` */
  simulatedCounts: Float64Array;
}

export function createPlacementBuffers(): PlacementBuffers {
  return {
    ...createBandBuffers(),
    counts: new Int32Array(0),
    observed: new Int32Array(0),
    simulatedCounts: new Float64Array(0),
  };
}

/**
 * What the expected counts of a placement are proportional to (issue 15): in area mode 'area', the kept cells'
 * valid area Σ a_c · s^2 (m^2), 0, 0; with a baseline Σ_kept w_c and the cells (and their points) that pass the
 * coverage rule but have w_c = 0. `weights` are the kept cells' weights in kept order (the coverages in area mode).
 */
export interface Expectation {
  expectedFrom: ExpectedFrom;
  baselineTotal: number;
  zeroBaselineCells: number;
  pointsInZeroBaselineCells: number;
  weights: Float64Array;
  /** with a baseline: the weights of every grid cell, and the cells the coverage rule alone keeps */
  gridWeights?: Float64Array;
  coverageKept?: KeptCells;
  /** with a baseline: the area-only test of the same placement (coverage-kept cells, E ∝ area) for comparison */
  areaChi2PerDf?: number;
  areaVerdict?: Verdict;
}

export interface EvaluatedPlacement {
  stats: PlacementStatistics;
  /** the kept cells' counts in kept order (a view of buffers or of `counts`, valid until the next placement) */
  observed: Int32Array;
  /** the placement's grid of cells (their coverage is not kept: lattices with keptCells never hold it whole) */
  grid: GridExtent;
  kept: KeptCells;
  /**
   * Per-grid-cell counts of this placement (length >= nx * ny, storage order of the grid); with countsInKeptOrder
   * the kept counts are written over its start.
   */
  counts: Int32Array;
  expectation: Expectation;
}

/** Counts of the kept cells, in kept order, gathered from per-grid-cell counts. Cost O(kept cells). */
export function keptCounts(counts: Int32Array, kept: KeptCells, out?: Int32Array): Int32Array {
  const m = kept.index.length;
  const result = out !== undefined && out.length >= m ? out.subarray(0, m) : new Int32Array(m);
  for (let k = 0; k < m; k++) result[k] = counts[kept.index[k]!]!;
  return result;
}

/**
 * The kept cells' counts written over the start of the per-grid-cell counts, in kept order: counts[k] =
 * counts[index[k]] for k = 0, 1, ..., m - 1. In place because the kept indices increase (grid storage order), so
 * index[k] >= k and no count is overwritten before it is read. Returns counts.subarray(0, m). Cost O(kept cells).
 */
export function compactKeptCounts(counts: Int32Array, kept: KeptCells): Int32Array {
  const { index } = kept;
  const m = index.length;
  for (let k = 0; k < m; k++) counts[k] = counts[index[k]!]!;
  return counts.subarray(0, m);
}

function describePlacement(cellSize: number, placement: Placement, shape: CellShape | undefined): string {
  return `${shape === 'hex' ? 'hexagonal ' : ''}cells of ${cellSize} m at offset (${placement.u}, ${placement.v}) and angle ${placement.angle} deg`;
}

/**
 * The grid and the cells the coverage rule keeps: band by band where the lattice can (Lattice.keptCells), else from
 * the whole coverage grid (selectCells). Kept arrays made new for this placement (too small a buffer) serve the next
 * ones.
 */
function keptCellsOf(input: EvaluatePlacementInput): { grid: GridExtent; kept: KeptCells } {
  const { region, origin, cellSize, placement, minCoverage, shape, buffers } = input;
  const lattice = latticeOf(shape);
  if (lattice.keptCells !== undefined) {
    return lattice.keptCells(region, origin, cellSize, placement, minCoverage, buffers ?? createPlacementBuffers());
  }
  const grid = lattice.coverage(region, origin, cellSize, placement);
  const kept = selectCells(grid, minCoverage, buffers?.kept);
  if (buffers !== undefined && kept.index.buffer !== buffers.kept.index.buffer) buffers.kept = kept;
  return { grid, kept };
}

/**
 * Evaluate one placement. Throws EngineError TOO_FEW_KEPT_CELLS (a RangeError) when fewer than 2 cells are kept
 * (the message says at least 2 are needed and how to get them).
 */
export function evaluatePlacement(input: EvaluatePlacementInput): EvaluatedPlacement {
  const { counter, cellSize, placement, minCoverage, alpha, shape, baseline, buffers } = input;
  const { grid, kept: coverageKept } = keptCellsOf(input);
  const cellCount = grid.nx * grid.ny;
  const scratch = buffers?.counts;
  let counts: Int32Array;
  // a counter with arrays of its own counts in place only into its own: the thread's array from another dataset's
  // memory is left for the counter's (and let go, with that memory)
  if (scratch !== undefined && scratch.length >= cellCount && (counter.ownsCountBuffer?.(scratch) ?? true)) {
    counts = scratch;
  } else {
    const size = buffers === undefined ? cellCount : Math.ceil(cellCount * 1.3);
    // the counter's own array when it has one (WebAssembly memory: counted in place, no copy)
    counts = counter.countBuffer?.(size) ?? new Int32Array(size);
  }
  if (buffers !== undefined) buffers.counts = counts;
  let kept = coverageKept;
  let expectation: Expectation;
  if (baseline === undefined) {
    // an indexed loop: for-of over the typed array measured 1.5 ms per placement at 200,000 cells, a quarter of it
    const coverage = kept.coverage;
    let area = 0;
    for (let c = 0; c < coverage.length; c++) area += coverage[c]!;
    expectation = {
      expectedFrom: 'area',
      baselineTotal: area * cellSize * cellSize,
      zeroBaselineCells: 0,
      pointsInZeroBaselineCells: 0,
      weights: kept.coverage,
    };
  } else {
    counter.count(grid, cellSize, placement, counts);
    const gridWeights = baseline.weights(grid, cellSize, placement);
    const narrowed = keepBaselineCells(coverageKept, gridWeights, counts);
    kept = narrowed.kept;
    expectation = {
      expectedFrom: baseline.expectedFrom,
      baselineTotal: narrowed.baselineTotal,
      zeroBaselineCells: narrowed.zeroBaselineCells,
      pointsInZeroBaselineCells: narrowed.pointsInZeroBaselineCells,
      weights: narrowed.weights,
      gridWeights,
      coverageKept,
    };
  }
  if (kept.index.length < 2) {
    const withWeight = baseline === undefined ? '' : ' and a positive baseline weight';
    throw new EngineError(
      'TOO_FEW_KEPT_CELLS',
      `${describePlacement(cellSize, placement, shape)} keep ${kept.index.length} cell(s) with coverage >= ${minCoverage}${withWeight}; ` +
        'at least 2 are needed: use smaller cells or a lower minCoverage',
    );
  }
  if (baseline === undefined) counter.count(grid, cellSize, placement, counts);
  if (expectation.coverageKept !== undefined && expectation.coverageKept.index.length >= 2) {
    const areaTest = dispersionChiSquare(keptCounts(counts, expectation.coverageKept), expectation.coverageKept.coverage);
    expectation.areaChi2PerDf = areaTest.chi2 / areaTest.df;
    expectation.areaVerdict = dispersionVerdict(areaTest.chi2, areaTest.df, alpha).verdict;
  }
  let observed: Int32Array;
  if (input.countsInKeptOrder === true) {
    observed = compactKeptCounts(counts, kept);
  } else {
    // room for as many counts as the kept arrays hold: the next placements' counts fit too
    if (buffers !== undefined && buffers.observed.length < kept.index.length) buffers.observed = new Int32Array(Math.max(kept.index.length, buffers.kept.index.length));
    observed = keptCounts(counts, kept, buffers?.observed);
  }
  const stats =
    baseline === undefined
      ? placementStatistics(observed, kept.coverage, alpha)
      : baselineStatistics(observed, kept.coverage, expectation.weights, alpha);
  return { stats, observed, grid, kept, counts, expectation };
}
