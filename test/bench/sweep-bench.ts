/**
 * Measurement 2: the whole sweep (coverage, counts, statistics, pool) of 1e6 points x 1024 placements x 1 size,
 * one thread against two. Targets: <= 2.5 ns per point-placement on 2 threads; 2-thread speed-up >= 1.7.
 * Measurement 3: Monte Carlo, 1e4 points, 256 placements, R = 199, two threads: <= 3 s wall.
 */
import { normalizePlan } from '../../server/sweeps/plan.js';
import { SweepPool } from '../../server/sweeps/sweep-pool.js';
import { cellSideForExpected, clusteredDataset } from './bench-data.js';
import { bestSecondsAsync, pass, printTable } from './bench-table.js';

export interface SweepFigures {
  oneThreadNs: number;
  twoThreadNs: number;
  monteCarloSeconds: number;
}

export async function runSweepBench(): Promise<SweepFigures> {
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
  printTable(
    '2. Whole sweep: 1e6 points x 1024 placements x 1 size (coverage, counts, statistics, pool)',
    ['threads', 'seconds', 'ns/point-placement', 'speed-up vs 1 thread', 'target', 'status'],
    [
      [1, one, ns(one), 1, '', ''],
      [2, two, ns(two), one / two, '<= 2.5 ns; >= 1.7x', `${pass(ns(two) <= 2.5)}; ${pass(one / two >= 1.7)}`],
    ],
  );

  const small = clusteredDataset(1e4, 6);
  const monteCarloPlan = normalizePlan({ cells: [cellSideForExpected(5, 1e4)], placements: 256, sims: 199, seed: 9 });
  const pool = new SweepPool({ threads: 2 });
  let monteCarloSeconds: number;
  let pValue = Number.NaN;
  try {
    await pool.runSweep(small, { ...monteCarloPlan, placements: 4, sims: 3 });
    monteCarloSeconds = await bestSecondsAsync(async () => {
      const result = await pool.runSweep(small, monteCarloPlan);
      pValue = result.summary.sizes[0].monteCarlo?.pMedianClustered ?? Number.NaN;
    });
  } finally {
    await pool.destroy();
  }
  printTable(
    '3. Monte Carlo: 1e4 points, 256 placements, R = 199, 2 threads (simulation of the CSR patterns included)',
    ['seconds', 'ns/point-placement', 'p (median, clustered)', 'target', 'status'],
    [[monteCarloSeconds, (monteCarloSeconds * 1e9) / (1e4 * 256 * 200), pValue, '<= 3 s', pass(monteCarloSeconds <= 3)]],
  );
  return { oneThreadNs: ns(one), twoThreadNs: ns(two), monteCarloSeconds };
}
