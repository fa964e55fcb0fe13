/**
 * Checks for the wrong-system mistakes a tired analyst makes, on the raw input coordinates before projection. Each
 * refusal (GS_ERR_INPUT) or warning says what is wrong and what to do:
 * - degree-sized values under `--crs planar` or a projected EPSG system (all coordinates inside +-180/+-90, most
 *   with more than 3 decimals, and the points spanning under 1 unit: a study area of a few thousandths of a square
 *   metre): refused; spanning under 10 units: a warning;
 * - metre-sized values labelled as longitude/latitude (beyond +-180/+-90, or spanning more than 20 degrees);
 * - longitude and latitude (or x and y) swapped relative to the study area, or to the EPSG code's area of use;
 * - points far outside the EPSG code's area of use (from the EPSG dataset as the epsg-index package carries it);
 * - a study area in another coordinate system than its points (no overlap at all; a no-data zone: a warning).
 * Cost O(n + polygon vertices) plus a handful of proj4 calls.
 */
import proj4 from 'proj4';
import type { InputWarning } from '../../shared/contracts.js';
import { inputError } from '../errors.js';
import type { CoordinateSystem } from './coordinate-system.js';
import { epsgDefinition } from './epsg-definition.js';
import type { RawPoints } from './raw-points.js';
import type { LabelledRings } from './valid-region.js';
import type { RawPolygon } from './geojson-polygons.js';

export interface Box {
  minX: number;
  minY: number;
  maxX: number;
  maxY: number;
}

/** A polygon as read (before projection): its label for messages and its rings of raw [x, y] positions. */
export type RawPolygonSet = Pick<LabelledRings, 'label' | 'rings'>;

/** Points spanning less than this (coordinate units) under a metre system while inside +-180/+-90 are refused. */
export const DEGREE_SPAN_REFUSED = 1;
/** ... and spanning less than this draw a warning. */
export const DEGREE_SPAN_WARNED = 10;
/** Longitude/latitude data spanning more than this many degrees draw a warning (metres labelled as degrees?). */
export const WIDE_LONLAT_DEGREES = 20;
/** Points whose centre lies further than this (degrees) outside the EPSG area of use are refused. */
export const AREA_OF_USE_REFUSED_DEGREES = 10;
/** ... and further than this draw a warning. */
export const AREA_OF_USE_WARNED_DEGREES = 1;

export function pointsBox(coordinates: Float64Array): Box {
  const box = { minX: Infinity, minY: Infinity, maxX: -Infinity, maxY: -Infinity };
  for (let k = 0; k < coordinates.length; k += 2) {
    const x = coordinates[k]!;
    const y = coordinates[k + 1]!;
    if (x < box.minX) box.minX = x;
    if (x > box.maxX) box.maxX = x;
    if (y < box.minY) box.minY = y;
    if (y > box.maxY) box.maxY = y;
  }
  return box;
}

function ringsBox(rings: number[][][]): Box {
  const box = { minX: Infinity, minY: Infinity, maxX: -Infinity, maxY: -Infinity };
  for (const ring of rings) {
    for (const [x, y] of ring) {
      box.minX = Math.min(box.minX, x!);
      box.maxX = Math.max(box.maxX, x!);
      box.minY = Math.min(box.minY, y!);
      box.maxY = Math.max(box.maxY, y!);
    }
  }
  return box;
}

const span = (box: Box): number => Math.max(box.maxX - box.minX, box.maxY - box.minY);
const swap = (box: Box): Box => ({ minX: box.minY, maxX: box.maxY, minY: box.minX, maxY: box.maxX });
const overlaps = (a: Box, b: Box): boolean => a.minX <= b.maxX && b.minX <= a.maxX && a.minY <= b.maxY && b.minY <= a.maxY;
const insideLonLat = (box: Box): boolean => box.minX >= -180 && box.maxX <= 180 && box.minY >= -90 && box.maxY <= 90;

/** Seven significant digits (enough to tell positions apart), an exponent only for extreme magnitudes. */
function num(value: number): string {
  return Math.abs(value) >= 1e12 || (value !== 0 && Math.abs(value) < 1e-4) ? value.toExponential(2) : String(Number(value.toPrecision(7)));
}

export function describeBox(box: Box, geographic: boolean): string {
  const [x, y] = geographic ? ['longitude', 'latitude'] : ['x', 'y'];
  return `${x} ${num(box.minX)} to ${num(box.maxX)}, ${y} ${num(box.minY)} to ${num(box.maxY)}`;
}

/**
 * True when most coordinates carry more than 3 decimals, as degrees do (a metre grid rarely needs millimetres);
 * looked at on up to 1,000 values spread over the file.
 */
export function manyDecimals(coordinates: Float64Array): boolean {
  const step = Math.max(1, Math.floor(coordinates.length / 1000));
  let fine = 0;
  let seen = 0;
  for (let k = 0; k < coordinates.length; k += step) {
    const v = coordinates[k]! * 1000;
    if (Math.abs(v - Math.round(v)) > 1e-6) fine++;
    seen++;
  }
  return fine * 2 > seen;
}

