/**
 * What the lattices' counting kernels share (square/square-counter.ts, hex/hex-counter.ts): points go through the fast
 * pass in blocks of COUNT_BLOCK (which also sizes the buffer of deferred points), and the points a fast pass defers
 * (near a cell boundary) are counted by the lattice's exact cell rule. Each lattice keeps its own fast pass: its hot
 * loop reads its own locals, which V8 optimizes per function (square-counter.ts). The exact pass sees about 1e-5 of
 * the points, so it may call the lattice's rule through a function.
 * Cost O(points deferred) per exact pass.
 */
import type { CoverageGrid, Origin } from '../types.js';

/** Points per block of the fast pass; also the size of the buffer of points deferred to the exact pass. */
export const COUNT_BLOCK = 8192;

/** The buffer of deferred point indices of a counter over `pointCount` points (32 KB at most). */
export function deferredBuffer(pointCount: number): Int32Array {
  return new Int32Array(Math.min(COUNT_BLOCK, Math.max(1, pointCount)));
}

/** Refuses an output array smaller than the grid. */
export function checkCountOutput(grid: CoverageGrid, out: Int32Array): void {
  if (out.length < grid.nx * grid.ny) {
    throw new RangeError(`count output holds ${out.length} cells, the grid has ${grid.nx} x ${grid.ny}`);
  }
}

/** Runs `countBlock` over points [0, pointCount) in blocks of COUNT_BLOCK. */
export function countInBlocks(pointCount: number, out: Int32Array, countBlock: (out: Int32Array, start: number, end: number) => void): void {
  for (let start = 0; start < pointCount; start += COUNT_BLOCK) countBlock(out, start, Math.min(pointCount, start + COUNT_BLOCK));
}

/**
 * The lattice's exact cell rule for a point at (dx, dy) from the grid origin: writes the cell's indices (i, j) into
 * `cell[0]`, `cell[1]`.
 */
export type ExactCellRule = (dx: number, dy: number, cell: Float64Array) => void;

/**
 * The exact pass of a counter over the flat points xy: counts each of the first `deferredCount` points of `deferred`
 * by `rule` into out[(j - j0) * nx + (i - i0)], the grid given as `bounds` = [i0, j0, nx, ny]; cells outside the grid
 * are ignored.
 */
export function createExactPass(
  xy: Float64Array,
  origin: Origin,
  rule: ExactCellRule,
): (out: Int32Array, deferred: Int32Array, deferredCount: number, bounds: Int32Array) => void {
  const points = xy;
  const originX = origin.x;
  const originY = origin.y;
  const cell = new Float64Array(2);
  return (out, deferred, deferredCount, bounds) => {
    const i0 = bounds[0]!;
    const j0 = bounds[1]!;
    const nx = bounds[2]!;
    const ny = bounds[3]!;
    for (let k = 0; k < deferredCount; k++) {
      const p = deferred[k]!;
      rule(points[2 * p]! - originX, points[2 * p + 1]! - originY, cell);
      const i = cell[0]! - i0;
      const j = cell[1]! - j0;
      if (i >= 0 && i < nx && j >= 0 && j < ny) out[j * nx + i]!++;
    }
  };
}
