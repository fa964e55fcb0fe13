/**
 * The stability surface's share of one chunk task: for each placement of the chunk, the cell of every valid pixel
 * (by the lattice's cell-of-point rule), and per pixel the number of placements in which it lies in a kept cell, in
 * an excess cell and in a deficit cell of the observed pattern; for every simulated pattern only the pixels of its
 * excess / deficit cells, as a sparse list (under the null such cells are rare).
 *
 * Layout appended to the chunk result (after sweep-task.ts's fixed part), V = valid pixels of the raster in the
 * order of validPixels(): V kept counts, V excess counts, V deficit counts, then E, then E pairs
 * (2 r + kind, pixel position) for simulated pattern r, kind 0 = excess, 1 = deficit, one pair per pixel and
 * placement.
 */
import type { CoverageGrid, KeptCells } from '../types.js';
import type { PixelCellLocator, SquarePixelFrame } from './pixel-cells.js';
import { createCellFlagScratch, flagCells, type CellFlagScratch } from './cell-flags.js';
import type { StabilityRaster } from './stability-raster.js';

export const EXCESS = 0;
export const DEFICIT = 1;

export class StabilityChunk {
  readonly kept: Float64Array;
  readonly excess: Float64Array;
  readonly deficit: Float64Array;
  private simulated: number[] = [];
  private readonly pixelKept: Int32Array;
  private readonly flags: CellFlagScratch = createCellFlagScratch();
  private keptOfCell = new Int32Array(0);
  /** kept cell k's pixels are pixelsOfKept[start[k] .. start[k+1]-1] */
  private start = new Int32Array(0);
  private pixelsOfKept: Int32Array;

  constructor(
    private readonly raster: StabilityRaster,
    /** valid pixels, row * width + col (stability-raster.ts validPixels) */
    private readonly pixels: Uint32Array,
    private readonly alpha: number,
  ) {
    const count = pixels.length;
    this.kept = new Float64Array(count);
    this.excess = new Float64Array(count);
    this.deficit = new Float64Array(count);
    this.pixelKept = new Int32Array(count);
    this.pixelsOfKept = new Int32Array(count);
  }

  /**
   * Starts a placement: finds each valid pixel's kept cell (or none) and counts the kept pixels.
   * Cost O(V) cell-of-point evaluations plus O(grid cells).
   */
  beginPlacement(cellOf: PixelCellLocator, grid: CoverageGrid, kept: KeptCells, square: SquarePixelFrame | null = null): void {
    const { raster, pixels } = this;
    const cells = grid.nx * grid.ny;
    if (this.keptOfCell.length < cells) this.keptOfCell = new Int32Array(cells);
    const keptOfCell = this.keptOfCell;
    keptOfCell.fill(-1, 0, cells);
    const m = kept.index.length;
    for (let k = 0; k < m; k++) keptOfCell[kept.index[k]!] = k;

    if (this.start.length < m + 1) this.start = new Int32Array(m + 1);
    const start = this.start;
    start.fill(0, 0, m + 1);
    const { x0, y0, side, width } = raster;
    const { i0, j0, nx, ny } = grid;
    for (let q = 0; q < pixels.length; q++) {
      const pixel = pixels[q]!;
      const row = Math.floor(pixel / width);
      const col = pixel - row * width;
      const px = x0 + (col + 0.5) * side;
      const py = y0 - (row + 0.5) * side;
      let cell: number;
      if (square !== null) {
        // workers/geometry/grid-frame.ts cellUnitX / cellUnitY, the grid contract's order of operations, inline
        const dx = px - square.originX;
        const dy = py - square.originY;
        const gi = Math.floor((dx * square.cos + dy * square.sin) / square.cellSize - square.u) - i0;
        const gj = Math.floor((-dx * square.sin + dy * square.cos) / square.cellSize - square.v) - j0;
        cell = gi >= 0 && gi < nx && gj >= 0 && gj < ny ? gj * nx + gi : -1;
      } else {
        cell = cellOf(px, py);
      }
      const k = cell < 0 ? -1 : keptOfCell[cell]!;
      this.pixelKept[q] = k;
      if (k >= 0) {
        this.kept[q]! += 1;
        start[k + 1]! += 1;
      }
    }
    for (let k = 0; k < m; k++) start[k + 1]! += start[k]!;
    const fill = start.slice(0, m);
    for (let q = 0; q < pixels.length; q++) {
      const k = this.pixelKept[q]!;
      if (k >= 0) this.pixelsOfKept[fill[k]!++] = q;
    }
  }

