/**
 * Child process of measurement 5: loads n points (raw float64 x, y, all inside the valid region) from a file
 * straight into memory, runs a sweep on two threads and prints the process's peak resident set size as JSON.
 * Mode 'copy': a plain Float64Array in the given order (the pool makes one Morton-sorted shared copy).
 * Mode 'shared': the file is already Morton-sorted and is read into a SharedArrayBuffer (the pool shares it as is).
 */
import { closeSync, fstatSync, openSync, readFileSync, readSync } from 'node:fs';
import { normalizePlan } from '../../server/sweeps/plan.js';
import { SweepPool } from '../../server/sweeps/sweep-pool.js';
import { benchDataset, cellSideForExpected } from './bench-data.js';

function readCoordinates(path: string, shared: boolean): Float64Array {
  const fd = openSync(path, 'r');
  try {
    const size = fstatSync(fd).size;
    const buffer = shared ? new SharedArrayBuffer(size) : new ArrayBuffer(size);
    const bytes = new Uint8Array(buffer);
    let offset = 0;
    while (offset < size) offset += readSync(fd, bytes, offset, Math.min(1 << 26, size - offset), offset);
    return new Float64Array(buffer);
  } finally {
    closeSync(fd);
  }
}

/**
 * This process's own peak resident set size in bytes, threads included: Linux's VmHWM (/proc/self/status), the
 * high-water mark of this address space. Not getrusage's maxRSS: Linux carries that across fork and exec, so a child
 * started by a parent holding 900 MB reported the parent's 900 MB (proc(5), "VmHWM"; getrusage(2), "ru_maxrss").
 * Other systems: maxRSS, which is then at least an upper bound.
 */
function peakResidentBytes(): number {
  try {
    const line = readFileSync('/proc/self/status', 'utf8')
      .split('\n')
      .find((text) => text.startsWith('VmHWM:'));
    const kB = line === undefined ? Number.NaN : Number(/(\d+)\s*kB/.exec(line)?.[1]);
    if (Number.isFinite(kB)) return kB * 1024;
  } catch {
    // no /proc: fall back below
  }
  return process.resourceUsage().maxRSS * 1024;
}

async function main(): Promise<void> {
  const [mode, path] = process.argv.slice(2);
  const baseline = process.memoryUsage().rss;
  const xy = readCoordinates(path, mode === 'shared');
  const n = xy.length / 2;
  const dataset = benchDataset(xy);
  const loaded = process.memoryUsage().rss;
  let sampledPeak = loaded;
  const timer = setInterval(() => {
    sampledPeak = Math.max(sampledPeak, process.memoryUsage().rss);
  }, 5);
  const pool = new SweepPool({ threads: Number(process.env.BENCH_THREADS ?? 2) });
  const start = Date.now();
  try {
    await pool.runSweep(dataset, normalizePlan({ cells: [cellSideForExpected(5, n)], placements: 16, sims: 0 }), {
      onProgress: () => {
        sampledPeak = Math.max(sampledPeak, process.memoryUsage().rss);
      },
    });
  } finally {
    clearInterval(timer);
    await pool.destroy();
  }
  const peak = peakResidentBytes();
  process.stdout.write(`${JSON.stringify({ mode, n, baseline, loaded, sampledPeak, peak, seconds: (Date.now() - start) / 1000 })}\n`);
}

await main();
