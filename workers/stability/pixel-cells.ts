/**
 * The cell of a pixel centre in one placement, by the lattice's cell-of-point rule (workers/lattice), as the index
 * of the cell in the placement's coverage grid ((j - j0) nx + (i - i0)), or -1 outside the grid. Squares use the
 * grid contract's own functions (workers/geometry/grid-frame.ts cellUnitX / cellUnitY, then floor) without building
 * a pair per pixel; other shapes ask their lattice frame.
 */
import { cellUnitX, cellUnitY, createGridFrame } from '../geometry/grid-frame.js';
import type { CellShape } from '../lattice/cell-shape.js';
import { latticeOf } from '../lattice/registry.js';
import type { GridExtent, Origin, Placement } from '../types.js';

export type PixelCellLocator = (px: number, py: number) => number;

/** For squares: the grid frame's numbers, so that a caller can evaluate cellUnitX / cellUnitY inline. */
export interface SquarePixelFrame {
  originX: number;
  originY: number;
  cos: number;
  sin: number;
  cellSize: number;
  u: number;
  v: number;
}

/** The grid frame of a square placement (null for other shapes). */
export function squarePixelFrame(shape: CellShape | undefined, origin: Origin, cellSize: number, placement: Placement): SquarePixelFrame | null {
  return (shape ?? 'square') === 'square' ? createGridFrame(origin, cellSize, placement) : null;
}

export function pixelCellLocator(shape: CellShape | undefined, origin: Origin, cellSize: number, placement: Placement, grid: GridExtent): PixelCellLocator {
  const { i0, j0, nx, ny } = grid;
  const index = (i: number, j: number): number => {
    const gi = i - i0;
    const gj = j - j0;
    return gi >= 0 && gi < nx && gj >= 0 && gj < ny ? gj * nx + gi : -1;
  };
  if ((shape ?? 'square') === 'square') {
    const frame = createGridFrame(origin, cellSize, placement);
    return (px, py) => index(Math.floor(cellUnitX(frame, px, py)), Math.floor(cellUnitY(frame, px, py)));
  }
  const frame = latticeOf(shape).frame(origin, cellSize, placement);
  const cell = new Float64Array(2);
  return (px, py) => {
    frame.cellOfPointInto(px, py, cell);
    return index(cell[0]!, cell[1]!);
  };
}
