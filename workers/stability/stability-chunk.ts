/**
 * The stability surface's share of one chunk task: for each placement of the chunk, the cell of every valid pixel
 * (by the lattice's cell-of-point rule), and per pixel the number of placements in which it lies outside every kept
 * cell, in an excess cell and in a deficit cell of the observed pattern; for every simulated pattern only the pixels
 * of its excess / deficit cells (under the null such cells are rare).
 *
 * Layout appended to the chunk result (after sweep-task.ts's fixed part), sparse, positions q being indices into the
 * valid pixels (stability-raster.ts validPixels): P (placements of the chunk), then the numbers K, X, D and E of
 * entries of the four lists, then K pairs (q, placements in which pixel q is in no kept cell), X pairs (q, placements
 * in an excess cell), D pairs (q, placements in a deficit cell), and E pairs (2 r + kind, q) for simulated pattern r,
 * kind 0 = excess, 1 = deficit, one pair per pixel and placement. A pixel is in a kept cell in P minus its first count
 * of the chunk's placements. Only pixels with a non-zero count are listed: inside the region nearly every pixel is
 * in a kept cell and few are flagged, so a chunk of one placement no longer carries (and the server no longer adds)
 * three values per valid pixel: that took three quarters of the workers' time in a CPU profile of the default plan.
 */
import type { CoverageGrid, KeptCells } from '../types.js';
import type { PixelCellLocator, SquarePixelFrame } from './pixel-cells.js';
import { createCellFlagScratch, flagCells, type CellFlagScratch } from './cell-flags.js';
import type { StabilityRaster } from './stability-raster.js';

export const EXCESS = 0;
export const DEFICIT = 1;

/** Values before the lists: P, K, X, D, E. */
const HEAD = 5;

/**
 * Per-pixel counters of a chunk and the pixels each has touched, kept by the thread between its chunks (a thread runs
 * one chunk at a time) and left all zero by encode(): a chunk costs O(its placements x V), not O(V) more to allocate
 * and clear.
 */
class PixelTally {
  readonly counts: Int32Array;
  readonly touched: Int32Array;
  size = 0;

  constructor(pixels: number) {
    this.counts = new Int32Array(pixels);
    this.touched = new Int32Array(pixels);
  }

  add(q: number): void {
    if (this.counts[q]!++ === 0) this.touched[this.size++] = q;
  }

  /** Clears the counts (left over when a chunk failed half-way). */
  clear(): void {
    for (let t = 0; t < this.size; t++) this.counts[this.touched[t]!] = 0;
    this.size = 0;
  }

  /** Writes (q, count) pairs at `offset`, clears the counts; returns the offset after them. */
  drain(out: Float64Array, offset: number): number {
    let at = offset;
    for (let t = 0; t < this.size; t++) {
      const q = this.touched[t]!;
      out[at++] = q;
      out[at++] = this.counts[q]!;
      this.counts[q] = 0;
    }
    this.size = 0;
    return at;
  }
}

interface ChunkBuffers {
  pixels: number;
  notKept: PixelTally;
  excess: PixelTally;
  deficit: PixelTally;
  pixelKept: Int32Array;
  pixelsOfKept: Int32Array;
}

/** The thread's buffers, made again only when the number of valid pixels changes. */
let buffers: ChunkBuffers | null = null;

function buffersFor(pixels: number): ChunkBuffers {
  if (buffers === null || buffers.pixels !== pixels) {
    buffers = {
      pixels,
      notKept: new PixelTally(pixels),
      excess: new PixelTally(pixels),
      deficit: new PixelTally(pixels),
      pixelKept: new Int32Array(pixels),
      pixelsOfKept: new Int32Array(pixels),
    };
  }
  return buffers;
}

export class StabilityChunk {
  private simulated: number[] = [];
  private placements = 0;
  private readonly buffers: ChunkBuffers;
  private readonly flags: CellFlagScratch = createCellFlagScratch();
  private keptOfCell = new Int32Array(0);
  /** kept cell k's pixels are pixelsOfKept[start[k] .. start[k+1]-1] */
  private start = new Int32Array(0);

  constructor(
    private readonly raster: StabilityRaster,
    /** valid pixels, row * width + col (stability-raster.ts validPixels) */
    private readonly pixels: Uint32Array,
    private readonly alpha: number,
  ) {
    this.buffers = buffersFor(pixels.length);
    this.buffers.notKept.clear();
    this.buffers.excess.clear();
    this.buffers.deficit.clear();
  }

