/** Points from a CSV or GeoJSON file, chosen by file name or content. */
import { readCsvPoints } from './csv-points.js';
import { readGeoJsonPoints } from './geojson-points.js';
import { looksLikeGeoJson, readText, type InputFile } from './input-file.js';
import type { RawPoints } from './raw-points.js';

export function readPoints(file: InputFile, columns: { x?: string; y?: string; id?: string }): RawPoints {
  const text = readText(file);
  return looksLikeGeoJson(file, text) ? readGeoJsonPoints(file.name, text) : readCsvPoints(file.name, text, columns);
}