  /** Adds the observed pattern's excess / deficit cells of the current placement (kept counts in kept order). */
  addObserved(counts: Float64Array, coverage: Float64Array): void {
    const found = flagCells(counts, coverage, this.alpha, this.flags);
    this.addPixels(this.flags.excess, found.excess, this.excess);
    this.addPixels(this.flags.deficit, found.deficit, this.deficit);
  }

  /**
   * Adds simulated pattern r's excess / deficit cells of the current placement to the sparse list. The tested cells
   * are the placement's kept cells, or, with `keptIndex` (random labelling: workers/baseline/relabelled-flags.ts),
   * cells of their own whose kept index is keptIndex[c] (−1: not a kept cell of the placement, no pixels).
   */
  addSimulated(pattern: number, counts: Float64Array, coverage: Float64Array, keptIndex: Int32Array | null = null): void {
    const found = flagCells(counts, coverage, this.alpha, this.flags);
    this.listPixels(this.flags.excess, found.excess, 2 * pattern + EXCESS, keptIndex);
    this.listPixels(this.flags.deficit, found.deficit, 2 * pattern + DEFICIT, keptIndex);
  }

  /** Adds 1 at the pixels of the listed kept cells. */
  private addPixels(cells: Int32Array, count: number, out: Float64Array): void {
    for (let c = 0; c < count; c++) {
      const k = cells[c]!;
      for (let t = this.start[k]!; t < this.start[k + 1]!; t++) out[this.pixelsOfKept[t]!]! += 1;
    }
  }

  /** Lists (code, pixel) for the pixels of the listed kept cells (mapped through keptIndex when given). */
  private listPixels(cells: Int32Array, count: number, code: number, keptIndex: Int32Array | null): void {
    for (let c = 0; c < count; c++) {
      const k = keptIndex === null ? cells[c]! : keptIndex[cells[c]!]!;
      if (k < 0) continue;
      for (let t = this.start[k]!; t < this.start[k + 1]!; t++) this.simulated.push(code, this.pixelsOfKept[t]!);
    }
  }

  /** Values this chunk appends to the chunk result. */
  get length(): number {
    return 3 * this.pixels.length + 1 + this.simulated.length;
  }

  /** Writes the layout of the file comment into out at offset. */
  encode(out: Float64Array, offset: number): void {
    const count = this.pixels.length;
    out.set(this.kept, offset);
    out.set(this.excess, offset + count);
    out.set(this.deficit, offset + 2 * count);
    out[offset + 3 * count] = this.simulated.length / 2;
    out.set(this.simulated, offset + 3 * count + 1);
  }
}

/** The decoded stability part of a chunk result. */
export interface DecodedStability {
  kept: Float64Array;
  excess: Float64Array;
  deficit: Float64Array;
  /** (2 r + kind, pixel position) pairs */
  simulated: Float64Array;
}

/** Reads the stability part of a chunk result at `offset` for `count` valid pixels (views, not copies). */
export function decodeStability(result: Float64Array, offset: number, count: number): DecodedStability {
  const pairs = result[offset + 3 * count]!;
  return {
    kept: result.subarray(offset, offset + count),
    excess: result.subarray(offset + count, offset + 2 * count),
    deficit: result.subarray(offset + 2 * count, offset + 3 * count),
    simulated: result.subarray(offset + 3 * count + 1, offset + 3 * count + 1 + 2 * pairs),
  };
}
