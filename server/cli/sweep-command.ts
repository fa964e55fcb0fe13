/**
 * `gridshake sweep`: the quadrat test over many placements and cell sizes, with the placement-robust Monte Carlo
 * test (shared/design.md, "Command line"). Writes placements.csv, summary.json and report.html to --out, shows a
 * progress bar on stderr and prints the per-size conclusions on stdout.
 */
import type { Plan, SweepProgress } from '../../shared/contracts.js';
import { normalizePlan, planShapes, resolveCellSizes } from '../sweeps/plan.js';
import { DEFAULT_PLAN, PLACEMENT_DESIGNS, PLAN_LIMITS, PLAN_RANGE_WORDS } from '../../shared/plan-rules.js';
import { stabilityFileNames } from '../stability/stability-files.js';
import { stabilityLines } from '../stability/stability-notes.js';
import { isAbortError } from '../sweeps/sweep-errors.js';
import { SweepPool } from '../sweeps/sweep-pool.js';
import {
  optionalString,
  parseAlpha,
  parseMinCoverage,
  parseNumber,
  parsePositiveList,
  parseShape,
  parseWholeNumber,
  requireString,
  type OptionSpecs,
  type OptionValues,
} from './args.js';
import type { CliCommand, CliIo } from './cli-command.js';
import { DATASET_OPTIONS, INPUT_LIMIT_OPTIONS, loadDatasetFromFlags } from './dataset-flags.js';
import { checkOutputFolder, SWEEP_OUTPUTS, writeOutputs } from './output-folder.js';
import { LEVEL_OPTIONS } from './level-options.js';
import { progressLine } from './sweep-progress.js';
import { sweepOutputFiles } from './sweep-outputs.js';
import { QUEUE_OPTION, queueFromOptions } from './queue-option.js';
import { insideCount } from '../inputs/inside-points.js';

/** "'halton' (default) or 'lattice'": the designs of shared/plan-rules.ts. */
function designChoices(): string {
  return PLACEMENT_DESIGNS.map((design) => `'${design}'${design === DEFAULT_PLAN.design ? ' (default)' : ''}`).join(' or ');
}

const OPTIONS: OptionSpecs = {
  ...DATASET_OPTIONS,
  cells: { type: 'string', value: 'M,M,...', description: `cell sides in metres (up to ${PLAN_LIMITS.maxCellSizes})` },
  'per-cell': { type: 'string', value: 'K,K,...', description: 'expected points per cell, turned into sides sqrt(K A / n)' },
  placements: { type: 'string', value: 'N', description: `placements per cell size, ${PLAN_RANGE_WORDS.placements}; default ${DEFAULT_PLAN.placements}` },
  'no-rotation': { type: 'boolean', description: 'offsets only, every grid at angle 0' },
  design: { type: 'string', value: 'D', description: `placement design: ${designChoices()}` },
  ...LEVEL_OPTIONS,
  sims: { type: 'string', value: 'R', description: `simulated CSR patterns for the Monte Carlo test, ${PLAN_RANGE_WORDS.sims}; default ${DEFAULT_PLAN.sims}` },
  seed: { type: 'string', value: 'S', description: `seed of the simulations, an integer; default ${DEFAULT_PLAN.seed}` },
  shape: {
    type: 'string',
    value: 'SHAPE',
    description: 'cell shape: square, hex (pointy-top hexagons of area M^2) or square,hex for both on the same placement design; default square',
  },
  out: { type: 'string', value: 'DIR', description: 'folder for placements.csv, summary.json and report.html' },
  threads: { type: 'string', value: 'N', description: 'worker threads; default one per core' },
  ...QUEUE_OPTION,
  ...INPUT_LIMIT_OPTIONS,
};

