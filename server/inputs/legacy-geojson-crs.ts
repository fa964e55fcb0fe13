/**
 * The `crs` member of pre-RFC 7946 GeoJSON (the 2008 GeoJSON specification, section 3): RFC 7946 (section 4)
 * dropped it and fixes longitude/latitude, but GIS exports still write it for projected data. A named CRS that
 * gives an EPSG code ("EPSG:27700", "urn:ogc:def:crs:EPSG::27700") is honoured; OGC CRS84 means
 * longitude/latitude (EPSG:4326 axis order lon, lat); anything else (a link, an unknown name) is refused with how
 * to declare the system instead of being ignored.
 */
import { inputError } from '../errors.js';
import { twoWays } from '../messages/field-names.js';

const EPSG_NAME = /^(?:urn:ogc:def:crs:EPSG:[\d.]*:|EPSG:{1,2}|http:\/\/www\.opengis\.net\/def\/crs\/EPSG\/[\d.]+\/)(\d{4,6})$/i;
const CRS84_NAME = /^urn:ogc:def:crs:OGC:(?:1\.3:)?CRS84$|^(?:OGC:)?CRS84$|^http:\/\/www\.opengis\.net\/def\/crs\/OGC\/1\.3\/CRS84$/i;

function isObject(value: unknown): value is Record<string, unknown> {
  return typeof value === 'object' && value !== null && !Array.isArray(value);
}

/** 'EPSG:n' for a legacy crs member naming a code, undefined when there is no member; throws for any other. */
export function legacyGeoJsonCrs(fileName: string, member: unknown): string | undefined {
  if (member === undefined || member === null) return undefined;
  if (isObject(member) && isObject(member.properties)) {
    const properties = member.properties;
    if (member.type === 'name' && typeof properties.name === 'string') {
      const name = properties.name.trim();
      if (CRS84_NAME.test(name)) return 'EPSG:4326';
      const match = EPSG_NAME.exec(name);
      if (match) return `EPSG:${Number(match[1])}`;
    }
    if (member.type === 'EPSG' && (typeof properties.code === 'number' || typeof properties.code === 'string') && /^\d{4,6}$/.test(String(properties.code))) {
      return `EPSG:${Number(properties.code)}`;
    }
  }
  const shown = JSON.stringify(member).slice(0, 160);
  throw inputError(
    `${fileName}: the GeoJSON "crs" member ${shown} names no EPSG code, so the coordinate system is unknown; ` +
      `remove the member and ${twoWays('give --crs EPSG:n (or --crs planar)', 'choose the system in the "Coordinate system" field')}, ` +
      'or export the file again as RFC 7946 GeoJSON (longitude/latitude)',
  );
}
