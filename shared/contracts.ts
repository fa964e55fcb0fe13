/**
 * Contracts between server/inputs, server/sweeps, server/summary, the HTTP API, the CLI and the client.
 * The client imports these as types only.
 */
import type { BBox, Origin, Region, Verdict } from '../workers/types.js';
import type { EncodedStatistics, ExpectationStatistics } from '../workers/stats/statistic-fields.js';
import type { CellShape } from '../workers/lattice/cell-shape.js';
import type { Baseline } from '../workers/baseline/baseline.js';

export interface InputWarning {
  code: string;
  /** in the page's words (its field labels) */
  message: string;
  /** the same warning in the command line's words, when they differ (flags instead of field labels) */
  cliMessage?: string;
  /** record ids or feature numbers concerned, possibly truncated */
  ids?: string[];
}

/** What a dataset records about its baseline (summary.json, count --json, the report). */
export interface BaselineInfo {
  kind: 'polygons' | 'controls';
  /** the file's name as given */
  file: string;
  /** the count property (polygons only) */
  field?: string;
  /** polygons: features read; controls: points read */
  features: number;
  /** polygons: Σ P_p over the polygons with |p ∩ V| > 0; controls: controls inside V */
  totalInside: number;
  /** polygons: Σ P_p over every polygon */
  total: number;
  /** polygons: 1-based numbers of the features with |p ∩ V| = 0 (reported and ignored) */
  outsideFeatures: number[];
  /** polygons: share of V outside every polygon (weight 0 there); controls: 0 */
  uncoveredShare: number;
  /** controls: how many lie outside V (never counted) */
  controlsOutside?: number;
}

/** How input coordinates were turned into planar metres. */
export type ProjectionInfo =
  | { kind: 'planar' }
  | { kind: 'epsg'; code: number; proj4: string }
  | { kind: 'laea'; lon0: number; lat0: number; proj4: string };

/** A parsed, validated, projected dataset, ready for the engine. Built by server/inputs. */
export interface Dataset {
  name: string;
  crs: string;
  projection: ProjectionInfo;
  /** all points' planar coordinates, interleaved x,y (inside and outside the valid region) */
  xy: Float64Array;
  /** record id of each point (the id column, the feature id, or the 1-based record number) */
  ids: string[];
  /** indices (into xy/2) of the points inside the valid region: the only ones ever counted */
  inside: Uint32Array;
  /** ids of the points outside the valid region */
  outsideIds: string[];
  /** study area and no-data zones as GeoJSON-style multipolygons in planar metres, for drawing */
  studyArea: number[][][][];
  noDataZones: number[][][][];
  /** true when no study area was given and the points' bounding box was used */
  areaIsDefault: boolean;
  region: Region;
  origin: Origin;
  warnings: InputWarning[];
  /** the population at risk (issue 15): the engine's baseline and what is recorded about it; absent: area */
  baseline?: { engine: Baseline; info: BaselineInfo };
}

export interface DatasetSummary {
  id?: string;
  name: string;
  crs: string;
  n: number;
  nInside: number;
  nOutside: number;
  validArea: number;
  studyAreaArea: number;
  bbox: BBox;
  areaIsDefault: boolean;
  warnings: InputWarning[];
  /** how the input coordinates became planar metres (absent in summaries stored before it was recorded) */
  projection?: ProjectionInfo;
  /** the same as one line with the full proj4 definition, e.g. "EPSG:32633: +proj=utm +zone=33 ..." */
  projectionUsed?: string;
  /** the population at risk: file, field and totals (absent: expected counts follow area) */
  baseline?: BaselineInfo;
  /** cell sides (m) for 1.6, 2 and 5 expected points per cell: side = sqrt(k * validArea / nInside) */
  suggestedCellSizes: { perCell: number; cellSize: number; rule: string }[];
  createdAt?: string;
}

export type PlacementDesign = 'halton' | 'lattice';

/** A sweep's parameters; JSON uses these names, the CLI the kebab-case ones. */
export interface Plan {
  /** cell sides in metres; exactly one of cells / perCell is given */
  cells?: number[];
  /** expected points per cell, turned into sides by sqrt(k * validArea / n) */
  perCell?: number[];
  placements: number;
  rotation: boolean;
  design: PlacementDesign;
  minCoverage: number;
  alpha: number;
  sims: number;
  seed: number;
  /**
   * the cells' shape, or a list of shapes run on the same placement design (absent: square, workers/lattice
   * DEFAULT_CELL_SHAPE); kept as given so that a square plan reads back unchanged
   */
  shape?: CellShape | CellShape[];
}


