/**
 * The stability surface's share of one chunk task: for each placement of the chunk, the cell of every valid pixel
 * (by the lattice's cell-of-point rule; for squares without a baseline only the pixels near the boundary are located,
 * the others lying in whole, kept cells, and flagged cells are turned into their pixels cell by cell: beginPlacement),
 * and per pixel the number of placements in which it lies outside every kept
 * cell, in an excess cell and in a deficit cell of the observed pattern; for every simulated pattern only the pixels
 * of its excess / deficit cells (under the null such cells are rare).
 *
 * Layout appended to the chunk result (after sweep-task.ts's fixed part), sparse, positions q being indices into the
 * valid pixels (stability-raster.ts validPixels): P (placements of the chunk), then the numbers K, X, D and E of
 * entries of the four lists, then K pairs (q, placements in which pixel q is in no kept cell), X pairs (q, placements
 * in an excess cell), D pairs (q, placements in a deficit cell), and E pairs (2 r + kind, q) for simulated pattern r,
 * kind 0 = excess, 1 = deficit, one pair per pixel and placement. Pixel q lies in a kept cell in P minus its K-list
 * count of the chunk's placements. Only pixels with a non-zero count are listed: inside the region nearly every pixel
 * is in a kept cell and few are flagged, so a chunk of one placement no longer carries (and the server no longer
 * adds) three values per valid pixel: making, filling and sending them took about a third of the workers' busy time
 * in a CPU profile of `gridshake sweep` (1e5 points, 32 placements, 99 sims).
 */
import type { GridExtent, KeptCells } from '../types.js';
import type { PixelCellLocator, SquarePixelFrame } from './pixel-cells.js';
import type { PixelRuns } from './pixel-runs.js';
import { SquarePixelCells } from './square-pixel-cells.js';
import { cellCorners } from '../geometry/grid-frame.js';
import { createCellFlagScratch, flagCells, type CellFlagScratch, type KnownSums } from './cell-flags.js';
import type { StabilityRaster } from './stability-raster.js';

export const EXCESS = 0;
export const DEFICIT = 1;

/** Codes of the observed pattern's flags in the per-placement lists (simulated flags use 2 r + kind >= 0). */
const OBSERVED_EXCESS = -1;
const OBSERVED_DEFICIT = -2;

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
  /** the chunk using them: one at a time per thread */
  owner: StabilityChunk | null;
  notKept: PixelTally;
  excess: PixelTally;
  deficit: PixelTally;
  pixelKept: Int32Array;
}

/**
 * The thread's buffers, made again only when the number of valid pixels changes; they stay allocated between sweeps
 * (7 x 4 bytes per valid pixel: about 117 MB for the largest raster of MAX_STABILITY_PIXELS).
 */
let buffers: ChunkBuffers | null = null;

function buffersFor(pixels: number): ChunkBuffers {
  if (buffers === null || buffers.pixels !== pixels) {
    buffers = {
      pixels,
      owner: null,
      notKept: new PixelTally(pixels),
      excess: new PixelTally(pixels),
      deficit: new PixelTally(pixels),
      pixelKept: new Int32Array(pixels),
    };
  }
  return buffers;
}

/**
 * What lets a square placement skip most pixels (built once per raster and cell size, workers/pool-task.ts): the valid
 * pixels as row runs, and those near the region's boundary (boundary-pixels.ts, distance above the cell diagonal).
 */
export interface SquareCellPixels {
  runs: PixelRuns;
  nearBoundary: Uint32Array;
}

/**
 * The placement's cells as the pixel listing needs them (square placements whose whole cells are all kept). The
 * kept cells' arrays are the thread's and hold the next placement's cells when this one is flushed: each listed
 * cell's grid index is taken when it is listed.
 */
interface CellListing {
  cells: SquarePixelCells;
  grid: GridExtent;
  kept: KeptCells;
}

/**
 * The x-extent [out[0], out[1]] of a convex quadrilateral (corners x[0..3], y[0..3] in order around it) along the
 * horizontal line at y; false when the line misses it. Cost O(1).
 */
function extentAlong(cornerX: Float64Array, cornerY: Float64Array, y: number, out: Float64Array): boolean {
  let xLow = Infinity;
  let xHigh = -Infinity;
  for (let e = 0; e < 4; e++) {
    const ax = cornerX[e]!;
    const ay = cornerY[e]!;
    const bx = cornerX[(e + 1) & 3]!;
    const by = cornerY[(e + 1) & 3]!;
    if (y < Math.min(ay, by) || y > Math.max(ay, by)) continue;
    const x = ay === by ? ax : ax + ((y - ay) * (bx - ax)) / (by - ay);
    const other = ay === by ? bx : x;
    xLow = Math.min(xLow, x, other);
    xHigh = Math.max(xHigh, x, other);
  }
  out[0] = xLow;
  out[1] = xHigh;
  return xLow <= xHigh;
}

