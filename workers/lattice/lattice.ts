/**
 * The lattice seam: everything that depends on the shape of the cells. A lattice tiles the plane with cells of area
 * s^2 (s = cellSize, metres) in the grid frame of shared/design.md (origin O, counter-clockwise angle t, offset
 * (u, v) in lattice units). The rest of the engine (kept cells, statistics, simulations) works on the coverage grid
 * and the counts and never asks what shape a cell has.
 *
 * A new shape is one folder under workers/lattice/ implementing this interface plus one line in registry.ts.
 */
import type { BandBuffers, CountArray, CoverageGrid, GridExtent, KeptCells, Origin, Placement, Region } from '../types.js';
import type { CellShape } from './cell-shape.js';

export interface CellCounter {
  /** Number of points the counter holds. */
  readonly pointCount: number;
  /**
   * Fill out[(j - j0) * nx + (i - i0)] with the number of points in cell (i, j) of `grid` (out is zeroed first;
   * out.length >= nx * ny). Points whose cell is outside the grid are ignored.
   */
  count(grid: GridExtent, cellSize: number, placement: Placement, out: CountArray): void;
  /**
   * Optional: an int32 array of at least `cells` cells that `count` fills without a copy (a counter whose points
   * live in WebAssembly memory: the array is in that memory), or null when it has none to give. One per thread and
   * memory: a later call returns the same array while it is large enough.
   */
  countBuffer?(cells: number): Int32Array | null;
  /** With countBuffer: whether `array` is the one countBuffer gave this thread (counted in place). */
  ownsCountBuffer?(array: Int32Array): boolean;
}

/** Throws RangeError unless `out` holds the grid's cells (what every counter's `count` requires first). */
export function checkCountOutput(grid: GridExtent, out: CountArray): void {
  if (out.length < grid.nx * grid.ny) {
    throw new RangeError(`count output holds ${out.length} cells, the grid has ${grid.nx} x ${grid.ny}`);
  }
}

/** One placement of a lattice: cell of a point and polygon of a cell, in planar metres. */
export interface LatticeFrame {
  /** The cell (i, j) holding a planar point, by the lattice's exact rule. */
  cellOfPoint(px: number, py: number): [number, number];
  /** The same cell written to out[0], out[1], without allocating (loops over many points, e.g. raster pixels). */
  cellOfPointInto(px: number, py: number, out: Float64Array): void;
  /** The cell's boundary as a closed ring (first vertex repeated), counter-clockwise, planar metres. */
  cellPolygon(i: number, j: number): [number, number][];
}

export interface Lattice {
  readonly shape: CellShape;
  /** Turning the lattice by this many degrees maps it onto itself: placements use angles in [0, anglePeriod). */
  readonly anglePeriod: number;
  /**
   * Exact coverage |cell ∩ region| / s^2 of every cell the region may touch, all at once; the grid is tagged with the
   * lattice's shape so that counts and coverage cannot come from different shapes.
   */
  coverage(region: Region, origin: Origin, cellSize: number, placement: Placement): CoverageGrid;
  /**
   * Optional: the grid and exactly the cells that selectCells(coverage(...), minCoverage) keeps, without holding
   * the whole grid's coverage (workers/placement/select-cells-by-band.ts); the kept cells are views of
   * buffers.kept, valid until the buffers are used again. A lattice without it is evaluated from its whole grid.
   */
  keptCells?(region: Region, origin: Origin, cellSize: number, placement: Placement, minCoverage: number, buffers: BandBuffers): { grid: GridExtent; kept: KeptCells };
  /** A counter of the flat points xy (x0, y0, x1, y1, ...; planar metres) with the lattice's fast path. */
  createCounter(xy: Float64Array, origin: Origin): CellCounter;
  frame(origin: Origin, cellSize: number, placement: Placement): LatticeFrame;
}

/** A lattice's `frame` from its frame maker and its rules over that frame (cell of a point, cell polygon). */
export function frameFromRules<F>(
  create: (origin: Origin, cellSize: number, placement: Placement) => F,
  cellOfPoint: (frame: F, px: number, py: number) => [number, number],
  cellOfPointInto: (frame: F, px: number, py: number, out: Float64Array) => void,
  cellPolygon: (frame: F, i: number, j: number) => [number, number][],
): Lattice['frame'] {
  return (origin, cellSize, placement) => {
    const frame = create(origin, cellSize, placement);
    return {
      cellOfPoint: (px, py) => cellOfPoint(frame, px, py),
      cellOfPointInto: (px, py, out) => cellOfPointInto(frame, px, py, out),
      cellPolygon: (i, j) => cellPolygon(frame, i, j),
    };
  };
}
