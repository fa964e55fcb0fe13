/** Points from a CSV, GeoJSON or GeoPackage file, chosen by content (SQLite header) or file name. */
import { readCsvPoints, type CsvReadOptions } from './csv-points.js';
import { readGeoPackageFeatures, isSqliteFile } from './geopackage/read-geopackage.js';
import { pointsFromFeatures, readGeoJsonPoints } from './geojson-points.js';
import { looksLikeGeoJson, readText, type InputFile } from './input-file.js';
import type { RawPoints } from './raw-points.js';

export function readPoints(file: InputFile, columns: CsvReadOptions): RawPoints {
  if (isSqliteFile(file)) {
    const layer = readGeoPackageFeatures(file);
    const points = pointsFromFeatures(file.name, layer.features, 'geopackage');
    return { ...points, kind: layer.crs === undefined ? 'xy' : 'lonlat', declaredCrs: layer.crs };
  }
  const text = readText(file);
  return looksLikeGeoJson(file, text) ? readGeoJsonPoints(file.name, text, columns.id) : readCsvPoints(file.name, text, columns);
}
