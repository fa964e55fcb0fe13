/**
 * The hexagon counting kernel: points per hexagon of one placement, by the contract's rounding rule (hex-frame.ts).
 *
 * Built once per point set, like the square kernel (square-counter.ts): points captured by the closure, placement
 * parameters in typed arrays, blocks of points so the loop is optimized by calls.
 * Fast path: fractional axial coordinates (q, r) from premultiplied coefficients, shifted so that in-grid values are
 * positive and `| 0` is floor; the nearest centre is one of the four corners of the axial unit cell (q0, r0) (the
 * cell splits into two equilateral triangles), read from a 128 x 128 table over (q - q0, r - r0) built once (squared
 * distance ~ q^2 + q r + r^2 in axial units). A point in a table square that a bisector passes within 2^-16 of (about
 * 3 % of them with the 128 x 128 table) is decided by the bisectors themselves: with fq = q - q0, fr = r - r0 the
 * nearest corner is (0, 0) when 2 fq + fr < 1 and fq + 2 fr < 1, (1, 1) when both exceed 2, else (1, 0) when fq > fr
 * and (0, 1) otherwise (bisectors of the corners in the metric q^2 + q r + r^2); only a point within 4 x the
 * near-side band of one of these lines goes to the exact pass (about 1e-5 of the points instead of 1.5 % before,
 * whose exact pass cost about 50 ns each). The table is 16 KB so that it stays in the first-level cache beside the
 * counts: branch-light, the table measured 4 times faster than deciding every point by the bisectors with branches
 * (mispredicted at random), and faster than branch-free arithmetic on the bisectors or the three-floor formula.
 * Away from ties the rule of the contract also gives the nearest centre (it is the A2 lattice decoder of Conway &
 * Sloane 1982, "Fast quantizing and decoding algorithms for lattice quantizers and codes", IEEE Trans. Inf. Theory
 * 28:227-232, from memory). A point within a band of a bisector that decides its cell (where the premultiplied formula
 * could differ from the contract's) is deferred to an exact pass with the contract's formula (division, order of
 * operations, rounding rule), so every point gets exactly the contract's cell.
 * Cost O(n + cells) per placement; memory: a 32 KB buffer of deferred point indices besides the output.
 */
import { cosSinDegrees } from '../../geometry/grid-frame.js';
import type { CoverageGrid, Origin, Placement } from '../../types.js';
import type { CellCounter } from '../lattice.js';
import { createHexFrame, roundHexInto } from './hex-frame.js';

const BLOCK = 8192;

/** Side of the table over the axial unit cell (fq, fr) in [0, 1)^2: 2^TABLE_BITS. */
const TABLE_BITS = 7;
const TABLE_SIZE = 1 << TABLE_BITS;
const TABLE_MASK = TABLE_SIZE - 1;
/** How far (axial units) a table square must stay from every bisector to be decided by the table. */
const TABLE_MARGIN = 2 ** -16;
/** Table entry of a square that a bisector passes near: the point goes to the exact pass. */
const NEAR_BISECTOR = 4;

/** Squared distance (up to a factor 3 a^2) between axial offsets: x'^2 + y'^2 = 3 a^2 (q^2 + q r + r^2). */
function axialDistance(q: number, r: number): number {
  return q * q + q * r + r * r;
}

/** The nearest corner k of the axial unit cell (corner k at (k & 1, k >> 1)) of (fq, fr), or NEAR_BISECTOR within margin. */
function nearestCorner(fq: number, fr: number): number {
  const distances = [0, 1, 2, 3].map((k) => axialDistance(fq - (k & 1), fr - (k >> 1)));
  const order = [0, 1, 2, 3].sort((a, b) => distances[a]! - distances[b]!);
  // the distance difference to the second nearest, over the gradient bound 3 of axialDistance on the cell, bounds the
  // distance to the bisector
  return distances[order[1]!]! - distances[order[0]!]! > 3 * TABLE_MARGIN ? order[0]! : NEAR_BISECTOR;
}

/**
 * For each square [a, a+1) x [b, b+1) / TABLE_SIZE of the axial unit cell: the corner nearest to all of it (0..3), or
 * NEAR_BISECTOR. A square is decided when its four corners, pushed out by the margin, have the same nearest corner with
 * room to spare: the Voronoi regions are convex, so the whole square (and the margin around it) is then in that region.
 */
const CORNER_TABLE: Uint8Array = (() => {
  const table = new Uint8Array(TABLE_SIZE * TABLE_SIZE);
  for (let a = 0; a < TABLE_SIZE; a++) {
    for (let b = 0; b < TABLE_SIZE; b++) {
      const low = -TABLE_MARGIN;
      const high = 1 / TABLE_SIZE + TABLE_MARGIN;
      const found = [
        nearestCorner(a / TABLE_SIZE + low, b / TABLE_SIZE + low),
        nearestCorner(a / TABLE_SIZE + high, b / TABLE_SIZE + low),
        nearestCorner(a / TABLE_SIZE + low, b / TABLE_SIZE + high),
        nearestCorner(a / TABLE_SIZE + high, b / TABLE_SIZE + high),
      ];
      table[a * TABLE_SIZE + b] = found.every((corner) => corner === found[0]) ? found[0]! : NEAR_BISECTOR;
    }
  }
  return table;
})();

/** Half-width of the band near hexagon sides (axial units) where the exact pass decides; grows with the grid's reach. */
function nearSideBand(grid: CoverageGrid): number {
  return Math.max(2 ** -20, 2 ** -38 * (Math.abs(grid.i0) + Math.abs(grid.j0) + grid.nx + grid.ny + 2));
}

