/** EPSG definitions from the epsg-index package (one JSON file per code), read on demand. */
import { createRequire } from 'node:module';
import { parameterError } from '../errors.js';
import { fieldRef } from '../messages/field-names.js';

const require = createRequire(import.meta.url);

export interface EpsgDefinition {
  code: number;
  name: string;
  proj4: string;
  geographic: boolean;
  /** OGC WKT 1 of the system, when the index has it */
  wkt: string | null;
  /** area of use [west, south, east, north] in degrees, when the index has it */
  areaOfUse: [number, number, number, number] | null;
}

interface EpsgIndexEntry {
  code: string;
  kind: string;
  name: string;
  proj4: string | null;
  wkt?: string | null;
  /** [north, west, south, east] in degrees */
  bbox?: number[] | null;
}

/** The definition of `EPSG:code`, or a GS_ERR_PARAMETER when the code is unknown or has no proj4 form. */
export function epsgDefinition(code: number): EpsgDefinition {
  let entry: EpsgIndexEntry;
  try {
    entry = require(`epsg-index/s/${code}.json`) as EpsgIndexEntry;
  } catch {
    throw parameterError(`${fieldRef('crs')}: EPSG:${code} is not a known coordinate reference system`);
  }
  if (!entry.proj4) throw parameterError(`${fieldRef('crs')}: EPSG:${code} (${entry.name}) has no proj4 definition`);
  const geographic = entry.kind === 'CRS-GEOGCRS' || /\+proj=longlat\b/.test(entry.proj4);
  if (!geographic && entry.kind !== 'CRS-PROJCRS') {
    throw parameterError(`${fieldRef('crs')}: EPSG:${code} (${entry.name}) is a ${entry.kind}, not a 2D projected or geographic system`);
  }
  const box = Array.isArray(entry.bbox) && entry.bbox.length === 4 && entry.bbox.every(Number.isFinite) ? entry.bbox : null;
  const areaOfUse: EpsgDefinition['areaOfUse'] = box ? [box[1]!, box[2]!, box[3]!, box[0]!] : null;
  return { code, name: entry.name, proj4: entry.proj4, geographic, wkt: entry.wkt ?? null, areaOfUse };
}
