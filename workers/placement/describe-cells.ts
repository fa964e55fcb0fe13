/**
 * Every cell of one placement with coverage > 0, for drawing and the grid.geojson export: grid indices, count,
 * coverage, expected count E_c = N a_c / sum(a) over kept cells (null for left-out cells), whether it is kept, and
 * its corners as a closed counter-clockwise ring in planar metres (5 points for squares, 7 for hexagons). N is the number of points in kept cells (design.md).
 * Cost O(cells + n).
 */
import { latticeOf } from '../lattice/registry.js';
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
export type DescribeCellsInput = Omit<EvaluatePlacementInput, 'alpha' | 'scratch'>;

export function describeCells(input: DescribeCellsInput): CellDescription[] {
  const { counter, region, origin, cellSize, placement, minCoverage, shape } = input;
  const lattice = latticeOf(shape);
  const grid = lattice.coverage(region, origin, cellSize, placement);
  const kept = selectCells(grid, minCoverage);
  const counts = new Int32Array(grid.nx * grid.ny);
  counter.count(grid, cellSize, placement, counts);
  const isKept = new Uint8Array(grid.nx * grid.ny);
  let keptPoints = 0;
  let keptCoverage = 0;
  for (let k = 0; k < kept.index.length; k++) {
    isKept[kept.index[k]!] = 1;
    keptPoints += counts[kept.index[k]!]!;
    keptCoverage += kept.coverage[k]!;
  }
  const frame = lattice.frame(origin, cellSize, placement);
  const cells: CellDescription[] = [];
  for (let r = 0; r < grid.ny; r++) {
    for (let c = 0; c < grid.nx; c++) {
      const k = r * grid.nx + c;
      const coverage = grid.coverage[k]!;
      if (!(coverage > 0)) continue;
      const i = grid.i0 + c;
      const j = grid.j0 + r;
      const kept = isKept[k] === 1;
      cells.push({
        i,
        j,
        count: counts[k]!,
        coverage,
        expected: kept && keptCoverage > 0 ? (keptPoints * coverage) / keptCoverage : null,
        kept,
        corners: frame.cellPolygon(i, j),
      });
    }
  }
  return cells;
}
