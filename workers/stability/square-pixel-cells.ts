/**
 * The square cell of a stability pixel's centre in one placement, row by row: the grid contract's
 * floor((dx cos + dy sin) / s - u) through multiplications by 1 / s (the row's terms once per row), exact away from
 * the cell edges; within `band` (cell units, far above the rounding of either form) of an edge the contract's
 * division decides, as in the counting kernel (workers/lattice/square). The one place of this arithmetic: locating
 * every pixel and listing a cell's pixels (stability-chunk.ts) must agree to the last pixel.
 * Pixel (col, row) has its centre at (x0 + (col + 1/2) side, y0 - (row + 1/2) side) (stability-raster.ts).
 */
import type { GridExtent } from '../types.js';
import type { SquarePixelFrame } from './pixel-cells.js';
import type { StabilityRaster } from './stability-raster.js';

export class SquarePixelCells {
  private readonly band: number;
  private readonly cosOver: number;
  private readonly sinOver: number;
  private dy = 0;
  private rowX = 0;
  private rowY = 0;

  constructor(
    private readonly raster: StabilityRaster,
    readonly frame: SquarePixelFrame,
    private readonly grid: GridExtent,
  ) {
    const { i0, j0, nx, ny } = grid;
    this.band = Math.max(2 ** -20, 2 ** -40 * (Math.abs(i0) + Math.abs(j0) + nx + ny + 2));
    const inverse = 1 / frame.cellSize;
    this.cosOver = frame.cos * inverse;
    this.sinOver = frame.sin * inverse;
  }

  /** Makes `row` the raster row that cellOf locates in. Cost O(1). */
  setRow(row: number): void {
    this.dy = this.raster.y0 - (row + 0.5) * this.raster.side - this.frame.originY;
    this.rowX = this.dy * this.sinOver - this.frame.u;
    this.rowY = this.dy * this.cosOver - this.frame.v;
  }

  /** The grid index (j - j0) nx + (i - i0) of the cell holding pixel `col` of the current row; -1 outside the grid. */
  cellOf(col: number): number {
    const { frame, grid, band } = this;
    const dx = this.raster.x0 + (col + 0.5) * this.raster.side - frame.originX;
    const x = dx * this.cosOver + this.rowX;
    const y = this.rowY - dx * this.sinOver;
    let fi = Math.floor(x);
    let fj = Math.floor(y);
    if (x - fi < band || x - fi > 1 - band || y - fj < band || y - fj > 1 - band) {
      // workers/geometry/grid-frame.ts cellUnitX / cellUnitY, the grid contract's order of operations, inline
      const dy = this.dy;
      fi = Math.floor((dx * frame.cos + dy * frame.sin) / frame.cellSize - frame.u);
      fj = Math.floor((-dx * frame.sin + dy * frame.cos) / frame.cellSize - frame.v);
    }
    const gi = fi - grid.i0;
    const gj = fj - grid.j0;
    return gi >= 0 && gi < grid.nx && gj >= 0 && gj < grid.ny ? gj * grid.nx + gi : -1;
  }
}
