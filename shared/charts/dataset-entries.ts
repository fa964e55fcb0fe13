/**
 * The dataset summary as label/value rows and an input warning's record list, worded once for the page and the
 * report (both show them).
 */
import type { DatasetSummary, InputWarning } from '../contracts.js';
import { formatArea } from '../format.js';

export function datasetSummaryEntries(dataset: DatasetSummary): [string, string][] {
  return [
    ['Name', dataset.name],
    ['Coordinate system', dataset.crs],
    ...(dataset.projectionUsed ? ([['Projection used', dataset.projectionUsed]] as [string, string][]) : []),
    ['Points in the data', String(dataset.n)],
    ['Inside the valid region', String(dataset.nInside)],
    ['Outside the valid region (never counted)', String(dataset.nOutside)],
    ['Study area', `${formatArea(dataset.studyAreaArea)}${dataset.areaIsDefault ? ' (bounding box of the points: no area given)' : ''}`],
    ['Valid region (study area minus no-data zones)', formatArea(dataset.validArea)],
  ];
}

/** " (records a, b, c)" when the warning names records, else "". */
export function warningRecords(warning: InputWarning): string {
  return warning.ids && warning.ids.length > 0 ? ` (records ${warning.ids.join(', ')})` : '';
}
