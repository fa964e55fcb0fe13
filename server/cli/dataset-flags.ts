/**
 * The input-file options that `count` and `sweep` share (points, study area, no-data zones, coordinate system,
 * CSV columns) and the dataset they describe, read from disk and loaded through server/inputs.
 */
import type { Dataset } from '../contracts.js';
import { loadDataset } from '../inputs/index.js';
import { optionalString, requireString, stringList, type OptionSpecs, type OptionValues } from './args.js';
import { readInputFile } from './read-input-file.js';

export const DATASET_OPTIONS: OptionSpecs = {
  points: { type: 'string', value: 'FILE', description: 'points: CSV with a header row, GeoJSON Point features or a GeoPackage layer' },
  area: { type: 'string', value: 'FILE', description: "study area (GeoJSON or GeoPackage polygons); default: the points' bounding box" },
  'no-data': { type: 'string', multiple: true, value: 'FILE', description: 'no-data zones (GeoJSON or GeoPackage polygons)' },
  crs: { type: 'string', value: 'CRS', description: "'planar' (metres already) or EPSG:n; default: longitude/latitude" },
  x: { type: 'string', value: 'COL', description: 'CSV column of x or longitude' },
  y: { type: 'string', value: 'COL', description: 'CSV column of y or latitude' },
  id: { type: 'string', value: 'COL', description: 'CSV column of record ids; default: id, fid, record, ... or the record number' },
};

/** The dataset named by --points, --area, --no-data, --crs, --x, --y and --id. */
export function loadDatasetFromFlags(values: OptionValues): Dataset {
  const areaPath = optionalString(values, 'area');
  return loadDataset(
    {
      points: readInputFile(requireString(values, 'points')),
      area: areaPath === undefined ? undefined : readInputFile(areaPath),
      noData: stringList(values, 'no-data').map(readInputFile),
    },
    { crs: optionalString(values, 'crs'), x: optionalString(values, 'x'), y: optionalString(values, 'y'), id: optionalString(values, 'id') },
  );
}
