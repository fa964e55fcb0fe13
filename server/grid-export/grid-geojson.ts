/**
 * One placement's grid as a GeoJSON FeatureCollection, written as a stream of text chunks (never the whole text in
 * memory), yielding to the event loop between chunks so that other requests are served meanwhile.
 *
 * Coordinates: RFC 7946 longitude/latitude (WGS 84) whenever the working system is known (longitude/latitude input,
 * or an EPSG code): cells inverse-projected and densified to stay within 1 cm of the planar square, counter-clockwise.
 * `planar` gives the working metres instead (what the page draws); input given as `crs planar` has only those.
 * Each feature has an id "i,j" (its grid indices), and the properties i, j, count, coverage, expected, kept.
 */
import { setImmediate as yieldToEventLoop } from 'node:timers/promises';
import { cellAt, type CellDescription, type CellGrid } from '../../workers/placement/index.js';
import type { GridFeature, GridMeta, ProjectionInfo } from '../../shared/contracts.js';
import { parameterError } from '../errors.js';
import type { GridRequest } from './grid-cells.js';
import { lonLatRing } from './lonlat-ring.js';
import { workingSystem } from './working-system.js';

/** Features per chunk of text. */
const FEATURES_PER_CHUNK = 2000;

export type GridCoordinates = 'lonlat' | 'planar';

export interface GridGeoJsonInput {
  datasetName: string;
  projection: ProjectionInfo;
  origin: { x: number; y: number };
  request: GridRequest;
  cells: CellGrid;
  /** requested coordinates; 'lonlat' is the default where the system is known */
  coordinates: GridCoordinates;
}

/**
 * The coordinates a request gets: longitude/latitude unless asked for planar or the system is unknown (crs planar);
 * asking for lonlat explicitly on such data is refused (GS_ERR_PARAMETER).
 */
export function effectiveCoordinates(projection: ProjectionInfo, requested: GridCoordinates | undefined): GridCoordinates {
  if (projection.kind === 'planar' && requested === 'lonlat') {
    throw parameterError('coordinates=lonlat needs a known coordinate system; this dataset was given as crs planar: upload it with --crs EPSG:n');
  }
  if (requested === 'planar' || projection.kind === 'planar') return 'planar';
  return 'lonlat';
}

function header(input: GridGeoJsonInput): string {
  const system = workingSystem(input.projection);
  const lonlat = input.coordinates === 'lonlat';
  const epsgMetres = input.projection.kind === 'epsg' && /\+units=m(\s|$)/.test(input.projection.proj4);
  const meta: GridMeta = {
    coordinates: lonlat
      ? `longitude/latitude (WGS 84, RFC 7946); cell edges densified to within 1 cm of the planar ${input.request.shape === 'hex' ? 'hexagon' : 'square'}`
      : `planar metres of the working system (not longitude/latitude): ${system.description}`,
    projection: system.description,
    dataset: input.datasetName,
    sizeIndex: input.request.sizeIndex,
    placementIndex: input.request.placementIndex,
    cellSize: input.request.cellSize,
    shape: input.request.shape ?? 'square',
    u: input.request.placement.u,
    v: input.request.placement.v,
    angle: input.request.placement.angle,
    minCoverage: input.request.minCoverage,
    origin: input.origin,
    cells: input.cells.cellCount,
  };
  const crs =
    !lonlat && epsgMetres && input.projection.kind === 'epsg'
      ? `"crs":${JSON.stringify({ type: 'name', properties: { name: `urn:ogc:def:crs:EPSG::${input.projection.code}` } })},`
      : '';
  return `{"type":"FeatureCollection",${crs}"gridshake":${JSON.stringify(meta)},"features":[`;
}

function feature(cell: CellDescription, ring: [number, number][]): string {
  const described: GridFeature = {
    type: 'Feature',
    id: `${cell.i},${cell.j}`,
    properties: { i: cell.i, j: cell.j, count: cell.count, coverage: cell.coverage, expected: cell.expected, kept: cell.kept },
    geometry: { type: 'Polygon', coordinates: [ring] },
  };
  return JSON.stringify(described);
}

/** The FeatureCollection as text chunks. */
export async function* gridGeoJsonChunks(input: GridGeoJsonInput): AsyncGenerator<string> {
  const system = workingSystem(input.projection);
  const lonlat = input.coordinates === 'lonlat' && system.toLonLat !== null && system.fromLonLat !== null;
  const ringOf = lonlat
    ? (corners: [number, number][]) => lonLatRing(corners, system.toLonLat!, system.fromLonLat!)
    : (corners: [number, number][]) => corners;
  yield header({ ...input, coordinates: lonlat ? 'lonlat' : 'planar' });
  const total = input.cells.grid.coverage.length;
  let parts: string[] = [];
  let first = true;
  for (let k = 0; k < total; k++) {
    const cell = cellAt(input.cells, k);
    if (cell === null) continue;
    parts.push((first ? '' : ',') + feature(cell, ringOf(cell.corners)));
    first = false;
    if (parts.length >= FEATURES_PER_CHUNK) {
      yield parts.join('');
      parts = [];
      await yieldToEventLoop();
    }
  }
  parts.push(']}');
  yield parts.join('');
}

/** The whole collection as one string (small grids and tests). */
export async function gridGeoJsonText(input: GridGeoJsonInput): Promise<string> {
  let text = '';
  for await (const chunk of gridGeoJsonChunks(input)) text += chunk;
  return text;
}
