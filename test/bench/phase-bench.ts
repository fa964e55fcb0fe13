/**
 * Diagnostic beside measurement 2: where one placement's time goes at 1e6 points (one thread, 32 Halton
 * placements): exact coverage, cell selection, counting, all statistics, and the dispersion chi-square alone
 * (what each simulated pattern costs). No target; it shows which stage bounds the whole sweep.
 */
import { placementCoverage } from '../../workers/geometry/index.js';
import { createCellCounter, keptCounts, mortonSort, selectCells } from '../../workers/placement/index.js';
import { haltonPlacements } from '../../workers/random/index.js';
import { dispersionChiSquare, placementStatistics, poissonGoodnessOfFit } from '../../workers/stats/index.js';
import { BENCH_ORIGIN, BENCH_REGION, cellSideForExpected, clusteredDataset } from './bench-data.js';
import { printTable } from './bench-table.js';

export function runPhaseBench(n = 1e6): void {
  const xy = mortonSort(clusteredDataset(n, 5).xy);
  const cellSize = cellSideForExpected(5, n);
  const counter = createCellCounter(xy, BENCH_ORIGIN);
  const placements = haltonPlacements(32, true);
  const totals = { coverage: 0, select: 0, count: 0, statistics: 0, poisson: 0, chi2: 0 };
  let out = new Int32Array(0);
  let cells = 0;
  const time = (key: keyof typeof totals, fn: () => void): void => {
    const start = performance.now();
    fn();
    totals[key] += performance.now() - start;
  };
  for (const placement of placements) {
    let grid = placementCoverage(BENCH_REGION, BENCH_ORIGIN, cellSize, placement);
    time('coverage', () => {
      grid = placementCoverage(BENCH_REGION, BENCH_ORIGIN, cellSize, placement);
    });
    let kept = selectCells(grid, 0.5);
    time('select', () => {
      kept = selectCells(grid, 0.5);
    });
    if (out.length < grid.nx * grid.ny) out = new Int32Array(grid.nx * grid.ny);
    time('count', () => counter.count(grid, cellSize, placement, out));
    const counts = keptCounts(out, kept);
    cells += counts.length;
    time('statistics', () => placementStatistics(counts, kept.coverage, 0.05));
    time('poisson', () => poissonGoodnessOfFit(counts, kept.coverage));
    time('chi2', () => dispersionChiSquare(counts, kept.coverage));
  }
  const per = (ms: number): number => ms / placements.length;
  const total = per(totals.coverage + totals.select + totals.count + totals.statistics);
  printTable(
    `2b. One placement at ${n.toExponential(0)} points, one thread (about ${Math.round(cells / placements.length)} kept cells): where the time goes`,
    ['stage', 'ms per placement', 'share of a placement'],
    [
      ['exact coverage of the cells', per(totals.coverage), per(totals.coverage) / total],
      ['cell selection (minCoverage)', per(totals.select), per(totals.select) / total],
      ['counting kernel', per(totals.count), per(totals.count) / total],
      ['all statistics (placementStatistics)', per(totals.statistics), per(totals.statistics) / total],
      ['  of which the Poisson goodness of fit', per(totals.poisson), per(totals.poisson) / total],
      ['dispersion chi-square alone (per simulated pattern)', per(totals.chi2), ''],
    ],
  );
}
