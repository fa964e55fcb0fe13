/**
 * `gridshake count`: the quadrat test for one grid placement and one cell size (shared/design.md, command line).
 * Reads the files, builds the dataset, counts through the engine and prints plain words or one JSON object.
 */
import { DEFAULT_PLAN } from '../contracts.js';
import { parameterError } from '../errors.js';
import { loadDataset, summarizeDataset } from '../inputs/index.js';
import { createCellCounter, evaluatePlacement } from '../../workers/placement/index.js';
import {
  optionalString,
  parseAlpha,
  parseAngle,
  parseMinCoverage,
  parseOffset,
  parsePositiveMetres,
  requireString,
  stringList,
  type OptionSpecs,
  type OptionValues,
} from './args.js';
import type { CliCommand, CliIo } from './cli-command.js';
import type { CountResult } from './count-result.js';
import { formatCount } from './format-count.js';
import { readInputFile } from './read-input-file.js';

/** Defaults of a single count: the sweep plan's, so that count and a sweep's reference placement agree. */
export const COUNT_DEFAULTS = Object.freeze({ minCoverage: DEFAULT_PLAN.minCoverage, alpha: DEFAULT_PLAN.alpha });

const OPTIONS: OptionSpecs = {
  points: { type: 'string', value: 'FILE', description: 'points: CSV with a header row, or GeoJSON Point features' },
  area: { type: 'string', value: 'FILE', description: "study area (GeoJSON polygons); default: the points' bounding box" },
  'no-data': { type: 'string', multiple: true, value: 'FILE', description: 'no-data zones (GeoJSON polygons)' },
  crs: { type: 'string', value: 'CRS', description: "'planar' (metres already) or EPSG:n; default: longitude/latitude" },
  cell: { type: 'string', value: 'M', description: 'cell side in metres' },
  angle: { type: 'string', value: 'DEG', description: 'grid rotation, degrees counter-clockwise in [0, 90); default 0' },
  offset: { type: 'string', value: 'U,V', description: 'grid offset in cell units, each in [0, 1); default 0,0' },
  'min-coverage': { type: 'string', value: 'T', description: 'least share of a cell in the valid region, (0, 1]; default 0.5' },
  alpha: { type: 'string', value: 'A', description: 'two-sided significance level, (0, 0.5]; default 0.05' },
  x: { type: 'string', value: 'COL', description: 'CSV column of x or longitude' },
  y: { type: 'string', value: 'COL', description: 'CSV column of y or latitude' },
  id: { type: 'string', value: 'COL', description: 'CSV column of record ids; default: id, fid, record, ... or the record number' },
  json: { type: 'boolean', description: 'print one JSON object instead of text' },
};

function countParameters(values: OptionValues) {
  const angle = values.angle === undefined ? 0 : parseAngle(String(values.angle));
  const offset = values.offset === undefined ? { u: 0, v: 0 } : parseOffset(String(values.offset));
  return {
    cellSize: parsePositiveMetres(requireString(values, 'cell'), 'cell'),
    placement: { u: offset.u, v: offset.v, angle },
    minCoverage:
      values['min-coverage'] === undefined ? COUNT_DEFAULTS.minCoverage : parseMinCoverage(String(values['min-coverage'])),
    alpha: values.alpha === undefined ? COUNT_DEFAULTS.alpha : parseAlpha(String(values.alpha)),
  };
}

/** Coordinates of the points inside the valid region only: the engine never sees the others. */
function insideCoordinates(xy: Float64Array, inside: Uint32Array): Float64Array {
  const result = new Float64Array(inside.length * 2);
  inside.forEach((index, k) => {
    result[2 * k] = xy[2 * index];
    result[2 * k + 1] = xy[2 * index + 1];
  });
  return result;
}

async function runCount(values: OptionValues, io: CliIo): Promise<number> {
  const pointsPath = requireString(values, 'points');
  const parameters = countParameters(values);
  const areaPath = optionalString(values, 'area');
  const dataset = loadDataset(
    {
      points: readInputFile(pointsPath),
      area: areaPath === undefined ? undefined : readInputFile(areaPath),
      noData: stringList(values, 'no-data').map(readInputFile),
    },
    { crs: optionalString(values, 'crs'), x: optionalString(values, 'x'), y: optionalString(values, 'y'), id: optionalString(values, 'id') },
  );
  const summary = summarizeDataset(dataset);
  const counter = createCellCounter(insideCoordinates(dataset.xy, dataset.inside), dataset.origin);
  const keptCells = (): never => {
    throw parameterError(
      `--cell ${parameters.cellSize} m leaves fewer than 2 cells with coverage >= ${parameters.minCoverage} in the ` +
        `valid region (${(summary.validArea / 1e6).toPrecision(4)} km^2); use smaller cells or a lower --min-coverage`,
    );
  };
  let evaluated: ReturnType<typeof evaluatePlacement>;
  try {
    evaluated = evaluatePlacement({ counter, region: dataset.region, origin: dataset.origin, ...parameters });
  } catch (error) {
    if (error instanceof RangeError && /at least 2/.test(error.message)) return keptCells();
    throw error;
  }
  if (evaluated.stats.cells < 2) return keptCells();
  const result: CountResult = {
    ...evaluated.stats,
    pointsOutside: dataset.outsideIds.length,
    pointsInLeftOutCells: dataset.inside.length - evaluated.stats.points,
    pointsTotal: dataset.ids.length,
    ...parameters,
    dataset: {
      name: dataset.name,
      crs: dataset.crs,
      projection: dataset.projection,
      validArea: summary.validArea,
      studyAreaArea: summary.studyAreaArea,
      areaIsDefault: dataset.areaIsDefault,
      suggestedCellSizes: summary.suggestedCellSizes,
    },
    warnings: dataset.warnings,
  };
  io.stdout(values.json === true ? `${JSON.stringify(result, null, 2)}\n` : formatCount(result));
  return 0;
}

export const countCommand: CliCommand = {
  name: 'count',
  summary: 'the quadrat test for one grid placement and one cell size',
  usage:
    'Usage: gridshake count --points F [--area F] [--no-data F]... [--crs planar|EPSG:n] --cell M\n' +
    '                       [--angle DEG] [--offset U,V] [--min-coverage T] [--alpha A] [--x COL --y COL] [--json]',
  options: OPTIONS,
  run: runCount,
};
