/**
 * The hexagon counting kernel: points per hexagon of one placement, by the contract's rounding rule (hex-frame.ts).
 *
 * Built once per point set, like the square kernel (square-counter.ts): points captured by the closure, placement
 * parameters in typed arrays, blocks of points so the loop is optimized by calls.
 * Fast path: fractional axial coordinates from premultiplied coefficients, shifted by (u + i0, v + j0) so that they
 * are local grid indices; the cube rounding gives a candidate hexagon (Q, R); with fq = q - Q, fr = r - R the point
 * lies inside that hexagon with margin when |fq - fr|, |2 fq + fr| and |fq + 2 fr| are all below 1 - band (the
 * hexagon is where these three are at most 1: its three pairs of sides). A point inside the band (near a side,
 * where the premultiplied formula could round differently) is deferred to an exact pass with the contract's formula
 * (division, order of operations, rounding rule), so every point gets exactly the contract's cell.
 * Cost O(n + cells) per placement; memory: a 32 KB buffer of deferred point indices besides the output.
 */
import { cosSinDegrees } from '../../geometry/grid-frame.js';
import type { CoverageGrid, Origin, Placement } from '../../types.js';
import type { CellCounter } from '../lattice.js';
import { createHexFrame, roundHex } from './hex-frame.js';

const BLOCK = 8192;

/** Half-width of the band near hexagon sides (axial units) where the exact pass decides; grows with the grid's reach. */
function nearSideBand(grid: CoverageGrid): number {
  return Math.max(2 ** -20, 2 ** -38 * (Math.abs(grid.i0) + Math.abs(grid.j0) + grid.nx + grid.ny + 2));
}

export function createHexCounter(xy: Float64Array, origin: Origin): CellCounter {
  const points = xy;
  const pointCount = points.length >> 1;
  const originX = origin.x;
  const originY = origin.y;
  // reals: q per dx, q per dy, r per dx, r per dy, u + i0, v + j0, band limit; integers: i0, j0, nx, ny
  const reals = new Float64Array(7);
  const integers = new Int32Array(4);
  let exactFrame = createHexFrame(origin, 1, { u: 0, v: 0, angle: 0 });
  const deferred = new Int32Array(Math.min(BLOCK, Math.max(1, pointCount)));

  /** The contract's formula for the deferred points. */
  function countExactly(out: Int32Array, deferredCount: number): void {
    const frame = exactFrame;
    const i0 = integers[0]!;
    const j0 = integers[1]!;
    const nx = integers[2]!;
    const ny = integers[3]!;
    for (let k = 0; k < deferredCount; k++) {
      const p = deferred[k]!;
      const dx = points[2 * p]! - frame.originX;
      const dy = points[2 * p + 1]! - frame.originY;
      const xPrime = dx * frame.cos + dy * frame.sin;
      const yPrime = -dx * frame.sin + dy * frame.cos;
      const [qi, ri] = roundHex(xPrime / frame.sqrt3Side - yPrime / frame.threeSide - frame.u, yPrime / frame.oneHalfSide - frame.v);
      const c = qi - i0;
      const r = ri - j0;
      if (c >= 0 && c < nx && r >= 0 && r < ny) out[r * nx + c]!++;
    }
  }

  function countBlock(out: Int32Array, start: number, end: number): void {
    const qx = reals[0]!;
    const qy = reals[1]!;
    const rx = reals[2]!;
    const ry = reals[3]!;
    const shiftQ = reals[4]!;
    const shiftR = reals[5]!;
    const limit = reals[6]!;
    const nx = integers[2]!;
    const ny = integers[3]!;
    const data = points;
    const pending = deferred;
    const ox = originX;
    const oy = originY;
    let deferredCount = 0;
    for (let p = start; p < end; p++) {
      const dx = data[2 * p]! - ox;
      const dy = data[2 * p + 1]! - oy;
      const q = dx * qx + dy * qy - shiftQ;
      const r = dx * rx + dy * ry - shiftR;
      const m = -q - r;
      let qi = Math.round(q);
      let ri = Math.round(r);
      const mi = Math.round(m);
      const dq = Math.abs(qi - q);
      const dr = Math.abs(ri - r);
      const dm = Math.abs(mi - m);
      if (dq > dm && dq > dr) qi = -mi - ri;
      else if (!(dm > dr)) ri = -qi - mi;
      const fq = q - qi;
      const fr = r - ri;
      if (Math.abs(fq - fr) < limit && Math.abs(fq + fq + fr) < limit && Math.abs(fq + fr + fr) < limit) {
        if (qi >= 0 && qi < nx && ri >= 0 && ri < ny) out[ri * nx + qi]!++;
      } else {
        pending[deferredCount++] = p;
      }
    }
    countExactly(out, deferredCount);
  }

  return {
    pointCount,
    count(grid: CoverageGrid, cellSize: number, placement: Placement, out: Int32Array): void {
      if (grid.shape !== 'hex') throw new RangeError(`the hexagon counter was given a ${grid.shape ?? 'square'} grid`);
      if (out.length < grid.nx * grid.ny) {
        throw new RangeError(`count output holds ${out.length} cells, the grid has ${grid.nx} x ${grid.ny}`);
      }
      exactFrame = createHexFrame(origin, cellSize, placement);
      const { cos, sin } = cosSinDegrees(placement.angle);
      const { sqrt3Side, threeSide, oneHalfSide } = exactFrame;
      // q = x'/(sqrt3 a) - y'/(3a) - u with x' = dx cos + dy sin, y' = -dx sin + dy cos; r = y'/(1.5 a) - v
      reals[0] = cos / sqrt3Side + sin / threeSide;
      reals[1] = sin / sqrt3Side - cos / threeSide;
      reals[2] = -sin / oneHalfSide;
      reals[3] = cos / oneHalfSide;
      reals[4] = placement.u + grid.i0;
      reals[5] = placement.v + grid.j0;
      reals[6] = 1 - 3 * nearSideBand(grid);
      integers[0] = grid.i0;
      integers[1] = grid.j0;
      integers[2] = grid.nx;
      integers[3] = grid.ny;
      out.fill(0, 0, grid.nx * grid.ny);
      for (let start = 0; start < pointCount; start += BLOCK) countBlock(out, start, Math.min(pointCount, start + BLOCK));
    },
  };
}
