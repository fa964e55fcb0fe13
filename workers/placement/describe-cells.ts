/**
 * Every cell of one placement with coverage > 0, for drawing and the grid exports: grid indices, count,
 * coverage, expected count E_c = N a_c / sum(a) over kept cells (null for left-out cells), whether it is kept, and
 * its corners as a closed counter-clockwise ring in planar metres (5 points for squares, 7 for hexagons). N is the
 * number of points in kept cells (design.md).
 * `describeCellGrid` keeps the placement in typed arrays (cells visited one at a time, for exports that stream);
 * `describeCells` lists them as objects. Cost O(cells + n).
 */
import type { LatticeFrame } from '../lattice/lattice.js';
import { latticeOf } from '../lattice/registry.js';
import type { CoverageGrid } from '../types.js';
import type { EvaluatePlacementInput } from './evaluate-placement.js';
import { selectCells } from './select-cells.js';

export interface CellDescription {
  i: number;
  j: number;
  count: number;
  coverage: number;
  expected: number | null;
  kept: boolean;
  corners: [number, number][];
}

/** The same placement inputs as evaluatePlacement, without the statistics' alpha. */
export type DescribeCellsInput = Omit<EvaluatePlacementInput, 'alpha' | 'buffers' | 'countsInKeptOrder'>;

/** One placement's cells in typed arrays: coverage grid, counts, kept flags and the sums behind E_c. */
export interface CellGrid {
  grid: CoverageGrid;
  frame: LatticeFrame;
  counts: Int32Array;
  isKept: Uint8Array;
  keptPoints: number;
  keptCoverage: number;
  /** with a baseline (issue 15): every grid cell's weight w_c; kept cells then also need w_c > 0 and E_c ∝ w_c */
  weights?: Float64Array;
  keptWeight?: number;
  /** number of cells with coverage > 0 (the ones described) */
  cellCount: number;
}

export function describeCellGrid(input: DescribeCellsInput): CellGrid {
  const { counter, region, origin, cellSize, placement, minCoverage, shape, baseline } = input;
  const lattice = latticeOf(shape);
  const grid = lattice.coverage(region, origin, cellSize, placement);
  const kept = selectCells(grid, minCoverage);
  const counts = new Int32Array(grid.nx * grid.ny);
  counter.count(grid, cellSize, placement, counts);
  const isKept = new Uint8Array(grid.nx * grid.ny);
  const weights = baseline?.weights(grid, cellSize, placement);
  let keptPoints = 0;
  let keptCoverage = 0;
  let keptWeight = 0;
  for (let k = 0; k < kept.index.length; k++) {
    const cell = kept.index[k]!;
    if (weights !== undefined && !(weights[cell]! > 0)) continue;
    isKept[cell] = 1;
    keptPoints += counts[cell]!;
    keptCoverage += kept.coverage[k]!;
    if (weights !== undefined) keptWeight += weights[cell]!;
  }
  let cellCount = 0;
  for (let k = 0; k < grid.coverage.length; k++) if (grid.coverage[k]! > 0) cellCount++;
  const described: CellGrid = { grid, frame: lattice.frame(origin, cellSize, placement), counts, isKept, keptPoints, keptCoverage, cellCount };
  return weights === undefined ? described : { ...described, weights, keptWeight };
}

/** Cell k (storage index) of a described grid, or null when its coverage is 0. */
export function cellAt(cells: CellGrid, k: number): CellDescription | null {
  const { grid } = cells;
  const coverage = grid.coverage[k]!;
  if (!(coverage > 0)) return null;
  const i = grid.i0 + (k % grid.nx);
  const j = grid.j0 + Math.floor(k / grid.nx);
  const kept = cells.isKept[k] === 1;
  return {
    i,
    j,
    count: cells.counts[k]!,
    coverage,
    expected: !kept
      ? null
      : cells.weights !== undefined
        ? (cells.keptPoints * cells.weights[k]!) / cells.keptWeight!
        : cells.keptCoverage > 0 ? (cells.keptPoints * coverage) / cells.keptCoverage : null,
    kept,
    corners: cells.frame.cellPolygon(i, j),
  };
}

export function describeCells(input: DescribeCellsInput): CellDescription[] {
  const cells = describeCellGrid(input);
  const out: CellDescription[] = [];
  for (let k = 0; k < cells.grid.coverage.length; k++) {
    const cell = cellAt(cells, k);
    if (cell !== null) out.push(cell);
  }
  return out;
}