export class StabilityChunk {
  private simulated: number[] = [];
  private placements = 0;
  private readonly buffers: ChunkBuffers;
  private readonly flags: CellFlagScratch = createCellFlagScratch();
  private keptOfCell = new Int32Array(0);
  /**
   * The current placement's flags, listed per kept cell and turned into pixels when the placement ends
   * (flushPlacement: one pass over the pixels, or cell by cell): head[k] is cell k's first entry (−1: none), entries hold a code (OBSERVED_EXCESS,
   * OBSERVED_DEFICIT, or 2 r + kind for simulated pattern r) and the next entry of the same cell.
   */
  private head = new Int32Array(0);
  private entryCode: number[] = [];
  private entryNext: number[] = [];
  /** (kept index, grid index) of the kept cells with entries, in the order of their first entry (while `listing` is set) */
  private flagged: number[] = [];
  /** set when the current placement's flags become pixels cell by cell rather than by a pass over every pixel */
  private listing: CellListing | null = null;

  constructor(
    private readonly raster: StabilityRaster,
    /** valid pixels, row * width + col (stability-raster.ts validPixels) */
    private readonly pixels: Uint32Array,
    private readonly alpha: number,
    /** for square placements: see SquareCellPixels (absent: every pixel is located in every placement) */
    private readonly squareCells: SquareCellPixels | null = null,
  ) {
    this.buffers = buffersFor(pixels.length);
    this.buffers.owner = this;
    this.buffers.notKept.clear();
    this.buffers.excess.clear();
    this.buffers.deficit.clear();
  }

  /**
   * Starts a placement: finds each valid pixel's kept cell (or none) and counts the pixels in no kept cell.
   * Cost O(V) cell-of-point evaluations plus O(grid cells). A square placement that keeps every cell of coverage 1
   * (`wholeCellsKept`: no baseline narrows the kept cells), with the chunk's SquareCellPixels, locates only the pixels
   * near the boundary: every other pixel's cell has coverage 1 in every placement (boundary-pixels.ts), so it is kept;
   * its flags then become pixels cell by cell (flushPlacement). Cost O(boundary pixels) plus O(grid cells).
   */
  beginPlacement(cellOf: PixelCellLocator, grid: GridExtent, kept: KeptCells, square: SquarePixelFrame | null = null, wholeCellsKept = false): void {
    this.checkOwner();
    this.flushPlacement();
    this.placements += 1;
    const cells = grid.nx * grid.ny;
    if (this.keptOfCell.length < cells) this.keptOfCell = new Int32Array(cells);
    const keptOfCell = this.keptOfCell;
    keptOfCell.fill(-1, 0, cells);
    const m = kept.index.length;
    for (let k = 0; k < m; k++) keptOfCell[kept.index[k]!] = k;
    if (this.head.length < m) this.head = new Int32Array(m);
    this.head.fill(-1, 0, m);
    this.listing = null;
    if (square !== null && this.squareCells !== null && wholeCellsKept) {
      const listing = { cells: new SquarePixelCells(this.raster, square, grid), grid, kept };
      this.locateSquare(listing.cells, this.squareCells.nearBoundary);
      this.listing = listing;
    } else if (square !== null) this.locateSquare(new SquarePixelCells(this.raster, square, grid), null);
    else this.locate(cellOf);
  }

  /** pixelKept[q] = the kept cell of pixel q (−1: none, counted in notKept), any lattice through its locator. */
  private locate(cellOf: PixelCellLocator): void {
    const { pixels, keptOfCell } = this;
    const { pixelKept, notKept } = this.buffers;
    const { x0, y0, side, width } = this.raster;
    for (let q = 0; q < pixels.length; q++) {
      const pixel = pixels[q]!;
      const row = Math.floor(pixel / width);
      const col = pixel - row * width;
      const cell = cellOf(x0 + (col + 0.5) * side, y0 - (row + 0.5) * side);
      const k = cell < 0 ? -1 : keptOfCell[cell]!;
      pixelKept[q] = k;
      if (k < 0) notKept.add(q);
    }
  }

