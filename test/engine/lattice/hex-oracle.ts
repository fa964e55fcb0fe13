/**
 * Test oracle for hexagonal cells, written from the issue 16 contract without the engine's code:
 * - hexagon (i, j): centre x' = (i + u) sqrt(3) a + (j + v) sqrt(3) a / 2, y' = (j + v) 1.5 a in the grid frame,
 *   a = s sqrt(2 / (3 sqrt(3))), pointy-top (vertices at 30 + 60 k degrees), taken to planar metres;
 * - its area in the region by Sutherland & Hodgman (1974, "Reentrant polygon clipping", CACM 17:32-42) clipping of
 *   every ring against the hexagon's six half-planes, shoelace area of each clipped ring, summed (holes subtract);
 * - the cell of a point by brute force: the nearest centre among all hexagons of a window (squared distances).
 * Cost O(vertices) per ring and hexagon, O(window) per point: for tests only.
 */
import type { Origin, Placement, Region } from '../../../workers/types.js';

type Point = [number, number];

export interface OracleHex {
  centre: Point;
  polygon: Point[];
}

export function oracleHex(origin: Origin, cellSize: number, placement: Placement, i: number, j: number): OracleHex {
  const a = cellSize * Math.sqrt(2 / (3 * Math.sqrt(3)));
  const t = (placement.angle * Math.PI) / 180;
  const cos = Math.cos(t);
  const sin = Math.sin(t);
  const toPlanar = (x: number, y: number): Point => [origin.x + x * cos - y * sin, origin.y + x * sin + y * cos];
  const cx = (i + placement.u) * Math.sqrt(3) * a + ((j + placement.v) * Math.sqrt(3) * a) / 2;
  const cy = (j + placement.v) * 1.5 * a;
  const polygon: Point[] = [];
  for (let k = 0; k < 6; k++) {
    const angle = ((30 + 60 * k) * Math.PI) / 180;
    polygon.push(toPlanar(cx + a * Math.cos(angle), cy + a * Math.sin(angle)));
  }
  return { centre: toPlanar(cx, cy), polygon };
}

function shoelace(points: Point[]): number {
  let twice = 0;
  for (let k = 0; k < points.length; k++) {
    const [xa, ya] = points[k]!;
    const [xb, yb] = points[(k + 1) % points.length]!;
    twice += xa * yb - xb * ya;
  }
  return twice / 2;
}

/** Sutherland-Hodgman: clip `subject` to the left side of the directed line p -> q (a counter-clockwise window's edge). */
function clipLeft(subject: Point[], p: Point, q: Point): Point[] {
  const side = (s: Point) => (q[0] - p[0]) * (s[1] - p[1]) - (q[1] - p[1]) * (s[0] - p[0]);
  const result: Point[] = [];
  for (let k = 0; k < subject.length; k++) {
    const current = subject[k]!;
    const previous = subject[(k + subject.length - 1) % subject.length]!;
    const sc = side(current);
    const sp = side(previous);
    const cross = (): Point => {
      const f = sp / (sp - sc);
      return [previous[0] + f * (current[0] - previous[0]), previous[1] + f * (current[1] - previous[1])];
    };
    if (sc >= 0) {
      if (sp < 0) result.push(cross());
      result.push(current);
    } else if (sp >= 0) {
      result.push(cross());
    }
  }
  return result;
}

/** Area of the region inside a convex counter-clockwise polygon (planar metres squared). */
export function oracleAreaInside(region: Region, polygon: Point[]): number {
  // coordinates relative to the window's first vertex: less cancellation in the shoelace sums
  const [x0, y0] = polygon[0]!;
  const window = polygon.map(([x, y]): Point => [x - x0, y - y0]);
  let total = 0;
  for (const flat of region.rings) {
    let ring: Point[] = [];
    for (let k = 0; k < flat.length; k += 2) ring.push([flat[k]! - x0, flat[k + 1]! - y0]);
    for (let k = 0; k < window.length && ring.length > 0; k++) ring = clipLeft(ring, window[k]!, window[(k + 1) % window.length]!);
    if (ring.length >= 3) total += shoelace(ring);
  }
  return total;
}

/** Brute force: the hexagon (i, j) of the window [i0, i1] x [j0, j1] whose centre is nearest; null on a near tie. */
export function oracleNearest(
  origin: Origin,
  cellSize: number,
  placement: Placement,
  x: number,
  y: number,
  window: [number, number, number, number],
): [number, number] | null {
  let best: [number, number] = [0, 0];
  let bestDistance = Infinity;
  let second = Infinity;
  for (let j = window[2]; j <= window[3]; j++) {
    for (let i = window[0]; i <= window[1]; i++) {
      const [cx, cy] = oracleHex(origin, cellSize, placement, i, j).centre;
      const d = (cx - x) ** 2 + (cy - y) ** 2;
      if (d < bestDistance) {
        second = bestDistance;
        bestDistance = d;
        best = [i, j];
      } else if (d < second) second = d;
    }
  }
  return second - bestDistance > 1e-9 * cellSize * cellSize ? best : null;
}

/** The issue 16 rounding rule, written out here from the text: q, r, m in float64 in the stated order. */
export function contractCell(origin: Origin, cellSize: number, placement: Placement, px: number, py: number): [number, number] {
  const a = cellSize * Math.sqrt(2 / (3 * Math.sqrt(3)));
  const t = (placement.angle * Math.PI) / 180;
  const cos = placement.angle === 0 ? 1 : Math.cos(t);
  const sin = placement.angle === 0 ? 0 : Math.sin(t);
  const x = (px - origin.x) * cos + (py - origin.y) * sin;
  const y = -(px - origin.x) * sin + (py - origin.y) * cos;
  const q = x / (Math.sqrt(3) * a) - y / (3 * a) - placement.u;
  const r = y / (1.5 * a) - placement.v;
  const m = -q - r;
  let rq = Math.round(q);
  let rr = Math.round(r);
  let rm = Math.round(m);
  const movedQ = Math.abs(rq - q);
  const movedR = Math.abs(rr - r);
  const movedM = Math.abs(rm - m);
  if (movedQ > movedM && movedQ > movedR) rq = -rm - rr;
  else if (movedM > movedR) rm = -rq - rr;
  else rr = -rq - rm;
  return [rq === 0 ? 0 : rq, rr === 0 ? 0 : rr];
}

/** The next float64 above x (one unit in the last place). */
export function nextUp(x: number): number {
  const view = new DataView(new ArrayBuffer(8));
  view.setFloat64(0, x);
  const bits = view.getBigInt64(0);
  if (x === 0) return Number.MIN_VALUE;
  view.setBigInt64(0, x > 0 ? bits + 1n : bits - 1n);
  return view.getFloat64(0);
}

/** The next float64 below x. */
export function nextDown(x: number): number {
  return -nextUp(-x);
}
