/**
 * The hexagon counting kernel: points per hexagon of one placement, by the contract's rounding rule (hex-frame.ts).
 *
 * Built once per point set, like the square kernel (square-counter.ts), in blocks of points.
 * Fast path: fractional axial coordinates (q, r) from premultiplied coefficients, scaled by 2^7 (exact: a power of two)
 * and shifted so that in-grid values are positive and `| 0` is floor; the nearest centre is one of the four corners of
 * the axial unit cell (q0, r0) (the cell splits into two equilateral triangles), read from a 128 x 128 table over
 * (q - q0, r - r0) built once (squared distance ~ q^2 + q r + r^2 in axial units). The table is 16 KB so that it stays
 * in the first-level cache beside the counts. A table square that a bisector passes within 2^-16 of (about 3 % of them)
 * holds NEAR_BISECTOR; such a point is counted in corner (0, 0) for now and its index appended to a list without a
 * branch (the list length grows by `code >> 2`, 1 only for NEAR_BISECTOR): a branch there was mispredicted for about
 * 3 % of the points. After the block, each listed point is taken back from corner (0, 0) and decided by the bisectors
 * of the unit cell without branches: with fq = q - q0, fr = r - r0, t = [fq > fr], the corner is
 * (cq, cr) = ([2 fq + fr + t > 2], [fq + 2 fr - t > 1]) (bisectors of the corners in the metric q^2 + q r + r^2);
 * only a point within 4 x the near-side band of one of these lines goes to the exact pass (about 1e-5 of the points,
 * about 50 ns each).
 * Grids too large for the second-level cache (INLINE_FROM_CELLS) use countInlineBlock instead, which decides a
 * near-bisector point at once by the same bisectors: there the counts' cache misses hide the mispredicted branch, and
 * the second pass over the listed points cost more (measured in `npm run bench -- hex`, README).
 * The block loops are module functions with typed-array arguments, not closures: a closure's optimized code is
 * specialized to its context, and as soon as a second counter exists (the simulated patterns, or a second point set)
 * V8 recompiles it with every closure value loaded, checked and converted in the loop; measured 25 to 30 % slower
 * for hexagons with a second counter alive.
 * Away from ties the rule of the contract also gives the nearest centre (it is the A2 lattice decoder of Conway &
 * Sloane 1982, "Fast quantizing and decoding algorithms for lattice quantizers and codes", IEEE Trans. Inf. Theory
 * 28:227-232, from memory). A point within a band of a bisector that decides its cell (where the premultiplied formula
 * could differ from the contract's) is deferred to an exact pass with the contract's formula (division, order of
 * operations, rounding rule), so every point gets exactly the contract's cell.
 * Cost O(n + cells) per placement; memory: two 32 KB buffers of point indices besides the output.
 */
import { cosSinDegrees } from '../../geometry/grid-frame.js';
import type { CountArray, GridExtent, Origin, Placement } from '../../types.js';
import { checkCountOutput, type CellCounter } from '../lattice.js';
import { createHexFrame, roundHexInto } from './hex-frame.js';

const BLOCK = 8192;

/** Side of the table over the axial unit cell (fq, fr) in [0, 1)^2: 2^TABLE_BITS. */
const TABLE_BITS = 7;
const TABLE_SIZE = 1 << TABLE_BITS;
/** How far (axial units) a table square must stay from every bisector to be decided by the table. */
const TABLE_MARGIN = 2 ** -16;
/** Table entry of a square that a bisector passes near (the only entry with bit 2 set): decided after the block. */
const NEAR_BISECTOR = 4;
/**
 * Grids of at least this many cells are counted by countInlineBlock: 2^17 counts of 4 bytes fill the 512 KB
 * second-level cache of the benchmark machine (AMD EPYC), beyond which the counts' cache misses dominate.
 */
const INLINE_FROM_CELLS = 2 ** 17;

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
function nearSideBand(grid: GridExtent): number {
  return Math.max(2 ** -20, 2 ** -38 * (Math.abs(grid.i0) + Math.abs(grid.j0) + grid.nx + grid.ny + 2));
}

/**
 * Parameters of one placement, shared by the block functions. reals: q per dx, q per dy, r per dx, r per dy (all
 * times 2^7), (u + i0 - 1) 2^7, (v + j0 - 1) 2^7, bisector band (axial units), origin x, origin y; integers: i0, j0,
 * nx, ny, then the block's counts of listed (near-bisector) and deferred points.
 */
