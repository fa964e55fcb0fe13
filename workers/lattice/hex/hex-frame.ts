/**
 * The hexagon contract (issue 16), in one place. Grid frame as for squares (shared/design.md):
 *   x' = (px - Ox) cos t + (py - Oy) sin t,  y' = -(px - Ox) sin t + (py - Oy) cos t.
 * Cells are regular pointy-top hexagons of area s^2: side a = s sqrt(2 / (3 sqrt(3))). Cell (i, j) has its centre at
 *   x' = (i + u) sqrt(3) a + (j + v) sqrt(3) a / 2,  y' = (j + v) 1.5 a.
 * A point's cell is the nearest centre, decided exactly by rounding axial/cube coordinates (the cube-coordinate
 * rounding of hexagonal grids, e.g. Patel 2013, "Hexagonal Grids", Red Blob Games, from memory):
 *   q = x'/(sqrt(3) a) - y'/(3 a) - u,  r = y'/(1.5 a) - v,  m = -q - r   (float64, in this order)
 * round each with Math.round; if q moved strictly more than m and r, q := -m - r; else if m moved strictly more than
 * r, m := -q - r; else r := -q - m. The cell is (q, r). Angles repeat every 60 degrees.
 * Cost O(1) per point or cell.
 */
import { checkFrameInputs, cosSinDegrees } from '../../geometry/grid-frame.js';
import type { Origin, Placement } from '../../types.js';

/** Side a of the hexagon whose area is s^2: 3 sqrt(3) a^2 / 2 = s^2. */
export function hexSide(cellSize: number): number {
  return cellSize * Math.sqrt(2 / (3 * Math.sqrt(3)));
}

export interface HexFrame {
  originX: number;
  originY: number;
  cos: number;
  sin: number;
  u: number;
  v: number;
  /** side a, and the contract's divisors sqrt(3) a, 3 a, 1.5 a */
  side: number;
  sqrt3Side: number;
  threeSide: number;
  oneHalfSide: number;
}

export function createHexFrame(origin: Origin, cellSize: number, placement: Placement): HexFrame {
  checkFrameInputs(cellSize, placement);
  const { cos, sin } = cosSinDegrees(placement.angle);
  const side = hexSide(cellSize);
  return {
    originX: origin.x,
    originY: origin.y,
    cos,
    sin,
    u: placement.u,
    v: placement.v,
    side,
    sqrt3Side: Math.sqrt(3) * side,
    threeSide: 3 * side,
    oneHalfSide: 1.5 * side,
  };
}

/**
 * The rounding rule on fractional axial coordinates (q, r), m = -q - r computed here: writes the cell (i, j) to
 * cell[0], cell[1] (no allocation: the counting kernel's exact pass). Math.round rounds halves up; "moved" is
 * |rounded - value|.
 */
export function roundHexInto(q: number, r: number, cell: Float64Array): void {
  const m = -q - r;
  let qi = Math.round(q);
  let ri = Math.round(r);
  const mi = Math.round(m);
  const dq = Math.abs(qi - q);
  const dr = Math.abs(ri - r);
  const dm = Math.abs(mi - m);
  if (dq > dm && dq > dr) qi = -mi - ri;
  else if (!(dm > dr)) ri = -qi - mi;
  cell[0] = qi + 0; // + 0 turns -0 into 0
  cell[1] = ri + 0;
}

/** The rounding rule (roundHexInto) as a pair [i, j]. */
export function roundHex(q: number, r: number): [number, number] {
  const cell = new Float64Array(2);
  roundHexInto(q, r, cell);
  return [cell[0]!, cell[1]!];
}

/** Fractional axial coordinates (q, r) of a planar point, in the contract's exact order of operations. */
export function hexAxial(frame: HexFrame, px: number, py: number): [number, number] {
  const dx = px - frame.originX;
  const dy = py - frame.originY;
  const xPrime = dx * frame.cos + dy * frame.sin;
  const yPrime = -dx * frame.sin + dy * frame.cos;
  return [xPrime / frame.sqrt3Side - yPrime / frame.threeSide - frame.u, yPrime / frame.oneHalfSide - frame.v];
}

/** The hexagon (i, j) that holds a planar point, per the contract. */
export function hexCellOfPoint(frame: HexFrame, px: number, py: number): [number, number] {
  const [q, r] = hexAxial(frame, px, py);
  return roundHex(q, r);
}

/** hexCellOfPoint written to cell[0], cell[1] without allocating (hexAxial's expressions, in the same order). */
export function hexCellOfPointInto(frame: HexFrame, px: number, py: number, cell: Float64Array): void {
  const dx = px - frame.originX;
  const dy = py - frame.originY;
  const xPrime = dx * frame.cos + dy * frame.sin;
  const yPrime = -dx * frame.sin + dy * frame.cos;
  roundHexInto(xPrime / frame.sqrt3Side - yPrime / frame.threeSide - frame.u, yPrime / frame.oneHalfSide - frame.v, cell);
}

/** Grid-frame coordinates (x', y') to planar metres: rotate by +t and add the origin. */
function toPlanar(frame: HexFrame, xPrime: number, yPrime: number): [number, number] {
  return [frame.originX + xPrime * frame.cos - yPrime * frame.sin, frame.originY + xPrime * frame.sin + yPrime * frame.cos];
}

/** Centre of hexagon (i, j) in planar metres. */
export function hexCentre(frame: HexFrame, i: number, j: number): [number, number] {
  return toPlanar(frame, (i + frame.u) * frame.sqrt3Side + ((j + frame.v) * frame.sqrt3Side) / 2, (j + frame.v) * frame.oneHalfSide);
}

/** Vertex k of a pointy-top hexagon relative to its centre, grid frame, in units of a: angle 30 + 60 k degrees. */
const VERTEX_UNITS: readonly (readonly [number, number])[] = [
  [Math.sqrt(3) / 2, 0.5],
  [0, 1],
  [-Math.sqrt(3) / 2, 0.5],
  [-Math.sqrt(3) / 2, -0.5],
  [0, -1],
  [Math.sqrt(3) / 2, -0.5],
];

/** The six corners of hexagon (i, j) as a closed ring (7 points, first repeated), counter-clockwise, planar metres. */
export function hexCorners(frame: HexFrame, i: number, j: number): [number, number][] {
  const cx = (i + frame.u) * frame.sqrt3Side + ((j + frame.v) * frame.sqrt3Side) / 2;
  const cy = (j + frame.v) * frame.oneHalfSide;
  const ring = VERTEX_UNITS.map(([x, y]) => toPlanar(frame, cx + x * frame.side, cy + y * frame.side));
  ring.push(ring[0]!);
  return ring;
}
