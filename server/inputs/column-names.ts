/**
 * Finding the coordinate and id columns of a CSV header by name (case-insensitive, surrounding spaces ignored).
 * Longitude/latitude names make the data geographic; x/y, easting/northing names make it projected.
 */
import { inputError } from '../errors.js';
import { FIELD_NAMES, fieldRef, twoWays } from '../messages/field-names.js';

export type CoordinateKind = 'lonlat' | 'xy';

const LONGITUDE_NAMES = ['lon', 'long', 'longitude', 'lng', 'lon_dd', 'longitude_dd'];
const LATITUDE_NAMES = ['lat', 'latitude', 'lat_dd', 'latitude_dd'];
const X_NAMES = ['x', 'easting', 'east', 'x_coord', 'xcoord', 'coord_x', 'point_x', 'x_m'];
const Y_NAMES = ['y', 'northing', 'north', 'y_coord', 'ycoord', 'coord_y', 'point_y', 'y_m'];
/** Names of an id column (CSV) or an id-like property (GeoJSON features without a Feature.id), in order of preference. */
export const ID_NAMES = ['id', 'fid', 'record', 'record_id', 'recordid', 'objectid', 'gid', 'uid', 'point_id', 'site', 'site_id', 'case_id', 'ref', 'key'];

export interface CoordinateColumns {
  x: number;
  y: number;
  /** index of the id column, or -1 when the 1-based record number serves as id */
  id: number;
  kind: CoordinateKind;
  xName: string;
  yName: string;
}

const normalize = (name: string): string => name.trim().toLowerCase();

function findIndex(header: string[], names: string[]): number {
  const normalized = header.map(normalize);
  for (const name of names) {
    const index = normalized.indexOf(name);
    if (index >= 0) return index;
  }
  return -1;
}

function findGiven(fileName: string, header: string[], given: string, option: 'x' | 'y' | 'id'): number {
  const index = header.map(normalize).indexOf(normalize(given));
  if (index < 0) {
    throw inputError(
      `${fileName}: line 1: no column named '${given}' (given in ${fieldRef(option)}); columns seen: ${header.join(', ')}`,
    );
  }
  return index;
}

/** Column choice: the user's --x/--y/--id if given, else the first known name of each kind. */
export function findCoordinateColumns(
  fileName: string,
  header: string[],
  given: { x?: string; y?: string; id?: string },
): CoordinateColumns {
  let x: number;
  let y: number;
  if (given.x !== undefined || given.y !== undefined) {
    if (given.x === undefined || given.y === undefined) {
      throw inputError(`${fileName}: give both ${fieldRef('x')} and ${fieldRef('y')}, or neither to find the columns by name`);
    }
    x = findGiven(fileName, header, given.x, 'x');
    y = findGiven(fileName, header, given.y, 'y');
  } else {
    x = findIndex(header, LONGITUDE_NAMES);
    y = findIndex(header, LATITUDE_NAMES);
    if (x < 0 || y < 0) {
      x = findIndex(header, X_NAMES);
      y = findIndex(header, Y_NAMES);
    }
    if (x < 0 || y < 0) {
      throw inputError(
        `${fileName}: line 1: no coordinate columns found (expected x/y, easting/northing or lon/lat); ` +
          `columns seen: ${header.join(', ')}; ${twoWays('name them with --x COL --y COL', `name them in the "${FIELD_NAMES.x.label}" and "${FIELD_NAMES.y.label}" fields`)}`,
      );
    }
  }
  const id = given.id !== undefined ? findGiven(fileName, header, given.id, 'id') : findIndex(header, ID_NAMES);
  const xName = header[x].trim();
  const yName = header[y].trim();
  const kind: CoordinateKind =
    LONGITUDE_NAMES.includes(normalize(xName)) && LATITUDE_NAMES.includes(normalize(yName)) ? 'lonlat' : 'xy';
  return { x, y, id, kind, xName, yName };
}
