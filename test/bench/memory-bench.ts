/**
 * Target 4: peak memory of a sweep on 1e7 points (two threads, 16 placements, 1 size, no sims), measured
 * in a fresh child process as its own peak resident set size (VmHWM of /proc/self/status, which covers the
 * worker threads too; see memory-child.ts for why not getrusage's maxRSS). Target: at most 2 x raw coordinate bytes (n x 16) + 200 MB.
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { mortonSort } from '../../workers/placement/index.js';
import { fillClusteredPoints } from './bench-data.js';
import { pass, printTable } from './bench-table.js';
import { ratioFigure, type TargetFigure } from './targets.js';

const MB = 1024 * 1024;

interface ChildFigures {
  mode: string;
  n: number;
  baseline: number;
  loaded: number;
  sampledPeak: number;
  peak: number;
  seconds: number;
}

/** The worse of the two dataset paths, as a ratio of peak RSS to the limit (target <= 1.0). */
export function runMemoryBench(n = 1e7): TargetFigure {
  const folder = mkdtempSync(join(tmpdir(), 'gridshake-bench-'));
  try {
    const xy = new Float64Array(2 * n);
    fillClusteredPoints(xy, 12);
    const asGiven = join(folder, 'points.f64');
    const sorted = join(folder, 'points-sorted.f64');
    writeFileSync(asGiven, new Uint8Array(xy.buffer));
    writeFileSync(sorted, new Uint8Array(mortonSort(xy).buffer));
    const child = fileURLToPath(new URL('./memory-child.js', import.meta.url));
    const figures = [
      ['copy', asGiven],
      ['shared', sorted],
    ].map(([mode, path]) => JSON.parse(execFileSync(process.execPath, [child, mode, path], { encoding: 'utf8' })) as ChildFigures);
    const raw = n * 16;
    const limit = 2 * raw + 200 * MB;
    printTable(
      `T4. Peak memory, ${n.toExponential(0)} points (raw coordinates ${(raw / MB).toFixed(0)} MB; limit 2 x raw + 200 MB = ${(limit / MB).toFixed(0)} MB)`,
      ['dataset coordinates', 'RSS at start MB', 'after loading MB', 'peak RSS MB', 'peak / limit', 'sweep s', 'status'],
      figures.map((f) => [
        f.mode === 'copy' ? 'plain array, as given (one sorted shared copy)' : 'shared, Morton-sorted (zero copy)',
        f.baseline / MB,
        f.loaded / MB,
        f.peak / MB,
        f.peak / limit,
        f.seconds,
        pass(f.peak <= limit),
      ]),
    );
    const worst = figures.reduce((a, b) => (b.peak > a.peak ? b : a));
    return ratioFigure(worst.peak, limit, 1);
  } finally {
    rmSync(folder, { recursive: true, force: true });
  }
}
