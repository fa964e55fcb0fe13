/** The result of `gridshake count`: one placement's statistics plus what was counted and how (the --json object). */
import type { BaselineInfo, DatasetSummary, InputWarning, ProjectionInfo } from '../../shared/contracts.js';
import type { CellShape } from '../../workers/lattice/cell-shape.js';
import type { Placement, PlacementStatistics, Verdict } from '../../workers/types.js';

export interface CountMonteCarlo {
  test: 'random labelling';
  /** R random labellings */
  sims: number;
  seed: number;
  statistic: 'chi2/df';
  /** chi2/df of the observed labelling */
  observed: number;
  /** (1 + #{r: t_r >= t_obs}) / (R + 1) */
  pClustered: number;
  /** (1 + #{r: t_r <= t_obs}) / (R + 1) */
  pRegular: number;
  /** two-sided at alpha: clustered when pClustered <= alpha/2, regular when pRegular <= alpha/2 */
  verdict: Verdict;
}

export interface CountResult extends PlacementStatistics {
  /** natural log of pClustered, computed in log space (finite where pClustered underflows to 0) */
  logPClustered: number;
  /** natural log of pRegular, computed in log space */
  logPRegular: number;
  /** points in the data outside the valid region (never counted) */
  pointsOutside: number;
  /** points inside the valid region but in cells left out by minCoverage */
  pointsInLeftOutCells: number;
  /** all points in the data */
  pointsTotal: number;
  /** what the expected counts are proportional to (issue 15) */
  expectedFrom: 'area' | 'baseline' | 'controls';
  /** Σ_kept w: the kept cells' valid area (m²) in area mode, else the baseline weight in the kept cells */
  baselineTotal: number;
  /** cells passing the coverage rule with no population at risk (w = 0): left out (0 in area mode) */
  zeroBaselineCells: number;
  /** the points in those cells (0 in area mode) */
  pointsInZeroBaselineCells: number;
  /** the baseline file, field and totals (absent in area mode) */
  baseline?: BaselineInfo;
  /**
   * with controls: the random-labelling Monte Carlo test of this placement (workers/baseline/labelling-test.ts), the
   * calibrated test whose verdict the text reports; pClustered / pRegular above are then the chi-square's, which treats
   * the control counts as exact
   */
  monteCarlo?: CountMonteCarlo;
  cellSize: number;
  /** the cells' shape; a hexagon has the area of the square of side cellSize */
  shape: CellShape;
  placement: Placement;
  minCoverage: number;
  alpha: number;
  dataset: {
    name: string;
    crs: string;
    projection: ProjectionInfo;
    /** the projection as one line with its full proj4 definition */
    projectionUsed: string;
    validArea: number;
    studyAreaArea: number;
    areaIsDefault: boolean;
    suggestedCellSizes: DatasetSummary['suggestedCellSizes'];
  };
  warnings: InputWarning[];
}