const REAL_SLOTS = 9;
const INTEGER_SLOTS = 6;
const LISTED = 4;
const DEFERRED = 5;

/**
 * The fast pass over points [start, end): every point in the grid's interior is counted in the corner the table gives
 * (corner (0, 0) for NEAR_BISECTOR, whose index goes to `listed`); points of the grid's outer strip go to `deferred`.
 * The literals 128, 127 and 7 are TABLE_SIZE, TABLE_SIZE - 1 and TABLE_BITS, and `code >> 2` is 1 for NEAR_BISECTOR
 * only (module constants are loaded and checked in the loop by V8). `steps[code]` is the index of the table's corner
 * relative to cell (q0 + 1, r0 + 1): (cr - 1) nx + cq - 1 for corner (cq, cr), corner (0, 0) for NEAR_BISECTOR.
 * Used while the grid's counts fit in the second-level cache (countInlineBlock otherwise).
 */
function countFastBlock(
  points: Float64Array,
  start: number,
  end: number,
  reals: Float64Array,
  integers: Int32Array,
  corners: Uint8Array,
  steps: Int32Array,
  listed: Int32Array,
  deferred: Int32Array,
  out: CountArray,
): void {
  const qx = reals[0]!;
  const qy = reals[1]!;
  const rx = reals[2]!;
  const ry = reals[3]!;
  const shiftQ = reals[4]!;
  const shiftR = reals[5]!;
  const ox = reals[7]!;
  const oy = reals[8]!;
  const nx = integers[2]!;
  const ny = integers[3]!;
  // scaled bounds: column c (0-based) spans q in [c + 1/3, c + 5/3], so q * 2^7 in (2^7, nx 2^7) has all four corners
  // (q0 or q0 + 1, r0 or r0 + 1) in columns and rows 1..nx, 1..ny
  const highQ = nx * 128;
  const highR = ny * 128;
  const outerQ = (nx + 1) * 128;
  const outerR = (ny + 1) * 128;
  const last = end | 0;
  let listedCount = 0;
  let deferredCount = 0;
  for (let p = start | 0; p < last; p++) {
    const dx = points[2 * p]! - ox;
    const dy = points[2 * p + 1]! - oy;
    const q = dx * qx + dy * qy - shiftQ;
    const r = dx * rx + dy * ry - shiftR;
    if (q > 128 && q < highQ && r > 128 && r < highR) {
      // the integer part holds q0 above 7 bits and the table column in the low 7 bits
      const qScaled = q | 0;
      const rScaled = r | 0;
      const code = corners[((qScaled & 127) << 7) | (rScaled & 127)]!;
      listed[listedCount] = p;
      listedCount += code >> 2;
      out[(Math.imul(rScaled >> 7, nx) + (qScaled >> 7) + steps[code]!) | 0]!++;
    } else if (q > 0 && q < outerQ && r > 0 && r < outerR) {
      // the grid's outer strip (a region's points never lie there: hexCoverage pads the grid by 2/3)
      deferred[deferredCount++] = p;
    }
  }
  integers[LISTED] = listedCount;
  integers[DEFERRED] = deferredCount;
}

/**
 * countFastBlock for grids whose counts exceed the second-level cache (INLINE_FROM_CELLS): a point of a
 * NEAR_BISECTOR square is decided at once by the bisectors (countListed's arithmetic) instead of being listed, and a
 * point within the band goes to `deferred`. The branch is mispredicted for about 3 % of the points, which costs less
 * than the second pass once the counts' cache misses dominate (measured: hexagon counting 1.23 to 1.31 times the
 * squares' at 1e6 points against 1.43 to 1.55 with the list; at 1e5 points the list is faster).
 */
