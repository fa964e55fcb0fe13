/**
 * The map's projection: the dataset's working coordinates (planar metres) as an OpenLayers projection. A known
 * coordinate system (an EPSG code, or the local azimuthal equal-area projection chosen for longitude/latitude input)
 * is registered with proj4 from the definition the server recorded, so the map can report longitude/latitude and a
 * user's own basemap can be reprojected; nothing is looked up over the network (ol/proj/proj4's EPSG lookup is never
 * called). Planar data without a known system get a plain metre projection.
 */
import proj4 from 'proj4';
import Projection from 'ol/proj/Projection.js';
import { get as getProjection, getPointResolution, transform } from 'ol/proj.js';
import { register } from 'ol/proj/proj4.js';
import type { ProjectionInfo } from '../../../shared/contracts.js';

export interface WorkingProjection {
  projection: Projection;
  /** working coordinates to [longitude, latitude] in degrees, or null when the coordinate system is unknown */
  toLonLat: ((x: number, y: number) => [number, number]) | null;
}

const PLANAR_CODE = 'GRIDSHAKE:PLANAR';

/** The projection code under which a dataset's working coordinates are registered. */
export function projectionCode(info: ProjectionInfo | undefined): string {
  if (!info || info.kind === 'planar') return PLANAR_CODE;
  if (info.kind === 'epsg') return `EPSG:${info.code}`;
  return `GRIDSHAKE:LAEA:${info.lon0}:${info.lat0}`;
}

export function workingProjection(info: ProjectionInfo | undefined): WorkingProjection {
  const code = projectionCode(info);
  if (!info || info.kind === 'planar') {
    const projection = getProjection(code) ?? new Projection({ code, units: 'm' });
    return { projection, toLonLat: null };
  }
  if (!proj4.defs(code)) proj4.defs(code, info.proj4);
  register(proj4);
  const projection = getProjection(code);
  if (!projection) return { projection: new Projection({ code: PLANAR_CODE, units: 'm' }), toLonLat: null };
  return {
    projection,
    toLonLat: (x, y) => {
      const [lon, lat] = transform([x, y], projection, 'EPSG:4326');
      return [lon, lat];
    },
  };
}

/** Metres on the ground per screen pixel at `centre` for a view resolution (map units per pixel). */
export function metresPerPixel(projection: Projection, resolution: number, centre: number[]): number {
  return getPointResolution(projection, resolution, centre, 'm');
}