/**
 * One row per (cell size, placement): the placement's parameters and all its statistics except the class table. The
 * expectation fields (issue 15) are absent in rows stored before baselines existed (area); the area-only comparison
 * (areaChi2PerDf, areaVerdict) only in rows evaluated against a baseline.
 */
export interface PlacementRow extends Omit<EncodedStatistics, keyof ExpectationStatistics>, Partial<ExpectationStatistics> {
  /** index of the (shape, cell size) entry in the summary's sizes: every cell size of the first shape, then the next */
  sizeIndex: number;
  cellSize: number;
  /** the cells' shape; every sweep sets it (absent only in rows stored before shapes existed: square) */
  shape?: CellShape;
  placementIndex: number;
  u: number;
  v: number;
  angle: number;
  /** natural log of pClustered in log space; in summary.json rows (reference, lowest and highest vmr) */
  logPClustered?: number;
  /** natural log of pRegular in log space; in summary.json rows */
  logPRegular?: number;
}

export interface Quantiles {
  min: number;
  p5: number;
  p25: number;
  p50: number;
  p75: number;
  p95: number;
  max: number;
}

export interface MonteCarloResult {
  sims: number;
  /** (1 + #{r: median_r >= median_obs}) / (R + 1), on the median of chi2/df across placements */
  pMedianClustered: number;
  /** (1 + #{r: median_r <= median_obs}) / (R + 1) */
  pMedianRegular: number;
  /** the same on the maximum of chi2/df across placements ("worst-case cherry-picking") */
  pMaxClustered: number;
  /** the same on the minimum, for regularity */
  pMinRegular: number;
  observedMedian: number;
  observedMax: number;
  observedMin: number;
  simulatedMedians: number[];
  simulatedMaxima: number[];
  /** minimum of chi2/df across placements on each simulated pattern */
  simulatedMinima?: number[];
  /** 2.5 and 97.5 % of the simulated medians */
  envelope: { lo: number; hi: number };
  /** share of placements significant (either tail at alpha) on the observed pattern and on each simulated one */
  observedShareSignificant: number;
  simulatedShareSignificant: number[];
}

export interface SizeSummary {
  sizeIndex: number;
  cellSize: number;
  /** the cells' shape (absent in summaries stored before shapes existed: square) */
  shape?: CellShape;
  /** expected points per whole cell at this size */
  expectedPerCell: number;
  placements: number;
  vmr: Quantiles;
  chi2PerDf: Quantiles;
  verdictShares: Record<Verdict, number>;
  mostCommon: Verdict;
  agreement: number;
  reference: PlacementRow;
  /** share of placements whose vmr is below the reference placement's (0..1); in the tail when < 0.05 or > 0.95 */
  referenceRank: number;
  referenceInTail: boolean;
  lowestVmr: PlacementRow;
  highestVmr: PlacementRow;
  monteCarlo: MonteCarloResult | null;
  conclusion: string;
  /**
   * against a baseline (issue 15): the area-only verdicts of the same placements (per-placement chi-square against
   * area, no Monte Carlo), shown beside the baseline verdicts
   */
  areaOnly?: { verdictShares: Record<Verdict, number>; mostCommon: Verdict; chi2PerDfMedian: number };
}

/** The one test behind the overall conclusion (server/summary/overall-test.ts); null without sims. */
export interface OverallTest {
  /** max over sizes of |standardized median chi2/df|, ranked among the R + 1 patterns */
  method: 'monte-carlo-max-standardized-median';
  /** the observed pattern's statistic */
  statistic: number;
  /** (1 + #{r: T_r >= T_obs}) / (R + 1) */
  p: number;
  sims: number;
  alpha: number;
  /** whether 1/(R+1) <= alpha (a p at or below alpha is possible at all) */
  canReject: boolean;
  /** p <= alpha */
  rejects: boolean;
  /** the observed departure at the most extreme size when the test rejects, else 'csr' */
  direction: Verdict;
  /** the cell side (m) where the observed standardized median is most extreme */
  strongestCellSize: number;
  /** and the cells' shape there (only in sweeps with hexagons; the test runs across every (shape, size) entry) */
  strongestShape?: CellShape;
}

