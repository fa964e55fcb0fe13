/**
 * One placement's grid as a GeoJSON FeatureCollection (RFC 7946 structure) in the dataset's planar metres: one
 * Polygon per cell with coverage > 0, with its grid indices, count, coverage, expected count and whether it was
 * kept. Coordinates are planar, not longitude/latitude, so the collection carries a note of its coordinate system
 * (and the legacy `crs` member when the system is an EPSG one in metres, which GIS programs read).
 */
import { insideCoordinates } from '../inputs/inside-coordinates.js';
import type { Dataset } from '../contracts.js';
import { createCellCounter, describeCells } from '../../workers/placement/index.js';
import type { Placement } from '../../workers/types.js';

export interface GridRequest {
  cellSize: number;
  placement: Placement;
  minCoverage: number;
  sizeIndex: number;
  placementIndex: number;
}


function coordinateNote(dataset: Dataset): { note: string; crsMember?: unknown } {
  const projection = dataset.projection;
  if (projection.kind === 'epsg' && /\+units=m(\s|$)/.test(projection.proj4)) {
    return {
      note: `planar metres in EPSG:${projection.code}`,
      crsMember: { type: 'name', properties: { name: `urn:ogc:def:crs:EPSG::${projection.code}` } },
    };
  }
  if (projection.kind === 'laea') {
    return { note: `planar metres in the local equal-area projection ${projection.proj4} (not longitude/latitude)` };
  }
  if (projection.kind === 'epsg') return { note: `planar metres converted from EPSG:${projection.code} (${projection.proj4})` };
  return { note: 'planar metres as given in the input (crs planar); not longitude/latitude' };
}

export function placementGrid(dataset: Dataset, request: GridRequest): Record<string, unknown> {
  const counter = createCellCounter(insideCoordinates(dataset), dataset.origin);
  const cells = describeCells({
    counter,
    region: dataset.region,
    origin: dataset.origin,
    cellSize: request.cellSize,
    placement: request.placement,
    minCoverage: request.minCoverage,
  });
  const { note, crsMember } = coordinateNote(dataset);
  const collection: Record<string, unknown> = {
    type: 'FeatureCollection',
    gridshake: {
      coordinates: note,
      dataset: dataset.name,
      sizeIndex: request.sizeIndex,
      placementIndex: request.placementIndex,
      cellSize: request.cellSize,
      u: request.placement.u,
      v: request.placement.v,
      angle: request.placement.angle,
      minCoverage: request.minCoverage,
      origin: dataset.origin,
    },
    features: cells.map((cell) => ({
      type: 'Feature',
      properties: {
        i: cell.i,
        j: cell.j,
        count: cell.count,
        coverage: cell.coverage,
        expected: cell.expected,
        kept: cell.kept,
      },
      geometry: { type: 'Polygon', coordinates: [cell.corners] },
    })),
  };
  if (crsMember !== undefined) collection.crs = crsMember;
  return collection;
}
