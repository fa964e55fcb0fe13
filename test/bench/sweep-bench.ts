/**
 * Target 1: the whole sweep (coverage, selection, counts, statistics, pool) of 1e6 points x 1024 placements x
 * 1 size on 2 threads, against the C loop's single-thread count-only time for the same point-placements: ratio
 * <= 1.0 (one thread shown too, with the 2-thread speed-up).
 * Target 3: Monte Carlo alone, 1e4 points, 256 placements, R = 199, 2 threads, against the C loop's time for
 * 1e4 x 256 x 200 point-placements: ratio <= 1.0.
 */
import { normalizePlan } from '../../server/sweeps/plan.js';
import { SweepPool } from '../../server/sweeps/sweep-pool.js';
import { haltonPlacements } from '../../workers/random/index.js';
import { BENCH_ORIGIN, cellSideForExpected, clusteredDataset } from './bench-data.js';
import { bestSecondsAsync, printTable } from './bench-table.js';
import type { CReference } from './c-reference.js';
import { ratioFigure, type TargetFigure } from './targets.js';

export interface SweepFigures {
  oneThreadNs: number;
  twoThreadNs: number;
  wholeSweep: TargetFigure;
  monteCarlo: TargetFigure;
}

/** The C loop's ns per point-placement on these points at this cell side (16 placements of the Halton design). */
function cNs(reference: CReference | null, xy: Float64Array, cellSize: number): number {
  return reference === null ? Number.NaN : reference.nsPerPointPlacement(xy, BENCH_ORIGIN, cellSize, haltonPlacements(16, true));
}

export async function runSweepBench(reference: CReference | null): Promise<SweepFigures> {
  const n = 1e6;
  const placements = 1024;
  const dataset = clusteredDataset(n, 5);
  const plan = normalizePlan({ cells: [cellSideForExpected(5, n)], placements, sims: 0 });
  const warmPlan = { ...plan, placements: 16 };
  const timings: number[] = [];
  for (const threads of [1, 2]) {
    const pool = new SweepPool({ threads });
    try {
      await pool.runSweep(dataset, warmPlan); // shares the points and starts the workers
      timings.push(await bestSecondsAsync(() => pool.runSweep(dataset, plan)));
    } finally {
      await pool.destroy();
    }
  }
  const ns = (seconds: number): number => (seconds * 1e9) / (n * placements);
  const [one, two] = timings;
  const sweepC = cNs(reference, dataset.xy, plan.cells?.[0] ?? Number.NaN);
  const wholeSweep = ratioFigure(two, (sweepC * n * placements) / 1e9, 1);
  printTable(
    'T1. Whole sweep: 1e6 points x 1024 placements x 1 size (coverage, selection, counts, statistics, pool) against the C count-only loop',
    ['threads', 'seconds', 'ns/point-placement', 'speed-up vs 1 thread', 'C loop ns/point-placement', 'ratio vs C', 'target', 'status'],
    [
      [1, one, ns(one), 1, sweepC, ns(one) / sweepC, '', ''],
      [2, two, ns(two), one / two, sweepC, wholeSweep.ratio, '<= 1.0', wholeSweep.status],
    ],
  );

  const small = clusteredDataset(1e4, 6);
  const monteCarloPlan = normalizePlan({ cells: [cellSideForExpected(5, 1e4)], placements: 256, sims: 199, seed: 9 });
  const pool = new SweepPool({ threads: 2 });
  let monteCarloSeconds: number;
  let pValue = Number.NaN;
  try {
    await pool.runSweep(small, { ...monteCarloPlan, placements: 4, sims: 3, alpha: 0.5 });
    monteCarloSeconds = await bestSecondsAsync(async () => {
      const result = await pool.runSweep(small, monteCarloPlan);
      pValue = result.summary.sizes[0].monteCarlo?.pMedianClustered ?? Number.NaN;
    });
  } finally {
    await pool.destroy();
  }
  const monteCarloWork = 1e4 * monteCarloPlan.placements * (1 + monteCarloPlan.sims);
  const monteCarloC = cNs(reference, small.xy, monteCarloPlan.cells?.[0] ?? Number.NaN);
  const monteCarlo = ratioFigure(monteCarloSeconds, (monteCarloC * monteCarloWork) / 1e9, 1);
  printTable(
    'T3. Monte Carlo: 1e4 points, 256 placements, R = 199, 2 threads (simulation of the CSR patterns included) against the C count-only loop',
    ['seconds', 'ns/point-placement', 'p (median, clustered)', 'C loop s (same work)', 'ratio vs C', 'target', 'status'],
    [[monteCarloSeconds, (monteCarloSeconds * 1e9) / monteCarloWork, pValue, monteCarlo.reference, monteCarlo.ratio, '<= 1.0', monteCarlo.status]],
  );
  return { oneThreadNs: ns(one), twoThreadNs: ns(two), wholeSweep, monteCarlo };
}