  /**
   * Starts a placement: finds each valid pixel's kept cell (or none) and counts the pixels in no kept cell.
   * Cost O(V) cell-of-point evaluations plus O(grid cells).
   */
  beginPlacement(cellOf: PixelCellLocator, grid: CoverageGrid, kept: KeptCells, square: SquarePixelFrame | null = null): void {
    const { raster, pixels } = this;
    const { pixelKept, pixelsOfKept, notKept } = this.buffers;
    this.placements += 1;
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
    // squares: the contract's floor((dx cos + dy sin) / s - u) through a multiplication by 1 / s, exact away from
    // the cell edges; within `band` (cell units, far above the rounding of either form) of an edge the division
    // decides, as in the counting kernel (workers/lattice/square/square-counter.ts)
    const band = Math.max(2 ** -20, 2 ** -40 * (Math.abs(i0) + Math.abs(j0) + nx + ny + 2));
    const inverse = square === null ? 0 : 1 / square.cellSize;
    for (let q = 0; q < pixels.length; q++) {
      const pixel = pixels[q]!;
      const row = Math.floor(pixel / width);
      const col = pixel - row * width;
      const px = x0 + (col + 0.5) * side;
      const py = y0 - (row + 0.5) * side;
      let cell: number;
      if (square !== null) {
        const dx = px - square.originX;
        const dy = py - square.originY;
        const x = (dx * square.cos + dy * square.sin) * inverse - square.u;
        const y = (-dx * square.sin + dy * square.cos) * inverse - square.v;
        let fi = Math.floor(x);
        let fj = Math.floor(y);
        if (x - fi < band || x - fi > 1 - band || y - fj < band || y - fj > 1 - band) {
          // workers/geometry/grid-frame.ts cellUnitX / cellUnitY, the grid contract's order of operations, inline
          fi = Math.floor((dx * square.cos + dy * square.sin) / square.cellSize - square.u);
          fj = Math.floor((-dx * square.sin + dy * square.cos) / square.cellSize - square.v);
        }
        const gi = fi - i0;
        const gj = fj - j0;
        cell = gi >= 0 && gi < nx && gj >= 0 && gj < ny ? gj * nx + gi : -1;
      } else {
        cell = cellOf(px, py);
      }
      const k = cell < 0 ? -1 : keptOfCell[cell]!;
      pixelKept[q] = k;
      if (k >= 0) start[k + 1]! += 1;
      else notKept.add(q);
    }
    for (let k = 0; k < m; k++) start[k + 1]! += start[k]!;
    const fill = start.slice(0, m);
    for (let q = 0; q < pixels.length; q++) {
      const k = pixelKept[q]!;
      if (k >= 0) pixelsOfKept[fill[k]!++] = q;
    }
  }

  /** Adds the observed pattern's excess / deficit cells of the current placement (kept counts in kept order). */
  addObserved(counts: Float64Array, coverage: Float64Array): void {
    const found = flagCells(counts, coverage, this.alpha, this.flags);
    this.addPixels(this.flags.excess, found.excess, this.buffers.excess);
    this.addPixels(this.flags.deficit, found.deficit, this.buffers.deficit);
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
  private addPixels(cells: Int32Array, count: number, tally: PixelTally): void {
    const { pixelsOfKept } = this.buffers;
    for (let c = 0; c < count; c++) {
      const k = cells[c]!;
      for (let t = this.start[k]!; t < this.start[k + 1]!; t++) tally.add(pixelsOfKept[t]!);
    }
  }

  /** Lists (code, pixel) for the pixels of the listed kept cells (mapped through keptIndex when given). */
  private listPixels(cells: Int32Array, count: number, code: number, keptIndex: Int32Array | null): void {
    const { pixelsOfKept } = this.buffers;
    for (let c = 0; c < count; c++) {
      const k = keptIndex === null ? cells[c]! : keptIndex[cells[c]!]!;
      if (k < 0) continue;
      for (let t = this.start[k]!; t < this.start[k + 1]!; t++) this.simulated.push(code, pixelsOfKept[t]!);
    }
  }

  /** Values this chunk appends to the chunk result. */
  get length(): number {
    const { notKept, excess, deficit } = this.buffers;
    return HEAD + 2 * (notKept.size + excess.size + deficit.size) + this.simulated.length;
  }

  /** Writes the layout of the file comment into out at offset; clears the thread's counters for the next chunk. */
  encode(out: Float64Array, offset: number): void {
    const { notKept, excess, deficit } = this.buffers;
    out[offset] = this.placements;
    out[offset + 1] = notKept.size;
    out[offset + 2] = excess.size;
    out[offset + 3] = deficit.size;
    out[offset + 4] = this.simulated.length / 2;
    let at = notKept.drain(out, offset + HEAD);
    at = excess.drain(out, at);
    at = deficit.drain(out, at);
    out.set(this.simulated, at);
  }
}

/** The decoded stability part of a chunk result: views of the (q, count) and (code, q) pairs, not copies. */
export interface DecodedStability {
  placements: number;
  notKept: Float64Array;
  excess: Float64Array;
  deficit: Float64Array;
  /** (2 r + kind, pixel position) pairs */
  simulated: Float64Array;
}

/** Reads the stability part of a chunk result at `offset`. */
export function decodeStability(result: Float64Array, offset: number): DecodedStability {
  const [placements, k, x, d, e] = [0, 1, 2, 3, 4].map((t) => result[offset + t]!) as [number, number, number, number, number];
  let at = offset + HEAD;
  const take = (pairs: number): Float64Array => result.subarray(at, (at += 2 * pairs));
  return { placements, notKept: take(k), excess: take(x), deficit: take(d), simulated: take(e) };
}
