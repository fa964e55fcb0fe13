/**
 * The input-file options that `count` and `sweep` share (points, study area, no-data zones, coordinate system,
 * CSV columns) and the dataset they describe, read from disk and loaded through server/inputs.
 */
import { DEFAULT_BODY_LIMIT, DEFAULT_MAX_POINTS } from '../limits.js';
import type { Dataset } from '../../shared/contracts.js';
import { loadDataset } from '../inputs/index.js';
import {
  optionalString,
  parseMegabytes,
  parseWholeNumber,
  requireString,
  stringList,
  type OptionSpecs,
  type OptionValues,
} from './args.js';
import { DEFAULT_INPUT_LIMITS, readInputFile, type InputLimits } from './read-input-file.js';

export const DATASET_OPTIONS: OptionSpecs = {
  points: { type: 'string', value: 'FILE', description: 'points: CSV with a header row, GeoJSON Point features or a GeoPackage layer' },
  area: { type: 'string', value: 'FILE', description: "study area (GeoJSON or GeoPackage polygons); default: the points' bounding box" },
  'no-data': { type: 'string', multiple: true, value: 'FILE', description: 'no-data zones (GeoJSON or GeoPackage polygons)' },
  crs: { type: 'string', value: 'CRS', description: "'planar' (metres already) or EPSG:n; default: longitude/latitude" },
  x: { type: 'string', value: 'COL', description: 'CSV column of x or longitude' },
  y: { type: 'string', value: 'COL', description: 'CSV column of y or latitude' },
  id: { type: 'string', value: 'COL', description: 'CSV column of record ids; default: id, fid, record, ... or the record number' },
  baseline: {
    type: 'string',
    value: 'FILE',
    description: 'population at risk: polygons (GeoJSON or GeoPackage) with a count in --baseline-field; expected counts follow it instead of area',
  },
  'baseline-field': { type: 'string', value: 'NAME', description: 'the property of the --baseline polygons that holds the counts (residents, households, ...)' },
  controls: { type: 'string', value: 'FILE', description: 'population at risk as control points (same formats as --points); Monte Carlo by random labelling' },
  'skip-bad-rows': { type: 'boolean', description: 'leave out CSV rows whose coordinates are blank or n/a (listed in a warning)' },
};

/** The server's limits on the input files, as options of count and sweep (listed after each command's own). */
export const INPUT_LIMIT_OPTIONS: OptionSpecs = {
  'body-limit': { type: 'string', value: 'MB', description: `largest input file in MB, as the server's upload limit; default ${DEFAULT_BODY_LIMIT / 1048576}` },
  'max-points': { type: 'string', value: 'N', description: `most points in the dataset, as the server's limit; default ${DEFAULT_MAX_POINTS}` },
};

/** The file limits of --body-limit (the CSV line limit is fixed). */
function inputLimits(values: OptionValues): InputLimits {
  const text = optionalString(values, 'body-limit');
  return text === undefined ? DEFAULT_INPUT_LIMITS : { ...DEFAULT_INPUT_LIMITS, fileBytes: parseMegabytes(text, 'body-limit') };
}

/** The dataset named by --points, --area, --no-data, --crs, --x, --y, --id, --skip-bad-rows, --baseline(-field), --controls. */
export function loadDatasetFromFlags(values: OptionValues): Dataset {
  const pointsPath = requireString(values, 'points');
  const areaPath = optionalString(values, 'area');
  const baselinePath = optionalString(values, 'baseline');
  const controlsPath = optionalString(values, 'controls');
  const pointsText = optionalString(values, 'max-points');
  const maxPoints = pointsText === undefined ? DEFAULT_MAX_POINTS : parseWholeNumber(pointsText, 'max-points', 1);
  const limits = inputLimits(values);
  const read = (path: string) => readInputFile(path, limits);
  return loadDataset(
    {
      points: read(pointsPath),
      area: areaPath === undefined ? undefined : read(areaPath),
      noData: stringList(values, 'no-data').map(read),
      baseline: baselinePath === undefined ? undefined : read(baselinePath),
      controls: controlsPath === undefined ? undefined : read(controlsPath),
    },
    {
      crs: optionalString(values, 'crs'),
      x: optionalString(values, 'x'),
      y: optionalString(values, 'y'),
      id: optionalString(values, 'id'),
      skipBadRows: values['skip-bad-rows'] === true,
      baselineField: optionalString(values, 'baseline-field'),
      maxPoints,
    },
  );
}
