/**
 * What the working coordinates (planar metres) of a dataset are, for the grid exports: the proj4 definition of the
 * working system, the inverse to RFC 7946 longitude/latitude (WGS 84) when the system is known, and the spatial
 * reference system row a GeoPackage needs (an EPSG code, or the local equal-area projection's WKT).
 */
import proj4 from 'proj4';
import type { ProjectionInfo } from '../../shared/contracts.js';
import { describeProjection, metresPerUnit } from '../inputs/describe-projection.js';
import { epsgDefinition } from '../inputs/epsg-definition.js';

const WGS84 = '+proj=longlat +datum=WGS84 +no_defs';

/** srs_id of the local equal-area projection in a GeoPackage: outside the EPSG range, as the standard allows. */
export const LOCAL_SRS_ID = 100001;

export interface WorkingSystem {
  /** working metres -> [lon, lat] in WGS 84; null when the system is unknown (crs planar) */
  toLonLat: ((x: number, y: number) => [number, number]) | null;
  /** [lon, lat] in WGS 84 -> working metres (the inverse of toLonLat) */
  fromLonLat: ((lon: number, lat: number) => [number, number]) | null;
  /** one line that says what the working coordinates are, with the full proj4 definition */
  description: string;
  /** working metres -> the GeoPackage's coordinates (the EPSG system's own unit, or the working metres) */
  toStored: (x: number, y: number) => [number, number];
  srs: { srsId: number; name: string; organization: string; organizationId: number; definition: string; description: string };
}

/**
 * WKT 1 (OGC 01-009) of the Lambert azimuthal equal-area projection centred at (lon0, lat0) on WGS 84, in metres,
 * the same projection as `+proj=laea +lat_0 +lon_0 +x_0=0 +y_0=0 +datum=WGS84 +units=m`.
 */
export function laeaWkt(lon0: number, lat0: number): string {
  return (
    `PROJCS["gridshake local equal-area (lat0 ${lat0}, lon0 ${lon0})",` +
    'GEOGCS["WGS 84",DATUM["WGS_1984",SPHEROID["WGS 84",6378137,298.257223563,AUTHORITY["EPSG","7030"]],' +
    'AUTHORITY["EPSG","6326"]],PRIMEM["Greenwich",0,AUTHORITY["EPSG","8901"]],' +
    'UNIT["degree",0.0174532925199433,AUTHORITY["EPSG","9122"]],AUTHORITY["EPSG","4326"]],' +
    'PROJECTION["Lambert_Azimuthal_Equal_Area"],' +
    `PARAMETER["latitude_of_center",${lat0}],PARAMETER["longitude_of_center",${lon0}],` +
    'PARAMETER["false_easting",0],PARAMETER["false_northing",0],' +
    'UNIT["metre",1,AUTHORITY["EPSG","9001"]],AXIS["Easting",EAST],AXIS["Northing",NORTH]]'
  );
}

export function workingSystem(projection: ProjectionInfo): WorkingSystem {
  const description = describeProjection(projection);
  if (projection.kind === 'laea') {
    const converter = proj4(WGS84, projection.proj4);
    return {
      toLonLat: (x, y) => converter.inverse([x, y]) as [number, number],
      fromLonLat: (lon, lat) => converter.forward([lon, lat]) as [number, number],
      description,
      toStored: (x, y) => [x, y],
      srs: {
        srsId: LOCAL_SRS_ID,
        name: `gridshake local equal-area (lat0 ${projection.lat0}, lon0 ${projection.lon0})`,
        organization: 'gridshake',
        organizationId: LOCAL_SRS_ID,
        definition: laeaWkt(projection.lon0, projection.lat0),
        description: projection.proj4,
      },
    };
  }
  if (projection.kind === 'epsg') {
    const unit = metresPerUnit(projection.proj4);
    const converter = proj4(WGS84, projection.proj4);
    const definition = epsgDefinition(projection.code);
    return {
      toLonLat: (x, y) => converter.inverse([x / unit, y / unit]) as [number, number],
      fromLonLat: (lon, lat) => {
        const [x, y] = converter.forward([lon, lat]) as [number, number];
        return [x * unit, y * unit];
      },
      description,
      toStored: (x, y) => [x / unit, y / unit],
      srs: {
        srsId: projection.code,
        name: definition.name,
        organization: 'EPSG',
        organizationId: projection.code,
        definition: definition.wkt ?? 'undefined',
        description: projection.proj4,
      },
    };
  }
  return {
    toLonLat: null,
    fromLonLat: null,
    description,
    toStored: (x, y) => [x, y],
    srs: {
      srsId: -1,
      name: 'Undefined Cartesian SRS',
      organization: 'NONE',
      organizationId: -1,
      definition: 'undefined',
      description: 'undefined Cartesian coordinate reference system (input given as crs planar)',
    },
  };
}