export interface SweepSummary {
  plan: Plan;
  dataset: DatasetSummary;
  /** against a baseline (issue 15): where expected counts come from, and the baseline's file, field and totals */
  expectedFrom?: 'baseline' | 'controls';
  baseline?: BaselineInfo;
  sizes: SizeSummary[];
  /** the overall test across sizes and tails (null when sims = 0) */
  overallTest?: OverallTest | null;
  conclusion: string;
  warnings: string[];
  versions: Record<string, string>;
  timings: { startedAt: string; finishedAt: string; seconds: number };
  /** the placement-stable excess / deficit surface per (shape, cell size), when computed (server/stability) */
  stability?: StabilitySizeSummary[];
}

/** One stable area (server/stability/stable-areas.ts): planar rings of the working system, closed. */
export interface StableAreaSummary {
  kind: 'excess' | 'deficit';
  /** largest share over the area's pixels */
  maxShare: number;
  areaKm2: number;
  /**
   * outer ring counter-clockwise, then holes clockwise; planar metres, closed; empty when summary.json's vertex cap
   * left this area's outline out (StabilitySizeSummary.truncated)
   */
  rings: [number, number][][];
}

/** The stability surface of one (shape, cell size): raster, calibration and the stable areas. */
export interface StabilitySizeSummary {
  sizeIndex: number;
  shape: CellShape;
  cellSize: number;
  placements: number;
  /** raster: upper-left corner, pixel side (m), columns and rows */
  raster: { x0: number; y0: number; side: number; width: number; height: number };
  /** simulated null patterns of the calibration (0: no calibration, no areas) */
  sims: number;
  /** level per kind (alpha / 2); null without calibration */
  level: number | null;
  /** a pixel's share must exceed these to be stable; null without calibration or with too few simulations */
  excessThreshold: number | null;
  deficitThreshold: number | null;
  /** the observed largest shares over the assessed pixels */
  maxExcessShare: number;
  maxDeficitShare: number;
  areas: StableAreaSummary[];
  note: string;
  /** file names of the GeoTIFF and the areas' GeoJSON (sweep --out; the same names under /api/sweeps/:id/) */
  files: { tif: string; geojson: string };
  /**
   * present (true) when summary.json leaves areas or their rings out (server/stability/stability-summary.ts caps:
   * an area left without outline has `rings: []`); the areas' GeoJSON file holds the full geometry
   */
  truncated?: true;
  /** with `truncated`: how many stable areas the surface has in all */
  areasTotal?: number;
}

export type SweepStatus = 'queued' | 'running' | 'done' | 'failed' | 'cancelled' | 'interrupted';

export interface SweepProgress {
  done: number;
  total: number;
  elapsedSeconds: number;
  remainingSeconds: number | null;
}

export interface SweepEstimate {
  /** points x placements x sizes x (1 + sims) */
  work: number;
  /**
   * the stability surface's work in the same unit: raster pixels x placements x SURFACE_PIXEL_WEIGHT
   * (shared/plan-rules.ts); the budget holds work + surfaceWork
   */
  surfaceWork?: number;
  budget: number;
  tasks: number;
  /** sizes x placements x (1 + sims): grid evaluations held until summarised */
  evaluations?: number;
  /** bytes of simulated CSR coordinates: points x sims x 16 */
  simulatedBytes?: number;
}

/** GET /api/datasets/:id/geometry: what the page draws of a dataset (server/services/dataset-geometry.ts). */
export interface DatasetGeometry {
  /** points drawn, x,y interleaved (planar metres) */
  points: number[];
  /** 1 when the drawn point is inside the valid region, 0 when it lies outside (never counted) */
  pointInside: number[];
  /** points in the dataset, and the stride used (1 = every point drawn) */
  totalPoints: number;
  stride: number;
  studyArea: number[][][][];
  noDataZones: number[][][][];
  bbox: Dataset['region']['bbox'];
  origin: Dataset['origin'];
  /**
   * the population-at-risk polygons inside the valid region (p ∩ V, closed rings) with their density P_p / |p ∩ V| per
   * km², for the map's choropleth (issue 15); absent without baseline polygons
   */
  baseline?: { polygons: { rings: number[][][]; density: number }[]; maxDensity: number };
}
