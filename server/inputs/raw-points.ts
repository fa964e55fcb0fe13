/** Points as read from a file, before any projection: raw coordinates, ids and where each record came from. */
import type { CoordinateKind } from './column-names.js';

export interface RawPoints {
  fileName: string;
  format: 'csv' | 'geojson' | 'geopackage';
  /** the coordinate system the file itself declares (a GeoPackage layer's EPSG code), if any */
  declaredCrs?: string;
  /** raw coordinates as written in the file, interleaved x,y (or lon,lat) */
  coordinates: Float64Array;
  ids: string[];
  /** what the column names (CSV) or the format (GeoJSON: RFC 7946) say about the coordinates */
  kind: CoordinateKind;
  /** the file and line (CSV) or feature (GeoJSON) of record `index`, for messages */
  locate(index: number): string;
  /** CSV lines left out because their coordinates were blank or n/a (only with skipBadRows) */
  skippedLines?: number[];
}
