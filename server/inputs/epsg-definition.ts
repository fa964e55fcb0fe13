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
}

interface EpsgIndexEntry {
  code: string;
  kind: string;
  name: string;
  proj4: string | null;
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
  return { code, name: entry.name, proj4: entry.proj4, geographic };
}
