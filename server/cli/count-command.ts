/**
 * `gridshake count`: the quadrat test for one grid placement and one cell size (shared/design.md, command line).
 * Reads the files, builds the dataset, counts through the engine and prints plain words or one JSON object.
 */
import { DEFAULT_PLAN, PLAN_LIMITS, PLAN_RANGE_WORDS } from '../../shared/plan-rules.js';
import { smallestWorkingSims } from '../../shared/monte-carlo-rule.js';
import { labellingMonteCarlo } from '../../workers/baseline/labelling-test.js';
import { pixelCellLocator } from '../../workers/stability/pixel-cells.js';
import { monteCarloPValue } from '../summary/monte-carlo-p-value.js';
import { parameterError } from '../errors.js';
import { insideCoordinates, insideCount, summarizeDataset } from '../inputs/index.js';
import { assertCellCountWithinLimit } from '../sweeps/plan.js';
import { fieldRef } from '../messages/field-names.js';
import { assertWithinBudget, estimateSweep, workBudgetFromEnv } from '../sweeps/sweep-budget.js';
import { createCellCounter, evaluatePlacement } from '../../workers/placement/index.js';
import { engineErrorOf } from '../../workers/engine-error.js';
import { createBaselineWeigher } from '../../workers/baseline/baseline-weights.js';
import { baselineSize } from '../../workers/baseline/baseline.js';
import { logPValues } from '../summary/log-p-values.js';
import { DEFAULT_CELL_SHAPE, type CellShape } from '../../workers/lattice/cell-shape.js';
import type { GridExtent, KeptCells, Origin, Placement } from '../../workers/types.js';
import { latticeOf } from '../../workers/lattice/registry.js';
import {
  parseAlpha,
  parseAngle,
  parseMinCoverage,
  parseNumber,
  parseOffset,
  parseWholeNumber,
  parseShape,
  parsePositiveMetres,
  requireString,
  type OptionSpecs,
  type OptionValues,
} from './args.js';
import type { CliCommand, CliIo } from './cli-command.js';
import type { CountMonteCarlo, CountResult } from './count-result.js';
import { formatCount } from './format-count.js';
import { DATASET_OPTIONS, INPUT_LIMIT_OPTIONS, loadDatasetFromFlags } from './dataset-flags.js';
import { LEVEL_OPTIONS } from './level-options.js';

/**
 * Random labellings of count's Monte Carlo test against controls by default: 999 gives p-values in steps of 0.001,
 * fine enough for alpha 0.05 and 0.01 (common practice for Monte Carlo tests, e.g. Diggle 2003).
 */
export const COUNT_CONTROL_SIMS = 999;

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
  sims: {
    type: 'string',
    value: 'R',
    description: `with --controls: random labellings of the Monte Carlo test, ${PLAN_RANGE_WORDS.sims} and enough to reject at alpha; default ${COUNT_CONTROL_SIMS}`,
  },
  seed: { type: 'string', value: 'S', description: `with --controls: seed of the random labellings, an integer; default ${DEFAULT_PLAN.seed}` },
  json: { type: 'boolean', description: 'print one JSON object instead of text' },
  ...INPUT_LIMIT_OPTIONS,
};

