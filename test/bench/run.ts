/**
 * `npm run bench`: the performance targets, each a ratio against a reference measured in the same run (the
 * C counting loop of test/bench/c, compiled here when a C compiler is present), plus the engine's kernel, phase
 * and naive-approach tables. Speed is judged here, never in unit tests.
 *   npm run bench                     every table
 *   npm run bench -- sweep|cli|server|memory|kernel|phases|naive|hex|surface|queue   one group (queue: the Redis
 *                                     queue's figures, with a redis-server started on a free loopback port)
 *   npm run -s bench -- --json        the same, tables on stderr and one JSON object alone on stdout (-s keeps npm's own
 *                                     header off it): one key per target
 *                                     (wholeSweep, defaultPlanCli, monteCarlo, peakMemory, serverVsCli, and
 *                                     hexVsSquare: hexagon counting against square counting; surfaceWeight: the
 *                                     stability surface's measured cost per pixel-placement over the budget's
 *                                     SURFACE_PIXEL_WEIGHT), each
 *                                     { ratio, ours, reference, target, met, status }, plus the machine and load
 */
import { availableParallelism, cpus, loadavg, totalmem } from 'node:os';
import { sendTablesTo } from './bench-table.js';
import { buildCReference } from './c-reference.js';
import { runCliBench } from './cli-bench.js';
import { runHexBench } from './hex-bench.js';
import { runKernelBench } from './kernel-bench.js';
import { runMemoryBench } from './memory-bench.js';
import { runNaiveBench } from './naive-bench.js';
import { runPhaseBench } from './phase-bench.js';
import { runServerBench } from './server-bench.js';
import { runQueueBench } from './queue-bench.js';
import { runSurfaceBench } from './surface-bench.js';
import { runSweepBench } from './sweep-bench.js';
import type { TargetFigure, TargetKey } from './targets.js';

const args = process.argv.slice(2);
const json = args.includes('--json');
const only = args.find((arg) => !arg.startsWith('--'));
const wants = (group: string): boolean => only === undefined || only === group;
if (json) sendTablesTo(process.stderr);
const log = json ? process.stderr : process.stdout;

const machine = {
  cpu: cpus()[0]?.model ?? 'unknown CPU',
  cores: availableParallelism(),
  memoryGB: Number((totalmem() / 2 ** 30).toFixed(1)),
  node: process.version,
  loadAverageAtStart: loadavg()[0],
};
log.write(
  `gridshake benchmark on ${machine.cpu}, ${machine.cores} cores, ${machine.memoryGB} GB, Node ${machine.node}; ` +
    `load average ${machine.loadAverageAtStart.toFixed(2)} (figures are only meaningful on an otherwise idle machine)\n`,
);
const { reference, reason } = buildCReference();
log.write(reference === null ? `${reason}\n` : `C reference: ${reference.compiler}\n`);

const targets: Partial<Record<TargetKey, TargetFigure>> = {};
if (wants('kernel')) runKernelBench();
let twoThreadNs = Number.NaN;
if (wants('sweep')) {
  const figures = await runSweepBench(reference);
  twoThreadNs = figures.twoThreadNs;
  targets.wholeSweep = figures.wholeSweep;
  targets.monteCarlo = figures.monteCarlo;
}
if (wants('cli')) targets.defaultPlanCli = runCliBench(reference);
if (wants('server')) targets.serverVsCli = await runServerBench();
if (wants('memory')) targets.peakMemory = runMemoryBench();
if (wants('sweep') || wants('phases')) runPhaseBench();
if (wants('naive')) await runNaiveBench(twoThreadNs);
if (wants('hex')) targets.hexVsSquare = runHexBench();
if (wants('surface')) targets.surfaceWeight = runSurfaceBench();
if (wants('queue')) await runQueueBench();

const loadAverageAtEnd = loadavg()[0];
log.write(`\nload average at the end ${loadAverageAtEnd.toFixed(2)}\n`);
for (const [key, figure] of Object.entries(targets)) log.write(`${key}: ratio ${figure.ratio.toPrecision(3)} (target <= ${figure.target}) ${figure.status}\n`);
if (json) process.stdout.write(`${JSON.stringify({ machine: { ...machine, loadAverageAtEnd }, ...targets })}\n`);
