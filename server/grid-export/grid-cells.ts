/**
 * The cells of one placement for an export, bounded: a grid export is refused (GS_ERR_GRID_TOO_LARGE, 422) above a
 * cell limit per format, before the grid is allocated when its bounding box alone is far too large, so that one
 * request can neither exhaust the server's memory nor hold its event loop for long.
 */
import { gridExtent } from '../../workers/geometry/coverage.js';
import { createCellCounter, describeCellGrid, type CellGrid } from '../../workers/placement/index.js';
import { createBaselineWeigher } from '../../workers/baseline/baseline-weights.js';
import type { Placement } from '../../workers/types.js';
import type { CellShape } from '../../workers/lattice/cell-shape.js';
import type { Dataset } from '../../shared/contracts.js';
import { gridTooLargeError } from '../errors.js';
import { insideCoordinates } from '../inputs/inside-coordinates.js';

/**
 * Most cells in a grid.geojson export. 250,000 polygons are about 60 MB of GeoJSON in longitude/latitude, written
 * in about 2 s; larger grids do not open usefully in a browser or a GIS as GeoJSON.
 */
export const MAX_GEOJSON_GRID_CELLS = 250_000;

/**
 * Most cells in a grid.gpkg export (2^23, twice the most cells a sweep size may have, so that any rotated grid of a
 * sweep fits): about 160 bytes per cell; 4 million cells took 44 s and 660 MB of temporary file on the test machine.
 */
export const MAX_GEOPACKAGE_GRID_CELLS = 2 ** 23;

/** A grid box this many times the limit is refused without computing the coverage grid. */
const BOX_FACTOR = 4;

export interface GridRequest {
  cellSize: number;
  /** the cells' shape (absent: square); hexagons are exported as 7-point rings */
  shape?: CellShape;
  placement: Placement;
  minCoverage: number;
  sizeIndex: number;
  placementIndex: number;
}

export type GridFormat = 'geojson' | 'gpkg';

function limitOf(format: GridFormat): number {
  return format === 'geojson' ? MAX_GEOJSON_GRID_CELLS : MAX_GEOPACKAGE_GRID_CELLS;
}

/**
 * A cell side (m) that brings `cells` at side `size` under `limit`: cells scale as 1/side^2, with 1 % to spare for
 * the partly covered cells along the edges, rounded up to 2 significant digits.
 */
export function coarserSide(size: number, cells: number, limit: number): number {
  const side = 1.01 * size * Math.sqrt(cells / limit);
  const magnitude = 10 ** (Math.floor(Math.log10(side)) - 1);
  return Math.ceil(side / magnitude) * magnitude;
}

function refuse(format: GridFormat, request: GridRequest, cells: number, exact: boolean): never {
  const limit = limitOf(format);
  const side = coarserSide(request.cellSize, cells, limit);
  const howMany = exact ? `${cells.toLocaleString('en-US')} cells` : `about ${cells.toLocaleString('en-US')} cells (its bounding box)`;
  const alternative =
    format === 'geojson'
      ? `, or download this placement as a GeoPackage (grid.gpkg?size=${request.sizeIndex}&placement=${request.placementIndex}, up to ${MAX_GEOPACKAGE_GRID_CELLS.toLocaleString('en-US')} cells)`
      : '';
  throw gridTooLargeError(
    `the grid of size ${request.sizeIndex} (${request.cellSize} m ${request.shape === 'hex' ? 'hexagonal ' : ''}cells) has ${howMany}, more than the ` +
      `${limit.toLocaleString('en-US')} a ${format === 'geojson' ? 'GeoJSON' : 'GeoPackage'} grid export may hold: ` +
      `pick a cell size of at least ${side} m${alternative}`,
  );
}

/**
 * The placement's cells, or GS_ERR_GRID_TOO_LARGE when more than the format's limit have coverage > 0.
 * Cost O(vertices) to refuse a far too large grid, O(cells + n) otherwise.
 */
export function boundedCellGrid(dataset: Dataset, request: GridRequest, format: GridFormat): CellGrid {
  const limit = limitOf(format);
  const box = gridExtent(dataset.region, dataset.origin, request.cellSize, request.placement);
  const boxCells = box.nx * box.ny;
  if (boxCells > BOX_FACTOR * limit) refuse(format, request, boxCells, false);
  const cells = describeCellGrid({
    counter: createCellCounter(insideCoordinates(dataset), dataset.origin),
    region: dataset.region,
    origin: dataset.origin,
    cellSize: request.cellSize,
    placement: request.placement,
    minCoverage: request.minCoverage,
    shape: request.shape,
    // expected counts follow the dataset's population at risk when it has one (issue 15)
    baseline: dataset.baseline === undefined ? undefined : createBaselineWeigher(dataset.baseline.engine, dataset.origin),
  });
  if (cells.cellCount > limit) refuse(format, request, cells.cellCount, true);
  return cells;
}