/** --sims and --seed: only with --controls (the random-labelling test); R enough to reject at alpha. */
function labellingParameters(values: OptionValues, alpha: number): { sims: number; seed: number } | null {
  if (values.controls === undefined) {
    for (const name of ['sims', 'seed']) {
      if (values[name] !== undefined) {
        throw parameterError(`--${name} applies only with --controls (the random-labelling Monte Carlo test); the count against area or baseline polygons is the chi-square test`);
      }
    }
    return null;
  }
  const sims = values.sims === undefined ? COUNT_CONTROL_SIMS : parseWholeNumber(String(values.sims), 'sims', PLAN_LIMITS.sims.min);
  if (sims > PLAN_LIMITS.sims.max || sims < smallestWorkingSims(alpha)) {
    throw parameterError(
      `--sims ${sims}: count --controls needs ${smallestWorkingSims(alpha)} to ${PLAN_LIMITS.sims.max} random labellings at alpha ${alpha} ` +
        '(fewer could never give a p-value at or below alpha)',
    );
  }
  const seed = values.seed === undefined ? DEFAULT_PLAN.seed : parseNumber(String(values.seed), 'seed', 'an integer');
  if (!Number.isSafeInteger(seed)) throw parameterError(`--seed ${values.seed}: the seed must be an integer`);
  return { sims, seed };
}

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
  const labelling = labellingParameters(values, parameters.alpha);
  const dataset = loadDatasetFromFlags(values);
  // the server's limits on one placement: cells in the valid region (coverage costs O(cells)) and the work budget
  assertCellCountWithinLimit(parameters.cellSize, dataset.region.area, fieldRef('cell'));
  const plan = { ...DEFAULT_PLAN, cells: [parameters.cellSize], placements: 1, sims: labelling?.sims ?? 0 };
  assertWithinBudget(estimateSweep(plan, insideCount(dataset), workBudgetFromEnv(), {
    baseline: dataset.baseline === undefined ? undefined : baselineSize(dataset.baseline.engine),
  }));
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
  const monteCarlo = labelling === null ? undefined : labellingTest(dataset, parameters, evaluated, labelling);
  const result: CountResult = {
    ...evaluated.stats,
    ...logPValues(evaluated.stats),
    pointsOutside: dataset.outsideIds.length,
    pointsInLeftOutCells: insideCount(dataset) - evaluated.stats.points,
    pointsTotal: dataset.ids.length,
    expectedFrom: expectation.expectedFrom,
    baselineTotal: expectation.baselineTotal,
    zeroBaselineCells: expectation.zeroBaselineCells,
    pointsInZeroBaselineCells: expectation.pointsInZeroBaselineCells,
    ...(dataset.baseline === undefined ? {} : { baseline: dataset.baseline.info }),
    ...(monteCarlo === undefined ? {} : { monteCarlo }),
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

/** What the labelling test of one placement needs (count-command builds it from the dataset and the evaluation). */
export interface CountLabellingInput {
  cases: Float64Array;
  controls: Float64Array;
  shape: CellShape;
  origin: Origin;
  cellSize: number;
  placement: Placement;
  grid: GridExtent;
  coverageKept: KeptCells;
  alpha: number;
  sims: number;
  seed: number;
}

/**
 * The random-labelling Monte Carlo test of the counted placement (workers/baseline/labelling-test.ts): Monte Carlo p
 * on both tails (Besag and Diggle 1977) and the two-sided verdict at alpha (each tail at alpha/2, as the chi-square
 * verdict). Calibrated by test/stress/count-labelling-calibration.test.ts.
 */
export function countLabellingTest(input: CountLabellingInput): CountMonteCarlo {
  const { grid } = input;
  const { observed, simulated } = labellingMonteCarlo({
    cases: input.cases,
    controls: input.controls,
    locate: pixelCellLocator(input.shape, input.origin, input.cellSize, input.placement, grid),
    gridCells: grid.nx * grid.ny,
    coverageKept: input.coverageKept,
    sims: input.sims,
    seed: input.seed,
  });
  const pClustered = monteCarloPValue(observed, simulated, 'upper');
  const pRegular = monteCarloPValue(observed, simulated, 'lower');
  const half = input.alpha / 2;
  const verdict = pClustered <= half ? 'clustered' : pRegular <= half ? 'regular' : 'csr';
  return { test: 'random labelling', sims: input.sims, seed: input.seed, statistic: 'chi2/df', observed, pClustered, pRegular, verdict };
}

function labellingTest(
  dataset: ReturnType<typeof loadDatasetFromFlags>,
  parameters: ReturnType<typeof countParameters>,
  evaluated: ReturnType<typeof evaluatePlacement>,
  labelling: { sims: number; seed: number },
): CountMonteCarlo {
  const engine = dataset.baseline!.engine;
  const coverageKept = evaluated.expectation.coverageKept;
  if (engine.kind !== 'controls' || coverageKept === undefined) throw new Error('the labelling test needs controls');
  return countLabellingTest({
    cases: insideCoordinates(dataset),
    controls: engine.controls,
    origin: dataset.origin,
    grid: evaluated.grid,
    coverageKept,
    ...parameters,
    ...labelling,
  });
}

export const countCommand: CliCommand = {
  name: 'count',
  summary: 'the quadrat test for one grid placement and one cell size',
  usage:
    'Usage: gridshake count --points F [--area F] [--no-data F]... [--crs planar|EPSG:n] --cell M\n' +
    '                       [--baseline F --baseline-field NAME | --controls F [--sims R] [--seed S]]\n' +
    '                       [--shape square|hex] [--angle DEG] [--offset U,V] [--min-coverage T] [--alpha A] [--x COL --y COL] [--json]',
  options: OPTIONS,
  run: runCount,
};
