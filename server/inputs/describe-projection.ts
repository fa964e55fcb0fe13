/**
 * The projection a dataset was counted in, as one line with its full proj4 definition: recorded in the count text
 * and JSON, the dataset summary (page, summary.json, report) and the grid exports, so that a run can be reproduced
 * from its own outputs.
 */
import proj4 from 'proj4';
import type { ProjectionInfo } from '../../shared/contracts.js';

/** Metres per unit of a proj4 definition (1 unless it says +units=us-ft, +to_meter=...). */
export function metresPerUnit(definition: string): number {
  const projection = proj4.Proj(definition) as unknown as { to_meter?: number };
  return projection.to_meter ?? 1;
}

/** One line naming the projection used, with its full proj4 definition (for count, summary.json, page, report). */
export function describeProjection(projection: ProjectionInfo): string {
  if (projection.kind === 'laea') {
    return `longitude/latitude projected to a local Lambert azimuthal equal-area system centred at ${projection.lon0}, ${projection.lat0}: ${projection.proj4}`;
  }
  if (projection.kind === 'epsg') {
    const unit = metresPerUnit(projection.proj4);
    const scaled = unit === 1 ? '' : ` (coordinates multiplied by ${unit} to give metres)`;
    return `EPSG:${projection.code}${scaled}: ${projection.proj4}`;
  }
  return 'planar: coordinates taken as metres in an unnamed projected system (no projection applied)';
}