/** Values that look like degrees: inside +-180/+-90, spanning under DEGREE_SPAN_WARNED, most with > 3 decimals. */
function degreeLike(box: Box, values: Float64Array): boolean {
  return insideLonLat(box) && span(box) < DEGREE_SPAN_WARNED && manyDecimals(values);
}

function ringValues(rings: number[][][]): Float64Array {
  return Float64Array.from(rings.flatMap((ring) => ring.flatMap((position) => [position[0]!, position[1]!])));
}

function degreesUnderMetres(system: CoordinateSystem, points: RawPoints, box: Box): InputWarning | null {
  if (system.geographic || !degreeLike(box, points.coordinates)) return null;
  const extent = span(box);
  const what =
    `${points.fileName}: the coordinates (${describeBox(box, false)}) look like longitude/latitude degrees, but ` +
    `--crs ${system.crs} reads them as ${system.crs === 'planar' ? 'metres' : 'projected coordinates'}, so the points span only ${Number(extent.toPrecision(3))} units (a bounding box of ${Number(((box.maxX - box.minX) * (box.maxY - box.minY)).toPrecision(2))} square units)`;
  const todo =
    points.format === 'csv'
      ? 'if they are degrees, name the columns lon and lat (or longitude/latitude) and leave out --crs, or give --crs EPSG:4326'
      : 'if they are degrees, leave out --crs (GeoJSON is longitude/latitude by default) or give --crs EPSG:4326';
  if (extent < DEGREE_SPAN_REFUSED) throw inputError(`${what}: ${todo}`);
  return { code: 'degree-sized-coordinates', message: `${what}; ${todo}` };
}

function metresAsDegrees(system: CoordinateSystem, points: RawPoints, box: Box): InputWarning | null {
  if (!system.geographic) return null;
  const labelled = points.format === 'csv' ? 'the columns are named as longitude/latitude' : `${system.crs} is longitude/latitude`;
  const todo = 'give --crs planar when they are metres in a projected system, or --crs EPSG:n naming that system';
  if (!insideLonLat(box)) {
    const swapped = insideLonLat(swap(box));
    const c = points.coordinates;
    let first = 0;
    while (first < c.length / 2 && Math.abs(c[2 * first]!) <= 180 && Math.abs(c[2 * first + 1]!) <= 90) first++;
    const [lon, lat] = [c[2 * first]!, c[2 * first + 1]!];
    const value = Math.abs(lat) > 90 ? `latitude ${lat} is beyond +-90 degrees` : `longitude ${lon} is beyond +-180 degrees`;
    throw inputError(
      `${points.locate(first)}: ${value} (${labelled}; all points: ${describeBox(box, true)}): ` +
        (swapped
          ? 'longitude and latitude look swapped: put longitude first (x) and latitude second (y)'
          : `the coordinates look like metres of a projected system: ${todo}`),
    );
  }
  if (span(box) > WIDE_LONLAT_DEGREES) {
    return {
      code: 'wide-longitude-latitude',
      message:
        `${points.fileName}: the points span ${num(box.maxX - box.minX)} degrees of longitude and ${num(box.maxY - box.minY)} ` +
        `of latitude; if the coordinates are metres of a projected system and not degrees, ${todo}`,
    };
  }
  return null;
}

/** The points' box and the centre of it in longitude/latitude, through the source system's inverse. */
function lonLatOf(system: CoordinateSystem, x: number, y: number): [number, number] | null {
  if (system.geographic) return [x, y];
  try {
    const [lon, lat] = proj4(system.sourceProj4, '+proj=longlat +datum=WGS84 +no_defs').forward([x, y]) as [number, number];
    return Number.isFinite(lon) && Number.isFinite(lat) ? [lon, lat] : null;
  } catch {
    return null;
  }
}

/** Degrees by which (lon, lat) lies outside the area of use [west, south, east, north] (0 inside). */
export function degreesOutside(area: [number, number, number, number], lon: number, lat: number): number {
  const [west, south, east, north] = area;
  const inLon = west <= east ? lon >= west && lon <= east : lon >= west || lon <= east;
  const dLon = inLon ? 0 : Math.min(Math.abs(lon - west), Math.abs(lon - east), 360 - Math.abs(lon - west), 360 - Math.abs(lon - east));
  const dLat = lat < south ? south - lat : lat > north ? lat - north : 0;
  return Math.hypot(dLon * Math.cos((lat * Math.PI) / 180), dLat);
}

