/** The result of `gridshake count`: one placement's statistics plus what was counted and how (the --json object). */
import type { DatasetSummary, InputWarning, ProjectionInfo } from '../../shared/contracts.js';
import type { CellShape } from '../../workers/lattice/cell-shape.js';
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
