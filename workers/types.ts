/**
 * Types shared by the pure compute engine (workers/) and its callers (server/).
 * Everything here is plain data: typed arrays and plain objects, no I/O.
 * Units: planar metres for coordinates and cell sizes, degrees for angles, cell units for offsets.
 */
import type { CellShape } from './lattice/cell-shape.js';

/** A flat ring x0,y0,x1,y1,... in planar metres; the first vertex is NOT repeated at the end. */
export type Ring = Float64Array;

export interface BBox {
  minX: number;
  minY: number;
  maxX: number;
  maxY: number;
}

/**
 * The valid region (study area minus no-data zones) as oriented, non-crossing rings: shells counter-clockwise
 * (positive signed area), holes clockwise (negative), so that the signed ring areas add up to `area` (m^2).
 * Built once per dataset by server/inputs; the engine only reads it.
 */
export interface Region {
  rings: Ring[];
  area: number;
  bbox: BBox;
}

/**
 * Grid offset (u, v) in lattice units, each in [0, 1), and counter-clockwise rotation in degrees, [0, period): 90 for
 * squares, 60 for hexagons (workers/lattice).
 */
export interface Placement {
  u: number;
  v: number;
  angle: number;
}

/** The reference placement: the grid a default analysis would use. */
export const REFERENCE_PLACEMENT: Readonly<Placement> = Object.freeze({ u: 0, v: 0, angle: 0 });

/** Grid origin O: lower-left corner of the study area's bounding box (planar metres). */
export interface Origin {
  x: number;
  y: number;
}

/**
 * Coverage of every cell of one placement that the region's bounding box touches.
 * Cell (i, j) (the lattice's indices) is stored at `(j - j0) * nx + (i - i0)`; coverage is in [0, 1].
 */
export interface CoverageGrid {
  /** the lattice whose cells these are (workers/lattice); absent means square */
  shape?: CellShape;
  i0: number;
  j0: number;
  nx: number;
  ny: number;
  coverage: Float64Array;
}

/** A coverage grid's cells without their coverage: what counting and locating cells need. */
export type GridExtent = Omit<CoverageGrid, 'coverage'>;

/** The cells a placement keeps (coverage >= minCoverage - 1e-9 and > 0): their grid indices and coverages. */
export interface KeptCells {
  index: Int32Array;
  coverage: Float64Array;
}

/**
 * Per-grid-cell counts as a counter writes them: Int32Array for the observed pattern (half the memory of float64: a
 * sweep without simulations holds only these), for random labellings (workers/baseline) and for simulated patterns
 * without the stability surface; Float64Array for the CSR and polygon-baseline simulated patterns of a sweep with the
 * surface (a second array per thread, 8 bytes per grid cell; why only then: workers/sweep/evaluate-chunk.ts), whose
 * sums and cell tests then read float64 directly: converting an int32 count
 * to a double made V8's per-cell loops about three times slower (5.4 against 1.7 ns per cell measured for the
 * chi-square's pass; the conversion's false dependency chains the iterations), and counting into float64 was no slower.
 */
export type CountArray = Int32Array | Float64Array;

/** Arrays a thread reuses for kept cells computed band by band (workers/placement/select-cells-by-band.ts). */
export interface BandBuffers {
  /** one band of grid rows' coverage */
  band: Float64Array;
  /** the kept cells, at least as long as the bound of keptCellBound */
  kept: KeptCells;
}

export type Verdict = 'clustered' | 'regular' | 'csr';

/** One class of the Poisson frequency goodness-of-fit table, after merging (e.g. label "0", "1", ">=4"). */
export interface FrequencyClass {
  label: string;
  observed: number;
  expected: number;
}

export interface PoissonFit {
  chi2: number;
  df: number;
  p: number;
  classes: FrequencyClass[];
}

/** Every statistic of one placement (shared/design.md, "Statistics of one placement"). */
export interface PlacementStatistics {
  /** m: kept cells */
  cells: number;
  /** N: points inside the valid region that fall in kept cells */
  points: number;
  mean: number;
  variance: number;
  vmr: number;
  chi2: number;
  df: number;
  chi2PerDf: number;
  pClustered: number;
  pRegular: number;
  verdict: Verdict;
  /** N * s^2 / sum(a_c): expected points per whole cell */
  expectedPerCell: number;
  /** expectedPerCell >= 5 (common practice: the chi-square adequacy rule) */
  meetsRuleOf5: boolean;
  /** expectedPerCell >= 1.6 (common practice, no primary source) */
  meetsRuleOf1_6: boolean;
  morisita: number;
  morisitaStandardized: number;
  meanCrowding: number;
  patchiness: number;
  green: number;
  /** negative-binomial k by moments; null when variance <= mean */
  negativeBinomialK: number | null;
  /** null when fewer than 3 classes remain after merging (no degrees of freedom) */
  poissonFit: PoissonFit | null;
}

/** The cheap part of the statistics, enough for a simulated CSR pattern. */
export interface DispersionResult {
  chi2: number;
  df: number;
  points: number;
}

/** A uniform random source in [0, 1), seeded; the engine never calls Math.random. */
export type RandomSource = () => number;
