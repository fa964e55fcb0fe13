/**
 * How input coordinates become planar metres.
 *
 * Rule (documented in the README): `--crs planar` means the coordinates are metres in a projected system already;
 * `--crs EPSG:n` names the system (a projected one is kept, converted to metres if its unit is feet; a geographic
 * one, e.g. EPSG:4326, means longitude/latitude). Without --crs, GeoJSON is RFC 7946 longitude/latitude and a CSV
 * is longitude/latitude when its columns are named so (lon/lat, longitude/latitude, lng); a CSV with x/y or
 * easting/northing columns must say its system with --crs, because guessing a projected system silently would
 * give wrong areas and cell sizes. Longitude/latitude is projected with a Lambert azimuthal equal-area projection
 * centred on the data, so that areas, and hence expected counts, are right.
 */
import proj4 from 'proj4';
import type { ProjectionInfo } from '../../shared/contracts.js';
import { inputError, parameterError } from '../errors.js';
import type { CoordinateKind } from './column-names.js';
import { epsgDefinition } from './epsg-definition.js';
import { fieldRef, twoWays } from '../messages/field-names.js';

const WGS84_LONLAT = '+proj=longlat +datum=WGS84 +no_defs';

export interface CoordinateSystem {
  /** the input system as the user would name it: 'planar', 'EPSG:n' */
  crs: string;
  /** true when the input coordinates are longitude/latitude (checked against +-180 / +-90) */
  geographic: boolean;
  /** for geographic input: its proj4 source definition (datum), projected to LAEA once the centre is known */
  sourceProj4: string;
  /** for projected input: metres per coordinate unit */
  toMetre: number;
  warnings: string[];
}

/** The input system from the --crs option and what the points file says about its coordinates. */
export function resolveCoordinateSystem(crs: string | undefined, kind: CoordinateKind, pointsName: string): CoordinateSystem {
  if (crs === undefined || crs.trim() === '') {
    if (kind === 'xy') {
      throw inputError(
        `${pointsName}: line 1: the coordinate columns look projected (x/y or easting/northing), so the coordinate ` +
          `system must be given: ${twoWays('--crs planar when they are metres already, or --crs EPSG:n', 'in the "Coordinate system" field, "planar metres" when they are metres already, or their EPSG code')}`,
      );
    }
    return { crs: 'EPSG:4326', geographic: true, sourceProj4: WGS84_LONLAT, toMetre: 1, warnings: [] };
  }
  const text = crs.trim();
  if (text.toLowerCase() === 'planar') {
    return { crs: 'planar', geographic: false, sourceProj4: '', toMetre: 1, warnings: [] };
  }
  const match = /^epsg:(\d{4,6})$/i.exec(text);
  if (!match) throw parameterError(`${fieldRef('crs')} must be 'planar' or 'EPSG:n', got '${crs}'`);
  const definition = epsgDefinition(Number(match[1]));
  const name = `EPSG:${definition.code}`;
  if (definition.geographic) {
    return { crs: name, geographic: true, sourceProj4: definition.proj4, toMetre: 1, warnings: [] };
  }
  const projection = proj4.Proj(definition.proj4) as unknown as { to_meter?: number; projName?: string };
  const warnings: string[] = [];
  if (projection.projName === 'merc') {
    warnings.push(
      `${name} (${definition.name}) is a Mercator projection: areas are not preserved, so expected counts and ` +
        'cell sizes are distorted away from its standard parallel; prefer an equal-area system or longitude/latitude',
    );
  }
  return { crs: name, geographic: false, sourceProj4: definition.proj4, toMetre: projection.to_meter ?? 1, warnings };
}

/** The proj4 definition of the Lambert azimuthal equal-area projection centred at (lon0, lat0). */
export function laeaDefinition(lon0: number, lat0: number): string {
  return `+proj=laea +lat_0=${lat0} +lon_0=${lon0} +x_0=0 +y_0=0 +datum=WGS84 +units=m +no_defs`;
}

export interface Projector {
  info: ProjectionInfo;
  /** planar metres of an input position */
  forward(x: number, y: number): [number, number];
}

/**
 * The projector for a resolved system; for geographic input `centre` is the centre (lon, lat) of the data's
 * bounding box, rounded to 1e-6 degree so that the definition reads well.
 */
export function makeProjector(system: CoordinateSystem, centre: [number, number]): Projector {
  if (system.geographic) {
    const lon0 = Math.round(centre[0] * 1e6) / 1e6;
    const lat0 = Math.round(centre[1] * 1e6) / 1e6;
    const target = laeaDefinition(lon0, lat0);
    const converter = proj4(system.sourceProj4, target);
    return {
      info: { kind: 'laea', lon0, lat0, proj4: target },
      forward: (x, y) => converter.forward([x, y]) as [number, number],
    };
  }
  if (system.crs === 'planar') return { info: { kind: 'planar' }, forward: (x, y) => [x, y] };
  const toMetre = system.toMetre;
  return {
    info: { kind: 'epsg', code: Number(system.crs.slice(5)), proj4: system.sourceProj4 },
    forward: (x, y) => [x * toMetre, y * toMetre],
  };
}
