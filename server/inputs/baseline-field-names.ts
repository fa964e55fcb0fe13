/**
 * The numeric properties of a baseline polygon file (issue 15), for the page's field picker: a GeoPackage layer's
 * columns (other than its INTEGER PRIMARY KEY feature id and the geometry) or a GeoJSON file's properties whose value is a number, or a
 * numeric text, in every feature (shared/numeric-properties.ts). Geometry is decoded as when the file is read for a
 * dataset, so a file that is not a readable polygon layer is refused here with the same coded message.
 * Cost O(file size).
 */
import { numericPropertyNames } from '../../shared/numeric-properties.js';
import { baselineError } from '../errors.js';
import { isSqliteFile, readGeoPackageFeatures } from './geopackage/read-geopackage.js';
import { readGeoJson } from './geojson-features.js';
import { readText, type InputFile } from './input-file.js';

export function baselineFieldNames(file: InputFile): string[] {
  const layer = isSqliteFile(file) ? readGeoPackageFeatures(file) : { ...readGeoJson(file.name, readText(file)), idColumn: undefined };
  if (layer.features.length === 0) throw baselineError(`${file.name}: no features to take a count field from`);
  // a GeoPackage's feature id column is an integer in every row but never a population count
  return numericPropertyNames(layer.features.map((feature) => feature.properties ?? null)).filter((name) => name !== layer.idColumn);
}
