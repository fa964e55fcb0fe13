/**
 * Measurement 1: the counting kernel alone on one thread against the plain reference loop, n = 1e5 and 1e6,
 * 5 expected points per cell, 32 Halton placements with rotation. Coverage grids are built before timing.
 * Target: the kernel (Morton-sorted points) at least 1.5 times faster than the plain loop on the points as given.
 */
import { placementCoverage } from '../../workers/geometry/index.js';
import { createCellCounter, mortonSort } from '../../workers/placement/index.js';
import { haltonPlacements } from '../../workers/random/index.js';
import type { CoverageGrid, Placement } from '../../workers/types.js';
import { BENCH_ORIGIN, BENCH_REGION, cellSideForExpected, clusteredDataset } from './bench-data.js';
import { bestSeconds, pass, printTable, type Cell } from './bench-table.js';
import { plainReferenceCount } from './reference-loop.js';

const PLACEMENTS = 32;

export interface KernelFigures {
  n: number;
  kernelNs: number;
  plainNs: number;
}

function plainAll(xy: Float64Array, grids: CoverageGrid[], placements: Placement[], cellSize: number, out: Int32Array): void {
  placements.forEach((p, k) => {
    const g = grids[k];
    plainReferenceCount(xy, BENCH_ORIGIN.x, BENCH_ORIGIN.y, p.angle, cellSize, p.u, p.v, g.i0, g.j0, g.nx, g.ny, out);
  });
}

export function runKernelBench(): KernelFigures[] {
  const figures: KernelFigures[] = [];
  const rows: Cell[][] = [];
  for (const n of [1e5, 1e6]) {
    const xy = clusteredDataset(n, 3).xy;
    const sorted = mortonSort(xy);
    const cellSize = cellSideForExpected(5, n);
    const placements = haltonPlacements(PLACEMENTS, true);
    const grids = placements.map((p) => placementCoverage(BENCH_REGION, BENCH_ORIGIN, cellSize, p));
    const out = new Int32Array(Math.max(...grids.map((g) => g.nx * g.ny)));
    const check = new Int32Array(out.length);
    const counter = createCellCounter(sorted, BENCH_ORIGIN);
    // sanity: the same counts per cell from both (up to points on a grid line, where the rounding of cos/sin differs)
    let differing = 0;
    placements.forEach((p, k) => {
      counter.count(grids[k], cellSize, p, out);
      const g = grids[k];
      plainReferenceCount(xy, BENCH_ORIGIN.x, BENCH_ORIGIN.y, p.angle, cellSize, p.u, p.v, g.i0, g.j0, g.nx, g.ny, check);
      for (let c = 0; c < g.nx * g.ny; c++) differing += Math.abs(out[c] - check[c]);
    });
    const work = n * PLACEMENTS;
    const plain = bestSeconds(() => plainAll(xy, grids, placements, cellSize, out));
    const plainSorted = bestSeconds(() => plainAll(sorted, grids, placements, cellSize, out));
    const kernel = bestSeconds(() => placements.forEach((p, k) => counter.count(grids[k], cellSize, p, out)));
    const kernelUnsorted = createCellCounter(xy, BENCH_ORIGIN);
    const unsorted = bestSeconds(() => placements.forEach((p, k) => kernelUnsorted.count(grids[k], cellSize, p, out)));
    const ns = (seconds: number): number => (seconds * 1e9) / work;
    figures.push({ n, kernelNs: ns(kernel), plainNs: ns(plain) });
    rows.push([n, 'plain loop, points as given (baseline)', ns(plain), 1, '', '']);
    rows.push([n, 'plain loop, Morton-sorted points', ns(plainSorted), plain / plainSorted, '', '']);
    rows.push([n, 'kernel, points as given', ns(unsorted), plain / unsorted, '', '']);
    rows.push([n, 'kernel, Morton-sorted points', ns(kernel), plain / kernel, '>= 1.5x', pass(plain / kernel >= 1.5)]);
    rows.push([n, `count differences kernel vs plain: ${differing} point(s) in ${work} point-placements`, '', '', '', '']);
  }
  printTable(
    `1. Counting kernel alone, one thread (${PLACEMENTS} Halton placements with rotation, 5 expected points per cell)`,
    ['n', 'variant', 'ns/point-placement', 'speed-up vs baseline', 'target', 'status'],
    rows,
  );
  return figures;
}
