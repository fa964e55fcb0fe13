/** summarizeDataset: counts, areas and suggested cell sizes of a loaded dataset, for the API and the CLI. */
import type { Dataset, DatasetSummary } from '../../shared/contracts.js';
import { cellSizeForExpected } from '../../workers/stats/expected-per-cell.js';
import { describeProjection } from './describe-projection.js';
import { insideCount } from './inside-points.js';
import { multiPolygonArea, multiPolygonBBox } from './planar-rings.js';

/**
 * Rules of thumb for the cell size (all common practice): about 1.6 points per cell (a rule in use, no primary
 * source found), cell area 2A/n (about 2 points per cell, widely taught as optimal, attribution uncertain) and
 * about 5 (the chi-square adequacy rule of expected counts >= 5, Cochran 1954, carried over to quadrats).
 */
export const CELL_SIZE_RULES: readonly { perCell: number; rule: string }[] = [
  { perCell: 1.6, rule: 'about 1.6 points per cell (common practice, no primary source)' },
  { perCell: 2, rule: 'cell area 2A/n, about 2 points per cell (common practice)' },
  { perCell: 5, rule: 'about 5 points per cell: expected counts >= 5 for the chi-square test (common practice)' },
];

export function summarizeDataset(dataset: Dataset): DatasetSummary {
  const nInside = insideCount(dataset);
  const validArea = dataset.region.area;
  return {
    name: dataset.name,
    crs: dataset.crs,
    projection: dataset.projection,
    projectionUsed: describeProjection(dataset.projection),
    // one point per record id (every reader of server/inputs adds an id with each coordinate pair); the stored
    // dataset reads its ids only when asked (server/store/dataset-store.ts)
    n: dataset.xy.length / 2,
    nInside,
    nOutside: dataset.outsideIds.length,
    validArea,
    studyAreaArea: multiPolygonArea(dataset.studyArea),
    bbox: multiPolygonBBox(dataset.studyArea),
    areaIsDefault: dataset.areaIsDefault,
    warnings: dataset.warnings,
    ...(dataset.baseline === undefined ? {} : { baseline: dataset.baseline.info }),
    suggestedCellSizes: CELL_SIZE_RULES.map(({ perCell, rule }) => ({
      perCell,
      cellSize: cellSizeForExpected(perCell, validArea, nInside),
      rule,
    })),
  };
}
