/**
 * Contracts between server/inputs, server/sweeps, server/summary, the HTTP API, the CLI and the client.
 * The client imports these as types only. The HTTP bodies are written once, as the JSON schemas of
 * shared/http-schemas.ts, and their types are derived from them here (FromSchema); the summary.json contract
 * (SweepSummary and its parts) and the engine-side Dataset are interfaces.
 */
import type { Origin, Region, Verdict } from '../workers/types.js';
import type { EncodedStatistics, ExpectationStatistics } from '../workers/stats/statistic-fields.js';
import type { CellShape } from '../workers/lattice/cell-shape.js';
import type { Baseline } from '../workers/baseline/baseline.js';
import type {
  BASELINE_INFO_SCHEMA,
  DATASET_GEOMETRY_SCHEMA,
  DATASET_SUMMARY_SCHEMA,
  EXECUTOR_CHOICES,
  HEALTH_SCHEMA,
  PLAN_FILLED_FIELDS,
  PLAN_SCHEMA,
  PROJECTION_SCHEMA,
  SWEEP_ESTIMATE_SCHEMA,
  SWEEP_PROGRESS_SCHEMA,
  SWEEP_SCHEMA,
  SWEEP_STARTED_SCHEMA,
  SWEEP_STATUSES,
  WARNING_SCHEMA,
} from './http-schemas.js';
import type { FromSchema } from './schema-type.js';

/** A warning about the input; the server keeps `cliMessage` for the command line (not sent over HTTP). */
export type InputWarning = FromSchema<typeof WARNING_SCHEMA> & {
  /** the same warning in the command line's words, when they differ (flags instead of field labels) */
  cliMessage?: string;
};

/** What a dataset records about its baseline (summary.json, count --json, the report). */
export type BaselineInfo = FromSchema<typeof BASELINE_INFO_SCHEMA>;

/** How input coordinates were turned into planar metres. */
export type ProjectionInfo = FromSchema<typeof PROJECTION_SCHEMA>;

/** A parsed, validated, projected dataset, ready for the engine. Built by server/inputs. */
export interface Dataset {
  name: string;
  crs: string;
  projection: ProjectionInfo;
  /** all points' planar coordinates, interleaved x,y (inside and outside the valid region) */
  xy: Float64Array;
  /** record id of each point (the id column, the feature id, or the 1-based record number) */
  ids: string[];
  /**
   * indices (into xy/2) of the points inside the valid region: the only ones ever counted. When every point is inside,
   * server/inputs builds it only when read (server/inputs/inside-points.ts: ask insideCount / isEveryPointInside)
   */
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

/** A stored dataset as the API shows it (http-schemas DATASET_SUMMARY_SCHEMA). */
export type StoredDataset = FromSchema<typeof DATASET_SUMMARY_SCHEMA>;

/** A dataset's summary before it is stored (no id yet; the server's warnings keep their command-line words). */
export type DatasetSummary = Omit<StoredDataset, 'id' | 'sample' | 'warnings'> & { id?: string; warnings: InputWarning[] };

export type { PlacementDesign } from './plan-rules.js';

/**
 * Where a server runs a sweep's tasks (`executor` of POST /api/sweeps, beside the plan: it changes no number):
 * its own worker pool, or the Redis queue of `serve --queue` (the default on such a server).
 */
export type ExecutorChoice = (typeof EXECUTOR_CHOICES)[number];

/** A plan as sent: every field optional (http-schemas PLAN_SCHEMA). */
export type PlanInput = FromSchema<typeof PLAN_SCHEMA>;

/** A sweep's parameters, defaults filled in; JSON uses these names, the CLI the kebab-case ones. */
export type Plan = PlanInput & Required<Pick<PlanInput, (typeof PLAN_FILLED_FIELDS)[number]>>;

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

export type SweepStatus = (typeof SWEEP_STATUSES)[number];

export type SweepProgress = FromSchema<typeof SWEEP_PROGRESS_SCHEMA>;

export type SweepEstimate = FromSchema<typeof SWEEP_ESTIMATE_SCHEMA>;

/** A sweep as the API shows it; `summary` (one sweep's GET only) is the summary.json contract above. */
export type SweepView = Omit<FromSchema<typeof SWEEP_SCHEMA>, 'summary'> & { summary?: SweepSummary | null };

/** The answer to starting or rerunning a sweep (202). */
export type SweepStarted = FromSchema<typeof SWEEP_STARTED_SCHEMA>;

/** GET /api/health, without its constant `status: 'ok'`. */
export type HealthInfo = Omit<FromSchema<typeof HEALTH_SCHEMA>, 'status'>;

/** GET /api/datasets/:id/geometry: what the page draws of a dataset (server/services/dataset-geometry.ts). */
export type DatasetGeometry = FromSchema<typeof DATASET_GEOMETRY_SCHEMA>;

/** One cell of grid.geojson (server/grid-export/grid-geojson.ts): id "i,j", planar or longitude/latitude ring. */
export interface GridFeature {
  type: 'Feature';
  id?: string;
  /** expected is null for a cell left out (coverage below minCoverage) */
  properties: { i: number; j: number; count: number; coverage: number; expected: number | null; kept: boolean };
  geometry: { type: 'Polygon'; coordinates: number[][][] };
}

/** What grid.geojson says of its placement, beside the features (its `gridshake` member). */
export interface GridMeta {
  /** in words: longitude/latitude or planar metres of the working system */
  coordinates: string;
  projection: string;
  dataset: string;
  sizeIndex: number;
  placementIndex: number;
  cellSize: number;
  shape: CellShape;
  u: number;
  v: number;
  angle: number;
  minCoverage: number;
  origin: Origin;
  /** cells of the grid frame (kept or not) */
  cells: number;
}

/** GET /api/sweeps/:id/grid.geojson: the cells of one placement (RFC 7946 FeatureCollection, streamed as text). */
export interface GridCollection {
  type: 'FeatureCollection';
  features: GridFeature[];
  gridshake?: GridMeta;
}