function countInlineBlock(
  points: Float64Array,
  start: number,
  end: number,
  reals: Float64Array,
  integers: Int32Array,
  corners: Uint8Array,
  deferred: Int32Array,
  out: CountArray,
): void {
  const qx = reals[0]!;
  const qy = reals[1]!;
  const rx = reals[2]!;
  const ry = reals[3]!;
  const shiftQ = reals[4]!;
  const shiftR = reals[5]!;
  const band = reals[6]!;
  const ox = reals[7]!;
  const oy = reals[8]!;
  const nx = integers[2]!;
  const ny = integers[3]!;
  const highQ = nx * 128;
  const highR = ny * 128;
  const outerQ = (nx + 1) * 128;
  const outerR = (ny + 1) * 128;
  const last = end | 0;
  let deferredCount = 0;
  for (let p = start | 0; p < last; p++) {
    const dx = points[2 * p]! - ox;
    const dy = points[2 * p + 1]! - oy;
    const q = dx * qx + dy * qy - shiftQ;
    const r = dx * rx + dy * ry - shiftR;
    if (q > 128 && q < highQ && r > 128 && r < highR) {
      const qScaled = q | 0;
      const rScaled = r | 0;
      const code = corners[((qScaled & 127) << 7) | (rScaled & 127)]!;
      if (code === 4) {
        // countListed's bisectors, the same expressions
        const q0 = qScaled >> 7;
        const r0 = rScaled >> 7;
        const fq = q / 128 - q0;
        const fr = r / 128 - r0;
        const d = fq - fr;
        const t = (d + 1) | 0;
        const e1 = fq + fq + fr + t - 2;
        const e2 = fq + fr + fr - t - 1;
        if (Math.abs(d) < band || Math.abs(e1) < band || Math.abs(e2) < band) {
          deferred[deferredCount++] = p;
        } else {
          out[(Math.imul(r0 - 1 + (((e2 + 2) * 0.5) | 0), nx) + q0 - 1 + (((e1 + 2) * 0.5) | 0)) | 0]!++;
        }
      } else {
        out[(Math.imul((rScaled >> 7) - 1 + ((code >> 1) & 1), nx) + (qScaled >> 7) - 1 + (code & 1)) | 0]!++;
      }
    } else if (q > 0 && q < outerQ && r > 0 && r < outerR) {
      deferred[deferredCount++] = p;
    }
  }
  integers[LISTED] = 0;
  integers[DEFERRED] = deferredCount;
}

/**
 * The listed points (table squares near a bisector): taken back from corner (0, 0) and decided by the bisectors of
 * the unit cell (header comment), without branches; a point within the band of a bisector goes to `deferred`.
 * q0, r0 >= 1, so fq and fr are exact. Returns the new number of deferred points.
 */
function countListed(points: Float64Array, reals: Float64Array, integers: Int32Array, listed: Int32Array, deferred: Int32Array, out: CountArray): number {
  const qx = reals[0]!;
  const qy = reals[1]!;
  const rx = reals[2]!;
  const ry = reals[3]!;
  const shiftQ = reals[4]!;
  const shiftR = reals[5]!;
  const band = reals[6]!;
  const ox = reals[7]!;
  const oy = reals[8]!;
  const nx = integers[2]!;
  const listedCount = integers[LISTED]!;
  let deferredCount = integers[DEFERRED]!;
  for (let k = 0; k < listedCount; k++) {
    const p = listed[k]!;
    const dx = points[2 * p]! - ox;
    const dy = points[2 * p + 1]! - oy;
    // the same expressions as the fast pass, so the same q0, r0
    const qScaled = dx * qx + dy * qy - shiftQ;
    const rScaled = dx * rx + dy * ry - shiftR;
    const q0 = (qScaled | 0) >> 7;
    const r0 = (rScaled | 0) >> 7;
    out[(Math.imul(r0 - 1, nx) + q0 - 1) | 0]!--;
    const fq = qScaled / 128 - q0;
    const fr = rScaled / 128 - r0;
    const d = fq - fr;
    // t = [fq > fr]; e1 = 2 fq + fr + t - 2 and e2 = fq + 2 fr - t - 1 change sign on the bisectors that decide
    const t = (d + 1) | 0;
    const e1 = fq + fq + fr + t - 2;
    const e2 = fq + fr + fr - t - 1;
    if (Math.abs(d) < band || Math.abs(e1) < band || Math.abs(e2) < band) {
      deferred[deferredCount++] = p;
      continue;
    }
    // e1 + 2 and e2 + 2 lie in [0, 4): halving and flooring gives 1 above the bisector, 0 below
    const cq = ((e1 + 2) * 0.5) | 0;
    const cr = ((e2 + 2) * 0.5) | 0;
    out[(Math.imul(r0 - 1 + cr, nx) + q0 - 1 + cq) | 0]!++;
  }
  return deferredCount;
}

/**
 * A counter over the flat points xy (planar metres) against grid origin `origin`. `inlineFromCells`: grids of at least
 * this many cells use countInlineBlock (the tests run both block functions on the same points).
 */
