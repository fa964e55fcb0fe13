/**
 * `gridshake count`: the quadrat test for one grid placement and one cell size (shared/design.md, command line).
 * Reads the files, builds the dataset, counts through the engine and prints plain words or one JSON object.
 */
import { DEFAULT_PLAN } from '../../shared/plan-rules.js';
import { parameterError } from '../errors.js';
import { insideCoordinates, summarizeDataset } from '../inputs/index.js';
import { assertCellCountWithinLimit } from '../sweeps/plan.js';
import { fieldRef } from '../messages/field-names.js';
import { assertWithinBudget, estimateSweep, workBudgetFromEnv } from '../sweeps/sweep-budget.js';
import { createCellCounter, evaluatePlacement } from '../../workers/placement/index.js';
import { engineErrorOf } from '../../workers/engine-error.js';
import { createBaselineWeigher } from '../../workers/baseline/baseline-weights.js';
import { logPValues } from '../summary/log-p-values.js';
import { DEFAULT_CELL_SHAPE } from '../../workers/lattice/cell-shape.js';
import { latticeOf } from '../../workers/lattice/registry.js';
import {
  parseAlpha,
  parseAngle,
  parseMinCoverage,
  parseOffset,
  parseShape,
  parsePositiveMetres,
  requireString,
  type OptionSpecs,
  type OptionValues,
} from './args.js';
import type { CliCommand, CliIo } from './cli-command.js';
import type { CountResult } from './count-result.js';
import { formatCount } from './format-count.js';
import { DATASET_OPTIONS, INPUT_LIMIT_OPTIONS, loadDatasetFromFlags } from './dataset-flags.js';
import { LEVEL_OPTIONS } from './level-options.js';

/** Defaults of a single count: the sweep plan's, so that count and a sweep's reference placement agree. */
export const COUNT_DEFAULTS = Object.freeze({ minCoverage: DEFAULT_PLAN.minCoverage, alpha: DEFAULT_PLAN.alpha });

const OPTIONS: OptionSpecs = {
  ...DATASET_OPTIONS,
  cell: { type: 'string', value: 'M', description: 'cell side in metres (hexagons: the side of the square of the same area)' },
  shape: { type: 'string', value: 'SHAPE', description: 'cell shape: square or hex (pointy-top hexagons of area M^2); default square' },
  angle: {
    type: 'string',
    value: 'DEG',
    description: 'grid rotation, degrees counter-clockwise in [0, 90) for squares, [0, 60) for hexagons; default 0',
  },
  offset: { type: 'string', value: 'U,V', description: 'grid offset in cell units, each in [0, 1); default 0,0' },
  ...LEVEL_OPTIONS,
  json: { type: 'boolean', description: 'print one JSON object instead of text' },
  ...INPUT_LIMIT_OPTIONS,
};

function countParameters(values: OptionValues) {
  const shape = values.shape === undefined ? DEFAULT_CELL_SHAPE : parseShape(String(values.shape));
  const angle = values.angle === undefined ? 0 : parseAngle(String(values.angle), 'angle', latticeOf(shape).anglePeriod);
  const offset = values.offset === undefined ? { u: 0, v: 0 } : parseOffset(String(values.offset));
  return {
    cellSize: parsePositiveMetres(requireString(values, 'cell'), 'cell'),
    shape,
    placement: { u: offset.u, v: offset.v, angle },
    minCoverage:
      values['min-coverage'] === undefined ? COUNT_DEFAULTS.minCoverage : parseMinCoverage(String(values['min-coverage'])),
    alpha: values.alpha === undefined ? COUNT_DEFAULTS.alpha : parseAlpha(String(values.alpha)),
  };
}

async function runCount(values: OptionValues, io: CliIo): Promise<number> {
  const parameters = countParameters(values);
  const dataset = loadDatasetFromFlags(values);
  // the server's limits on one placement: cells in the valid region (coverage costs O(cells)) and the work budget
  assertCellCountWithinLimit(parameters.cellSize, dataset.region.area, fieldRef('cell'));
  const plan = { ...DEFAULT_PLAN, cells: [parameters.cellSize], placements: 1, sims: 0 };
  assertWithinBudget(estimateSweep(plan, dataset.inside.length, workBudgetFromEnv()));
  const summary = summarizeDataset(dataset);
  const counter = createCellCounter(insideCoordinates(dataset), dataset.origin);
  const keptCells = (): never => {
    throw parameterError(
      `--cell ${parameters.cellSize} m leaves fewer than 2 cells with coverage >= ${parameters.minCoverage} in the ` +
        `valid region (${(summary.validArea / 1e6).toPrecision(4)} km²); use smaller cells or a lower --min-coverage`,
    );
  };
  let evaluated: ReturnType<typeof evaluatePlacement>;
  try {
    const baseline = dataset.baseline === undefined ? undefined : createBaselineWeigher(dataset.baseline.engine, dataset.origin);
    evaluated = evaluatePlacement({ counter, region: dataset.region, origin: dataset.origin, ...parameters, baseline });
  } catch (error) {
    if (engineErrorOf(error)?.code === 'TOO_FEW_KEPT_CELLS') return keptCells();
    throw error;
  }
  if (evaluated.stats.cells < 2) return keptCells();
  const { expectation } = evaluated;
  const result: CountResult = {
    ...evaluated.stats,
    ...logPValues(evaluated.stats),
    pointsOutside: dataset.outsideIds.length,
    pointsInLeftOutCells: dataset.inside.length - evaluated.stats.points,
    pointsTotal: dataset.ids.length,
    expectedFrom: expectation.expectedFrom,
    baselineTotal: expectation.baselineTotal,
    zeroBaselineCells: expectation.zeroBaselineCells,
    pointsInZeroBaselineCells: expectation.pointsInZeroBaselineCells,
    ...(dataset.baseline === undefined ? {} : { baseline: dataset.baseline.info }),
    ...parameters,
    dataset: {
      name: dataset.name,
      crs: dataset.crs,
      projection: dataset.projection,
      projectionUsed: summary.projectionUsed!,
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
    '                       [--baseline F --baseline-field NAME | --controls F]\n' +
    '                       [--shape square|hex] [--angle DEG] [--offset U,V] [--min-coverage T] [--alpha A] [--x COL --y COL] [--json]',
  options: OPTIONS,
  run: runCount,
};
