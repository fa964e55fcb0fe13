/**
 * Test oracle: area of a region inside one axis-aligned cell by Sutherland & Hodgman (1974, "Reentrant polygon
 * clipping", Communications of the ACM 17:32-42) clipping of each ring against the cell's four sides, then the
 * shoelace area of the clipped ring, summed over rings (holes are clockwise and subtract). Clipping a concave ring
 * against a convex window can leave zero-width bridges, which add no area, so the area stays exact.
 * Cost O(vertices) per ring and cell: for tests only.
 */

type Point = [number, number];

function clipAgainst(points: Point[], inside: (p: Point) => boolean, cross: (a: Point, b: Point) => Point): Point[] {
  const result: Point[] = [];
  for (let k = 0; k < points.length; k++) {
    const current = points[k]!;
    const previous = points[(k + points.length - 1) % points.length]!;
    const currentIn = inside(current);
    const previousIn = inside(previous);
    if (currentIn) {
      if (!previousIn) result.push(cross(previous, current));
      result.push(current);
    } else if (previousIn) {
      result.push(cross(previous, current));
    }
  }
  return result;
}

function atX(a: Point, b: Point, x: number): Point {
  const t = (x - a[0]) / (b[0] - a[0]);
  return [x, a[1] + t * (b[1] - a[1])];
}

function atY(a: Point, b: Point, y: number): Point {
  const t = (y - a[1]) / (b[1] - a[1]);
  return [a[0] + t * (b[0] - a[0]), y];
}

/** Signed shoelace area of a ring given as points. */
export function shoelace(points: Point[]): number {
  let twice = 0;
  for (let k = 0; k < points.length; k++) {
    const [xa, ya] = points[k]!;
    const [xb, yb] = points[(k + 1) % points.length]!;
    twice += xa * yb - xb * ya;
  }
  return twice / 2;
}

/** Clip one ring (points) to the box [x0, x1] x [y0, y1]; returns the clipped ring. */
export function clipRingToBox(ring: Point[], x0: number, y0: number, x1: number, y1: number): Point[] {
  let points = ring;
  points = clipAgainst(points, (p) => p[0] >= x0, (a, b) => atX(a, b, x0));
  if (points.length === 0) return points;
  points = clipAgainst(points, (p) => p[0] <= x1, (a, b) => atX(a, b, x1));
  if (points.length === 0) return points;
  points = clipAgainst(points, (p) => p[1] >= y0, (a, b) => atY(a, b, y0));
  if (points.length === 0) return points;
  return clipAgainst(points, (p) => p[1] <= y1, (a, b) => atY(a, b, y1));
}

/** Signed area of the rings (flat x,y arrays in cell units) inside cell [i, i+1] x [j, j+1]. */
export function oracleCellArea(rings: ArrayLike<number>[], i: number, j: number): number {
  let total = 0;
  for (const flat of rings) {
    const ring: Point[] = [];
    for (let k = 0; k < flat.length; k += 2) ring.push([flat[k]!, flat[k + 1]!]);
    const clipped = clipRingToBox(ring, i, j, i + 1, j + 1);
    if (clipped.length >= 3) total += shoelace(clipped);
  }
  return total;
}