export function createHexCounter(xy: Float64Array, origin: Origin): CellCounter {
  const points = xy;
  const pointCount = points.length >> 1;
  const originX = origin.x;
  const originY = origin.y;
  // reals: q per dx, q per dy, r per dx, r per dy, u + i0 - 1, v + j0 - 1, bisector band; integers: i0, j0, nx, ny
  const reals = new Float64Array(7);
  const integers = new Int32Array(4);
  let exactFrame = createHexFrame(origin, 1, { u: 0, v: 0, angle: 0 });
  const deferred = new Int32Array(Math.min(BLOCK, Math.max(1, pointCount)));
  const cell = new Float64Array(2);

  /** The contract's formula for the deferred points. */
  // the same shape as square-counter.ts's exact pass, apart on purpose: shared, it measured slower (see DEVELOPERS.md)
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
      roundHexInto(xPrime / frame.sqrt3Side - yPrime / frame.threeSide - frame.u, yPrime / frame.oneHalfSide - frame.v, cell);
      const c = cell[0]! - i0;
      const r = cell[1]! - j0;
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
    const band = reals[6]!;
    const nx = integers[2]!;
    const ny = integers[3]!;
    const upperQ = nx + 1;
    const upperR = ny + 1;
    const data = points;
    const pending = deferred;
    const corners = CORNER_TABLE;
    const ox = originX;
    const oy = originY;
    let deferredCount = 0;
    for (let p = start; p < end; p++) {
      const dx = data[2 * p]! - ox;
      const dy = data[2 * p + 1]! - oy;
      // axial coordinates shifted so that grid column c (0-based) spans q in [c + 1/3, c + 5/3]: `| 0` floors
      const q = dx * qx + dy * qy - shiftQ;
      const r = dx * rx + dy * ry - shiftR;
      if (q > 1 && q < nx && r > 1 && r < ny) {
        // every corner (q0 or q0 + 1, r0 or r0 + 1) is a grid cell: columns and rows 1..nx, 1..ny
        // q * 2^7 is exact, so its integer part holds q0 above 7 bits and the table column in the low 7 bits
        const qScaled = (q * TABLE_SIZE) | 0;
        const rScaled = (r * TABLE_SIZE) | 0;
        const corner = corners[((qScaled & TABLE_MASK) << TABLE_BITS) | (rScaled & TABLE_MASK)]!;
        if (corner === NEAR_BISECTOR) {
          // second level: the bisectors of the axial unit cell (header comment); q0, r0 >= 1, so fq and fr are exact
          const q0 = qScaled >> TABLE_BITS;
          const r0 = rScaled >> TABLE_BITS;
          const fq = q - q0;
          const fr = r - r0;
          const s1 = 2 * fq + fr;
          const s2 = fq + 2 * fr;
          const d = fq - fr;
          if (
            Math.abs(s1 - 1) < band ||
            Math.abs(s2 - 1) < band ||
            Math.abs(s1 - 2) < band ||
            Math.abs(s2 - 2) < band ||
            Math.abs(d) < band
          ) {
            pending[deferredCount++] = p;
          } else if (s1 < 1 && s2 < 1) out[(r0 - 1) * nx + q0 - 1]!++;
          else if (s1 > 2 && s2 > 2) out[r0 * nx + q0]!++;
          else if (d > 0) out[(r0 - 1) * nx + q0]!++;
          else out[r0 * nx + q0 - 1]!++;
        } else out[((rScaled >> TABLE_BITS) - 1 + (corner >> 1)) * nx + (qScaled >> TABLE_BITS) - 1 + (corner & 1)]!++;
      } else if (q > 0 && q < upperQ && r > 0 && r < upperR) {
        // the grid's outer strip (a region's points never lie there: hexCoverage pads the grid by 2/3)
        pending[deferredCount++] = p;
      }
    }
    countExactly(out, deferredCount);
  }

  /** Every point by the exact pass (grids so far from the origin that the table's margin would not cover the error). */
  function countAllExactly(out: Int32Array): void {
    for (let start = 0; start < pointCount; start += BLOCK) {
      const end = Math.min(pointCount, start + BLOCK);
      for (let p = start; p < end; p++) deferred[p - start] = p;
      countExactly(out, end - start);
    }
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
      reals[4] = placement.u + grid.i0 - 1;
      reals[5] = placement.v + grid.j0 - 1;

      integers[0] = grid.i0;
      integers[1] = grid.j0;
      integers[2] = grid.nx;
      integers[3] = grid.ny;
      // the fast (q, r) differ from the contract's by less than nearSideBand in each coordinate, so s1 = 2 fq + fr,
      // s2 and d by less than 3 times that plus their own rounding
      reals[6] = 4 * nearSideBand(grid);
      out.fill(0, 0, grid.nx * grid.ny);
      // far from the origin the table's margin would not cover the fast path's rounding; beyond 2^24 columns or rows
      // q * 2^7 leaves the 32-bit range of `| 0`
      const reach = Math.max(grid.nx, grid.ny) + 2;
      if (nearSideBand(grid) >= TABLE_MARGIN || reach * TABLE_SIZE >= 2 ** 31) {
        countAllExactly(out);
        return;
      }
      for (let start = 0; start < pointCount; start += BLOCK) countBlock(out, start, Math.min(pointCount, start + BLOCK));
    },
  };
}
