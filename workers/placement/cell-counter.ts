/**
 * The counting kernel: points per cell of one placement, per the grid contract
 *   i = floor((dx cos t + dy sin t) / s - u), j = floor((-dx sin t + dy cos t) / s - v), dx = px - Ox, dy = py - Oy.
 *
 * Built once per dataset: the point array is captured by the closure, placement parameters travel in typed arrays
 * (integers in an Int32Array, reals in a Float64Array) so that the loop stays monomorphic.
 * Fast path: multiply by 1/s and shift by (u + i0) so that in-grid indices are non-negative and `| 0` equals
 * floor. A point whose shifted cell coordinate lies within 2^-20 of a grid line takes the exact path (the contract's
 * formula with division and Math.floor), so every point gets exactly the contract's cell. Float64 throughout:
 * float32 moves points across lines (issue 3, benchmark notes).
 * Cost O(n + cells) per placement, O(1) memory besides the output.
 */
import type { CoverageGrid, Origin, Placement } from '../types.js';
import { cosSinDegrees } from '../geometry/grid-frame.js';

export interface CellCounter {
  /** Number of points the counter holds. */
  readonly pointCount: number;
  /**
   * Fill out[(j - j0) * nx + (i - i0)] with the number of points in cell (i, j) of `grid` (out is zeroed first;
   * out.length >= nx * ny). Points whose cell is outside the grid are ignored. Returns the number counted.
   */
  count(grid: CoverageGrid, cellSize: number, placement: Placement, out: Int32Array): number;
}

/**
 * Half-width of the band around grid lines where the exact path decides (cell units): 2^-20, widened for grids far
 * from the origin so that it always exceeds the fast path's rounding error (a few ulps of |X| + |u + i0|).
 */
function nearLineBand(grid: CoverageGrid): number {
  return Math.max(2 ** -20, 2 ** -40 * (Math.abs(grid.i0) + Math.abs(grid.j0) + grid.nx + grid.ny + 2));
}

/** A counter over the flat points xy (x0, y0, x1, y1, ...), planar metres, against grid origin `origin`. */
export function createCellCounter(xy: Float64Array, origin: Origin): CellCounter {
  const points = xy;
  const pointCount = points.length >> 1;
  // reals: originX, originY, cos, sin, 1/s, u + i0, v + j0, s, u, v, near-line band; integers: i0, j0, nx, ny
  const reals = new Float64Array(11);
  const integers = new Int32Array(4);
  reals[0] = origin.x;
  reals[1] = origin.y;

  function exactIndex(dx: number, dy: number, axis: 0 | 1): number {
    const s = reals[7]!;
    if (axis === 0) return Math.floor((dx * reals[2]! + dy * reals[3]!) / s - reals[8]!) - integers[0]!;
    return Math.floor((-dx * reals[3]! + dy * reals[2]!) / s - reals[9]!) - integers[1]!;
  }

  function countPoints(out: Int32Array): number {
    const ox = reals[0]!;
    const oy = reals[1]!;
    const cos = reals[2]!;
    const sin = reals[3]!;
    const inverseSize = reals[4]!;
    const shiftX = reals[5]!;
    const shiftY = reals[6]!;
    const nx = integers[2]!;
    const ny = integers[3]!;
    const near = reals[10]!;
    const upperX = nx + near;
    const upperY = ny + near;
    let counted = 0;
    for (let p = 0; p < pointCount; p++) {
      const dx = points[2 * p]! - ox;
      const dy = points[2 * p + 1]! - oy;
      const x = (dx * cos + dy * sin) * inverseSize - shiftX;
      const y = (dy * cos - dx * sin) * inverseSize - shiftY;
      if (!(x > -near && x < upperX && y > -near && y < upperY)) continue;
      let i = x | 0;
      let j = y | 0;
      const fx = x - i;
      const fy = y - j;
      if (fx < near || fx > 1 - near) i = exactIndex(dx, dy, 0);
      if (fy < near || fy > 1 - near) j = exactIndex(dx, dy, 1);
      if (i >= 0 && i < nx && j >= 0 && j < ny) {
        out[j * nx + i]!++;
        counted++;
      }
    }
    return counted;
  }

  return {
    pointCount,
    count(grid: CoverageGrid, cellSize: number, placement: Placement, out: Int32Array): number {
      if (!(cellSize > 0) || !Number.isFinite(cellSize)) {
        throw new RangeError(`cell size must be a positive finite number of metres, got ${cellSize}`);
      }
      if (out.length < grid.nx * grid.ny) {
        throw new RangeError(`count output holds ${out.length} cells, the grid has ${grid.nx} x ${grid.ny}`);
      }
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
      return countPoints(out);
    },
  };
}