function planFromFlags(values: OptionValues): Plan {
  const text = (name: string): string | undefined => optionalString(values, name);
  const input: Record<string, unknown> = { rotation: values['no-rotation'] !== true };
  if (text('cells') !== undefined) input.cells = parsePositiveList(text('cells') as string, 'cells');
  if (text('per-cell') !== undefined) input.perCell = parsePositiveList(text('per-cell') as string, 'per-cell');
  if (text('placements') !== undefined) input.placements = parseWholeNumber(text('placements') as string, 'placements', PLAN_LIMITS.placements.min);
  if (text('design') !== undefined) input.design = text('design');
  if (text('min-coverage') !== undefined) input.minCoverage = parseMinCoverage(text('min-coverage') as string);
  if (text('alpha') !== undefined) input.alpha = parseAlpha(text('alpha') as string);
  if (text('sims') !== undefined) input.sims = parseWholeNumber(text('sims') as string, 'sims', PLAN_LIMITS.sims.min);
  if (text('seed') !== undefined) input.seed = parseNumber(text('seed') as string, 'seed', 'an integer');
  const shape = text('shape');
  if (shape !== undefined) {
    const shapes = shape.split(',').map((part) => parseShape(part));
    input.shape = shapes.length === 1 ? shapes[0] : shapes;
  }
  return normalizePlan(input);
}

function progressWriter(io: CliIo): { update(progress: SweepProgress): void; end(): void } {
  let last = 0;
  let shown = false;
  return {
    update(progress) {
      const now = Date.now();
      if (now - last < 100 && progress.done < progress.total) return;
      last = now;
      shown = true;
      io.stderr(`\r${progressLine(progress)}`);
    },
    end() {
      if (shown) io.stderr('\n');
    },
  };
}

async function runSweepCommand(values: OptionValues, io: CliIo): Promise<number> {
  const outDir = requireString(values, 'out');
  const plan = planFromFlags(values);
  const threads = optionalString(values, 'threads');
  const threadCount = threads === undefined ? undefined : parseWholeNumber(threads, 'threads', 1);
  const createOutDir = checkOutputFolder(outDir, SWEEP_OUTPUTS);
  const queue = queueFromOptions(values);
  const dataset = loadDatasetFromFlags(values);
  // the stability files' names depend on the cell sides, known once the dataset is read (--per-cell)
  const shapes = planShapes(plan);
  const sides = resolveCellSizes(plan, dataset.region.area, insideCount(dataset));
  checkOutputFolder(outDir, shapes.flatMap((shape) => sides.flatMap((side) => stabilityFileNames(side, shape, shapes.length > 1))));
  const pool =
    queue === null
      ? new SweepPool({ threads: threadCount })
      : (await import('../queue/queue-runner.js')).queueSweepRunner(queue, null, undefined, (message) => io.stderr(`gridshake sweep: ${message}\n`));
  const controller = new AbortController();
  const onInterrupt = (): void => controller.abort();
  process.once('SIGINT', onInterrupt);
  const progress = progressWriter(io);
  try {
    const result = await pool.runSweep(dataset, plan, { signal: controller.signal, onProgress: progress.update, stability: true });
    const { summary, stability } = result;
    progress.end();
    createOutDir();
    writeOutputs(outDir, sweepOutputFiles(dataset, result));
    // warnings first: a warning that makes a p-value meaningless is read before the p-value; the dataset's
    // warnings (first in the list) in the command line's words
    summary.warnings.forEach((warning, k) => io.stderr(`warning: ${dataset.warnings[k]?.cliMessage ?? warning}\n`));
    const lines = [...summary.sizes.map((size) => size.conclusion), '', summary.conclusion];
    io.stdout(`${[...lines, '', ...stabilityLines(stability)].join('\n')}\n`);
    io.stderr(`wrote placements.csv, summary.json, report.html and the stability surfaces (stability-<side>m.tif, excess-areas-<side>m.geojson) to ${outDir} (${summary.timings.seconds.toFixed(1)} s)\n`);
    return 0;
  } catch (error) {
    progress.end();
    if (isAbortError(error)) {
      io.stderr('gridshake sweep: cancelled; nothing was written\n');
      return 130;
    }
    throw error;
  } finally {
    process.removeListener('SIGINT', onInterrupt);
    await pool.destroy();
  }
}

export const sweepCommand: CliCommand = {
  name: 'sweep',
  summary: 'the test over many grid placements and cell sizes, with a placement-robust Monte Carlo test',
  usage:
    'Usage: gridshake sweep --points F [--area F] [--no-data F]... [--crs planar|EPSG:n] (--cells M,M,... | --per-cell K,K,...)\n' +
    '                       [--placements N] [--no-rotation] [--min-coverage T] [--alpha A] [--sims R] [--seed S]\n' +
    '                       [--shape square|hex|square,hex]\n' +
    '                       [--queue URL] --out DIR',
  options: OPTIONS,
  run: runSweepCommand,
};