export function createHexCounter(xy: Float64Array, origin: Origin, inlineFromCells: number = INLINE_FROM_CELLS): CellCounter {
  const points = xy;
  const pointCount = points.length >> 1;
  const reals = new Float64Array(REAL_SLOTS);
  const integers = new Int32Array(INTEGER_SLOTS);
  reals[7] = origin.x;
  reals[8] = origin.y;
  let exactFrame = createHexFrame(origin, 1, { u: 0, v: 0, angle: 0 });
  const deferred = new Int32Array(Math.min(BLOCK, Math.max(1, pointCount)));
  const listed = new Int32Array(Math.min(BLOCK, Math.max(1, pointCount)));
  const cell = new Float64Array(2);
  const steps = new Int32Array(5);

  /** The contract's formula for the deferred points. */
  // the same shape as square-counter.ts's exact pass, apart on purpose: shared, it measured slower (see DEVELOPERS.md)
  function countExactly(out: CountArray, deferredCount: number): void {
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

  /** Every point by the exact pass (grids so far from the origin that the table's margin would not cover the error). */
  function countAllExactly(out: CountArray): void {
    for (let start = 0; start < pointCount; start += BLOCK) {
      const end = Math.min(pointCount, start + BLOCK);
      for (let p = start; p < end; p++) deferred[p - start] = p;
      countExactly(out, end - start);
    }
  }

  return {
    pointCount,
    count(grid: GridExtent, cellSize: number, placement: Placement, out: CountArray): void {
      if (grid.shape !== 'hex') throw new RangeError(`the hexagon counter was given a ${grid.shape ?? 'square'} grid`);
      checkCountOutput(grid, out);
      exactFrame = createHexFrame(origin, cellSize, placement);
      const { cos, sin } = cosSinDegrees(placement.angle);
      const { sqrt3Side, threeSide, oneHalfSide } = exactFrame;
      // q = x'/(sqrt3 a) - y'/(3a) - u with x' = dx cos + dy sin, y' = -dx sin + dy cos; r = y'/(1.5 a) - v; all
      // times 2^7 (exact, so q 2^7 is the unscaled value's 2^7 multiple bit for bit)
      reals[0] = TABLE_SIZE * (cos / sqrt3Side + sin / threeSide);
      reals[1] = TABLE_SIZE * (sin / sqrt3Side - cos / threeSide);
      reals[2] = TABLE_SIZE * (-sin / oneHalfSide);
      reals[3] = TABLE_SIZE * (cos / oneHalfSide);
      reals[4] = TABLE_SIZE * (placement.u + grid.i0 - 1);
      reals[5] = TABLE_SIZE * (placement.v + grid.j0 - 1);
      integers[0] = grid.i0;
      integers[1] = grid.j0;
      integers[2] = grid.nx;
      integers[3] = grid.ny;
      // the fast (q, r) differ from the contract's by less than nearSideBand in each coordinate, so 2 fq + fr,
      // fq + 2 fr and fq - fr by less than 3 times that plus their own rounding
      reals[6] = 4 * nearSideBand(grid);
      out.fill(0, 0, grid.nx * grid.ny);
      // far from the origin the table's margin would not cover the fast path's rounding; beyond 2^24 columns or rows
      // q * 2^7 leaves the 32-bit range of `| 0`
      const reach = Math.max(grid.nx, grid.ny) + 2;
      if (nearSideBand(grid) >= TABLE_MARGIN || reach * TABLE_SIZE >= 2 ** 31) {
        countAllExactly(out);
        return;
      }
      if (grid.nx * grid.ny >= inlineFromCells) {
        for (let start = 0; start < pointCount; start += BLOCK) {
          countInlineBlock(points, start, Math.min(pointCount, start + BLOCK), reals, integers, CORNER_TABLE, deferred, out);
          countExactly(out, integers[DEFERRED]!);
        }
        return;
      }
      const nx = grid.nx;
      for (let k = 0; k < 4; k++) steps[k] = ((k >> 1) - 1) * nx + (k & 1) - 1;
      steps[NEAR_BISECTOR] = steps[0]!;
      for (let start = 0; start < pointCount; start += BLOCK) {
        countFastBlock(points, start, Math.min(pointCount, start + BLOCK), reals, integers, CORNER_TABLE, steps, listed, deferred, out);
        countExactly(out, countListed(points, reals, integers, listed, deferred, out));
      }
    },
  };
}