  /**
   * locate() for squares (square-pixel-cells.ts): every valid pixel (`near` null, pixelKept set), or only the pixels
   * at positions `near` (the others lie in kept cells), which are counted in notKept when in no kept cell. `flush`:
   * instead, every pixel takes the entries of its kept cell (flushPlacement, before keptOfCell changes).
   */
  private locateSquare(cells: SquarePixelCells, near: Uint32Array | null, flush = false): void {
    const { pixels, keptOfCell, head } = this;
    const { pixelKept, notKept } = this.buffers;
    const width = this.raster.width;
    const visits = near === null ? pixels.length : near.length;
    let rowStart = 0;
    let rowEnd = -1;
    for (let t = 0; t < visits; t++) {
      const q = near === null ? t : near[t]!;
      const pixel = pixels[q]!;
      if (pixel >= rowEnd || pixel < rowStart) {
        const row = Math.floor(pixel / width);
        rowStart = row * width;
        rowEnd = rowStart + width;
        cells.setRow(row);
      }
      const cell = cells.cellOf(pixel - rowStart);
      const k = cell < 0 ? -1 : keptOfCell[cell]!;
      if (flush) {
        if (k >= 0 && head[k]! >= 0) this.addEntries(k, q);
        continue;
      }
      if (near === null) pixelKept[q] = k;
      if (k < 0) notKept.add(q);
    }
  }

  /** Adds the observed pattern's excess / deficit cells of the current placement (kept counts in kept order). */
  addObserved(counts: ArrayLike<number>, coverage: Float64Array): void {
    const found = flagCells(counts, coverage, this.alpha, this.flags);
    this.listCells(this.flags.excess, found.excess, OBSERVED_EXCESS, null);
    this.listCells(this.flags.deficit, found.deficit, OBSERVED_DEFICIT, null);
  }

  /**
   * Adds simulated pattern r's excess / deficit cells of the current placement to the sparse list. The tested cells
   * are the placement's kept cells, or, with `keptIndex` (random labelling: workers/baseline/relabelled-flags.ts),
   * cells of their own whose kept index is keptIndex[c] (−1: not a kept cell of the placement, no pixels).
   * `known`: the counts' total and the coverages' summary when the caller has them (cell-flags.ts flagCells).
   */
  addSimulated(pattern: number, counts: ArrayLike<number>, coverage: Float64Array, keptIndex: Int32Array | null = null, known?: KnownSums): void {
    const found = flagCells(counts, coverage, this.alpha, this.flags, known);
    this.listCells(this.flags.excess, found.excess, 2 * pattern + EXCESS, keptIndex);
    this.listCells(this.flags.deficit, found.deficit, 2 * pattern + DEFICIT, keptIndex);
  }

  /** Lists `code` for the listed kept cells (mapped through keptIndex when given). */
  private listCells(cells: Int32Array, count: number, code: number, keptIndex: Int32Array | null): void {
    for (let c = 0; c < count; c++) {
      const k = keptIndex === null ? cells[c]! : keptIndex[cells[c]!]!;
      if (k < 0) continue;
      if (this.listing !== null && this.head[k] === -1) this.flagged.push(k, this.listing.kept.index[k]!);
      this.entryCode.push(code);
      this.entryNext.push(this.head[k]!);
      this.head[k] = this.entryCode.length - 1;
    }
  }

  /** The thread's buffers hold one chunk's counts: a second chunk made meanwhile would have cleared them. */
  private checkOwner(): void {
    if (this.buffers.owner !== this) throw new Error('two stability chunks were used at once in one thread: evaluate one chunk after another');
  }

  /**
   * Ends the current placement: the listed cells become pixels, by one pass over the pixels, or, when the placement
   * is listed cell by cell, by visiting each listed cell's pixels (nothing when no cell is listed).
   */
  private flushPlacement(): void {
    if (this.entryCode.length === 0) return;
    if (this.listing !== null) {
      // a cell's scan covers about (its width in pixels + 3)^2 pixels: past one pass over every pixel (many flagged
      // cells on a raster coarser than the cells), that pass is cheaper
      const { frame } = this.listing.cells;
      const span = (frame.cellSize * (Math.abs(frame.cos) + Math.abs(frame.sin))) / this.raster.side + 3;
      if ((this.flagged.length / 2) * span * span <= this.pixels.length) this.flushCells(this.listing);
      else this.locateSquare(this.listing.cells, null, true);
    } else {
      const { pixelKept } = this.buffers;
      for (let q = 0; q < this.pixels.length; q++) {
        const k = pixelKept[q]!;
        if (k >= 0) this.addEntries(k, q);
      }
    }
    this.entryCode = [];
    this.entryNext = [];
    this.flagged = [];
  }

  /** The entries of kept cell k for pixel q. */
  private addEntries(k: number, q: number): void {
    const { head, entryCode, entryNext, simulated } = this;
    const { excess, deficit } = this.buffers;
    for (let e = head[k]!; e >= 0; e = entryNext[e]!) {
      const code = entryCode[e]!;
      if (code === OBSERVED_EXCESS) excess.add(q);
      else if (code === OBSERVED_DEFICIT) deficit.add(q);
      else simulated.push(code, q);
    }
  }

