/**
 * The counting kernel: points per cell of one placement, per the grid contract
 *   i = floor((dx cos t + dy sin t) / s - u), j = floor((-dx sin t + dy cos t) / s - v), dx = px - Ox, dy = py - Oy.
 *
 * Built once per dataset: the point array is captured by the closure, placement parameters travel in typed arrays
 * (integers in an Int32Array, reals in a Float64Array) so that the loop stays monomorphic.
 * Fast path: multiply by 1/s and shift by (u + i0) so that in-grid indices are non-negative and `| 0` equals
 * floor. A point whose shifted cell coordinate lies within 2^-20 of a grid line is deferred to an exact pass (the
 * contract's formula with division and Math.floor), so every point gets exactly the contract's cell. Float64 throughout:
 * float32 moves points across lines (issue 3, benchmark notes).
 * Measured on the 2-core test machine, 1e6 uniform points, 5 per cell, 16 rotated placements, CPU time: about
 * 4.6 to 5.5 ns per point-placement with Morton-sorted points against 8.2 to 8.7 for the plain loop (division,
 * Math.floor). The hot loop reads the closure's arrays through locals: with closure slots it ran 25 to 30 %
 * slower as soon as a second counter (the simulated patterns) was alive in the thread. `npm run bench` measures it.
 * Cost O(n + cells) per placement; memory: a 32 KB buffer of deferred point indices besides the output.
 */
import type { CountArray, GridExtent, Origin, Placement } from '../../types.js';
import { cosSinDegrees } from '../../geometry/grid-frame.js';
import { checkCountOutput, type CellCounter } from '../lattice.js';

/** Points per block of the fast pass; also the size of the buffer of points deferred to the exact pass. */
export const BLOCK = 8192;

/**
 * Half-width of the band around grid lines where the exact path decides (cell units): 2^-20, widened for grids far
 * from the origin so that it always exceeds the fast path's rounding error (a few ulps of |X| + |u + i0|).
 */
export function nearLineBand(grid: GridExtent): number {
  return Math.max(2 ** -20, 2 ** -40 * (Math.abs(grid.i0) + Math.abs(grid.j0) + grid.nx + grid.ny + 2));
}

/** Throws RangeError unless the cell size is a positive finite number and `out` holds the grid's cells. */
export function checkCountArguments(grid: GridExtent, cellSize: number, out: CountArray): void {
  if (!(cellSize > 0) || !Number.isFinite(cellSize)) {
    throw new RangeError(`cell size must be a positive finite number of metres, got ${cellSize}`);
  }
  checkCountOutput(grid, out);
}

/** A counter over the flat points xy (x0, y0, x1, y1, ...), planar metres, against grid origin `origin`. */
export function createSquareCounter(xy: Float64Array, origin: Origin): CellCounter {
  const points = xy;
  const pointCount = points.length >> 1;
  // reals: originX, originY, cos, sin, 1/s, u + i0, v + j0, s, u, v, near-line band; integers: i0, j0, nx, ny
  const reals = new Float64Array(11);
  const integers = new Int32Array(4);
  reals[0] = origin.x;
  reals[1] = origin.y;
  const originX = origin.x;
  const originY = origin.y;

  // Points near a grid line are deferred to an exact pass after each block: the hot loop stays small (measured 2x
  // faster than deciding them inline) and the exact pass is rare (about 4 * 2^-20 of the points). Blocks also make
  // the loop function hot by calls, so V8 optimizes it with full type feedback instead of relying on on-stack
  // replacement (measured: OSR code deoptimized at every call, halving the speed).
  const deferred = new Int32Array(Math.min(BLOCK, Math.max(1, pointCount)));

  /** The contract's formula (division, Math.floor) for the deferred points. */
  // the same shape as hex-counter.ts's exact pass, apart on purpose: shared, it measured slower (see DEVELOPERS.md)
  function countExactly(out: CountArray, deferredCount: number): void {
    const ox = reals[0]!;
    const oy = reals[1]!;
    const cos = reals[2]!;
    const sin = reals[3]!;
    const s = reals[7]!;
    const u = reals[8]!;
    const v = reals[9]!;
    const i0 = integers[0]!;
    const j0 = integers[1]!;
    const nx = integers[2]!;
    const ny = integers[3]!;
    for (let k = 0; k < deferredCount; k++) {
      const p = deferred[k]!;
      const dx = points[2 * p]! - ox;
      const dy = points[2 * p + 1]! - oy;
      const i = Math.floor((dx * cos + dy * sin) / s - u) - i0;
      const j = Math.floor((-dx * sin + dy * cos) / s - v) - j0;
      if (i >= 0 && i < nx && j >= 0 && j < ny) out[j * nx + i]!++;
    }
  }

  /** The fast pass over points [start, end), then the exact pass over the points it deferred. */
  function countBlock(out: CountArray, start: number, end: number): void {
    const cosOverSize = reals[2]! * reals[4]!;
    const sinOverSize = reals[3]! * reals[4]!;
    const shiftX = reals[5]!;
    const shiftY = reals[6]!;
    const nx = integers[2]!;
    const ny = integers[3]!;
    const near = reals[10]!;
    // locals, not closure slots, in the hot loop: V8 then keeps them in registers even when several counters
    // (closures of this function) are alive and the optimized code cannot be specialized to one closure
    const xy = points;
    const pending = deferred;
    const ox = originX;
    const oy = originY;
    const halfBand = 0.5 - near;
    const upperX = nx + near;
    const upperY = ny + near;
    let deferredCount = 0;
    for (let p = start; p < end; p++) {
      const dx = xy[2 * p]! - ox;
      const dy = xy[2 * p + 1]! - oy;
      const x = dx * cosOverSize + dy * sinOverSize - shiftX;
      const y = dy * cosOverSize - dx * sinOverSize - shiftY;
      if (x > -near && x < upperX && y > -near && y < upperY) {
        const i = x | 0;
        const j = y | 0;
        // |f - 0.5| > 0.5 - near  <=>  f < near or f > 1 - near (f the fractional part): two compares, not four
        if (Math.abs(x - i - 0.5) > halfBand || Math.abs(y - j - 0.5) > halfBand) pending[deferredCount++] = p;
        else out[j * nx + i]!++;
      }
    }
    countExactly(out, deferredCount);
  }

  return {
    pointCount,
    count(grid: GridExtent, cellSize: number, placement: Placement, out: CountArray): void {
      checkCountArguments(grid, cellSize, out);
      const { cos, sin } = cosSinDegrees(placement.angle);
      reals[2] = cos;
      reals[3] = sin;
      reals[4] = 1 / cellSize;
      reals[5] = placement.u + grid.i0;
      reals[6] = placement.v + grid.j0;
      reals[7] = cellSize;
      reals[8] = placement.u;
      reals[9] = placement.v;
      reals[10] = nearLineBand(grid);
      integers[0] = grid.i0;
      integers[1] = grid.j0;
      integers[2] = grid.nx;
      integers[3] = grid.ny;
      out.fill(0, 0, grid.nx * grid.ny);
      for (let start = 0; start < pointCount; start += BLOCK) countBlock(out, start, Math.min(pointCount, start + BLOCK));
    },
  };
}
