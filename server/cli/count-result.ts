/** The result of `gridshake count`: one placement's statistics plus what was counted and how (the --json object). */
import type { DatasetSummary, InputWarning, ProjectionInfo } from '../contracts.js';
import type { Placement, PlacementStatistics } from '../../workers/types.js';

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
  cellSize: number;
  placement: Placement;
  minCoverage: number;
  alpha: number;
  dataset: {
    name: string;
    crs: string;
    projection: ProjectionInfo;
    validArea: number;
    studyAreaArea: number;
    areaIsDefault: boolean;
    suggestedCellSizes: DatasetSummary['suggestedCellSizes'];
  };
  warnings: InputWarning[];
}