  /**
   * Each listed cell's pixels: in each raster row the cell's corners span, the valid pixels whose centres lie within
   * one pixel of the cell's extent along that row (its edges cut by the row's centre line) are located
   * (square-pixel-cells.ts, the same arithmetic as locating every pixel) and take the cell's entries when they fall in
   * it. A pixel the contract puts in the cell lies in it to within rounding (far below a pixel), so none is missed.
   * Cost O(listed cells x (pixels per cell + rows per cell)).
   */
  private flushCells(listing: CellListing): void {
    const { cells, grid } = listing;
    const { y0, side, height } = this.raster;
    const extent = new Float64Array(2);
    const cornerX = new Float64Array(4);
    const cornerY = new Float64Array(4);
    const flagged = this.flagged;
    for (let f = 0; f < flagged.length; f += 2) {
      const index = flagged[f + 1]!;
      const gj = Math.floor(index / grid.nx);
      // the cell's corners in planar metres, as a closed ring (the contract's own corners)
      const ring = cellCorners(cells.frame, index - gj * grid.nx + grid.i0, gj + grid.j0);
      let yMin = Infinity;
      let yMax = -Infinity;
      for (let corner = 0; corner < 4; corner++) {
        cornerX[corner] = ring[corner]![0];
        cornerY[corner] = ring[corner]![1];
        yMin = Math.min(yMin, cornerY[corner]!);
        yMax = Math.max(yMax, cornerY[corner]!);
      }
      const rowFrom = Math.max(0, Math.floor((y0 - yMax) / side - 0.5) - 1);
      const rowTo = Math.min(height - 1, Math.ceil((y0 - yMin) / side - 0.5) + 1);
      for (let row = rowFrom; row <= rowTo; row++) {
        // the cell's extent along the row's centre line (clamped into the cell's y-range for the rows beyond it)
        if (extentAlong(cornerX, cornerY, Math.min(yMax, Math.max(yMin, y0 - (row + 0.5) * side)), extent)) this.flushRow(cells, row, extent, flagged[f]!, index);
      }
    }
  }

  /** The valid pixels of `row` within one pixel of [extent[0], extent[1]] that lie in grid cell `index` take kept cell k's entries. */
  private flushRow(cells: SquarePixelCells, row: number, extent: Float64Array, k: number, index: number): void {
    const { rowFirst, col0, col1, q0 } = this.squareCells!.runs;
    const { x0, side } = this.raster;
    const colFrom = Math.floor((extent[0]! - x0) / side - 0.5) - 1;
    const colTo = Math.ceil((extent[1]! - x0) / side - 0.5) + 1;
    let rowSet = false;
    for (let t = rowFirst[row]!; t < rowFirst[row + 1]!; t++) {
      const to = Math.min(colTo + 1, col1[t]!);
      for (let col = Math.max(colFrom, col0[t]!); col < to; col++) {
        if (!rowSet) {
          cells.setRow(row);
          rowSet = true;
        }
        if (cells.cellOf(col) === index) this.addEntries(k, q0[t]! + col - col0[t]!);
      }
    }
  }

  /** Values this chunk appends to the chunk result (ends the last placement). */
  get length(): number {
    this.flushPlacement();
    const { notKept, excess, deficit } = this.buffers;
    return HEAD + 2 * (notKept.size + excess.size + deficit.size) + this.simulated.length;
  }

  /** Writes the layout of the file comment into out at offset; clears the thread's counters for the next chunk. */
  encode(out: Float64Array, offset: number): void {
    this.checkOwner();
    this.flushPlacement();
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

/**
 * Reads the stability part of a chunk result at `offset`, which must end the result.
 * @throws Error when the part does not have this layout (a worker of another version: the queue's task format)
 */
export function decodeStability(result: Float64Array, offset: number): DecodedStability {
  const [placements, k, x, d, e] = [0, 1, 2, 3, 4].map((t) => result[offset + t]!) as [number, number, number, number, number];
  const whole = [placements, k, x, d, e].every((value) => Number.isInteger(value) && value >= 0);
  if (!whole || offset + HEAD + 2 * (k + x + d + e) !== result.length) {
    throw new Error('a chunk result does not have the stability layout of this version (update gridshake on every machine)');
  }
  let at = offset + HEAD;
  const take = (pairs: number): Float64Array => result.subarray(at, (at += 2 * pairs));
  return { placements, notKept: take(k), excess: take(x), deficit: take(d), simulated: take(e) };
}
