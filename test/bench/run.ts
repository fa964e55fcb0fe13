/**
 * `npm run bench`: the six measurements of the sweep engine, each printed as a table with ratios against a
 * baseline measured in the same run, and the targets beside the figures. Speed is judged here, never in unit tests.
 */
import { availableParallelism, cpus, loadavg, totalmem } from 'node:os';
import { runHexBench } from './hex-bench.js';
import { runKernelBench } from './kernel-bench.js';
import { runMemoryBench } from './memory-bench.js';
import { runNaiveBench } from './naive-bench.js';
import { runPhaseBench } from './phase-bench.js';
import { runSweepBench } from './sweep-bench.js';

const only = process.argv[2];
process.stdout.write(
  `gridshake benchmark on ${cpus()[0]?.model ?? 'unknown CPU'}, ${availableParallelism()} cores, ` +
    `${(totalmem() / 2 ** 30).toFixed(1)} GB, Node ${process.version}; load average ${loadavg()[0].toFixed(2)} ` +
    '(figures are only meaningful on an otherwise idle machine)\n',
);
if (only === undefined || only === 'kernel') runKernelBench();
let twoThreadNs = Number.NaN;
if (only === undefined || only === 'sweep') twoThreadNs = (await runSweepBench()).twoThreadNs;
if (only === undefined || only === 'sweep' || only === 'phases') runPhaseBench();
if (only === undefined || only === 'naive') await runNaiveBench(twoThreadNs);
if (only === undefined || only === 'memory') runMemoryBench();
if (only === undefined || only === 'hex') runHexBench();