function outsideAreaOfUse(system: CoordinateSystem, points: RawPoints, box: Box): InputWarning | null {
  const match = /^EPSG:(\d+)$/.exec(system.crs);
  if (!match) return null;
  const definition = epsgDefinition(Number(match[1]));
  const area = definition.areaOfUse;
  if (area === null) return null;
  const centre = lonLatOf(system, (box.minX + box.maxX) / 2, (box.minY + box.maxY) / 2);
  const areaText = `longitude ${area[0]} to ${area[2]}, latitude ${area[1]} to ${area[3]}`;
  const name = `${system.crs} (${definition.name})`;
  if (centre === null) {
    throw inputError(
      `${points.fileName}: the points (${describeBox(box, system.geographic)}) cannot be placed on the globe with ${name}, ` +
        `whose area of use is ${areaText}: give the --crs the coordinates are really in`,
    );
  }
  const distance = degreesOutside(area, centre[0], centre[1]);
  if (distance <= AREA_OF_USE_WARNED_DEGREES) return null;
  const swappedCentre = lonLatOf(system, (box.minY + box.maxY) / 2, (box.minX + box.maxX) / 2);
  const swapped = swappedCentre !== null && degreesOutside(area, swappedCentre[0], swappedCentre[1]) <= AREA_OF_USE_WARNED_DEGREES;
  const where = `the points lie around longitude ${centre[0].toFixed(2)}, latitude ${centre[1].toFixed(2)}, ${distance.toFixed(1)} degrees outside the area of use of ${name} (${areaText})`;
  const todo = swapped
    ? `their ${system.geographic ? 'longitude and latitude' : 'x and y'} look swapped: put ${system.geographic ? 'longitude' : 'x (easting)'} first`
    : 'check --crs: give the code of the system the coordinates are really in';
  if (distance > AREA_OF_USE_REFUSED_DEGREES || swapped) throw inputError(`${points.fileName}: ${where}; ${todo}`);
  return { code: 'outside-area-of-use', message: `${points.fileName}: ${where}; results are distorted there: ${todo}` };
}

/** The reason a polygon's box does not meet the points' box, or null when they meet. */
function otherSystem(system: CoordinateSystem, points: RawPoints, box: Box, polygon: RawPolygonSet, role: string): string | null {
  {
    const area = ringsBox(polygon.rings);
    if (!Number.isFinite(area.minX) || overlaps(area, box)) return null;
    const pointsText = describeBox(box, system.geographic);
    const areaText = describeBox(area, system.geographic);
    let reason: string;
    if (overlaps(area, swap(box))) {
      reason = `the points' ${system.geographic ? 'longitude and latitude' : 'x and y'} look swapped relative to the ${role}: swap the points' columns (or --x/--y), or the polygon's positions`;
    } else if (degreeLike(area, ringValues(polygon.rings)) !== degreeLike(box, points.coordinates)) {
      const degrees = degreeLike(area, ringValues(polygon.rings)) ? `the ${role}` : 'the points';
      reason = `${degrees} look like longitude/latitude and the other like projected metres: give every file in one coordinate system (--crs applies to all of them)`;
    } else {
      return null; // no diagnosis: the later check says the study area holds no point
    }
    return `${polygon.label}: the ${role} (${areaText}) does not overlap the points of ${points.fileName} (${pointsText}): ${reason}`;
  }
}

/**
 * For longitude/latitude data: a polygon with positions far beyond +-180/+-90 (metre-sized, over 1,000) is in
 * another system than the points (checked before the polygon's own checks, whose message names one position).
 */
export function checkPolygonIsLonLat(system: CoordinateSystem, polygon: RawPolygon, role: string, pointsFile: string): void {
  if (!system.geographic) return;
  const rings = polygon.rings.filter(Array.isArray).map((ring) =>
    (ring as unknown[]).filter((p): p is number[] => Array.isArray(p) && typeof p[0] === 'number' && typeof p[1] === 'number'),
  );
  const box = ringsBox(rings);
  const largest = Math.max(Math.abs(box.minX), Math.abs(box.maxX), Math.abs(box.minY), Math.abs(box.maxY));
  // a position just beyond the range is left to the polygon's own check, which names it
  if (!Number.isFinite(box.minX) || insideLonLat(box) || largest < 1000) return;
  throw inputError(
    `${polygon.label}: the ${role} (${describeBox(box, false)}) is not in longitude/latitude, but the points of ` +
      `${pointsFile} are (${system.crs}): give every file in one coordinate system (--crs applies to all of them)`,
  );
}

/**
 * All checks; throws GS_ERR_INPUT for a mistake that would make every result wrong and returns warnings for
 * likely ones.
 */
export function checkCoordinateSanity(
  system: CoordinateSystem,
  points: RawPoints,
  area: RawPolygonSet[],
  zones: RawPolygonSet[],
): InputWarning[] {
  const box = pointsBox(points.coordinates);
  if (!Number.isFinite(box.minX)) return [];
  const warnings: (InputWarning | null)[] = [];
  warnings.push(metresAsDegrees(system, points, box));
  for (const polygon of area) {
    const problem = otherSystem(system, points, box, polygon, 'study area');
    if (problem !== null) throw inputError(problem);
  }
  warnings.push(degreesUnderMetres(system, points, box));
  warnings.push(outsideAreaOfUse(system, points, box));
  // a no-data zone away from every point may be right (a lake in an empty corner): a warning only
  for (const polygon of zones) {
    const problem = otherSystem(system, points, box, polygon, 'no-data zone');
    if (problem !== null) warnings.push({ code: 'zone-away-from-points', message: problem });
  }
  return warnings.filter((warning): warning is InputWarning => warning !== null);
}
