/**
 * Area of a union of axis-aligned rectangles by coordinate compression: split the plane at every rectangle edge and
 * add each elementary cell covered by at least one rectangle. Exact up to float rounding; cost O(k^3) for k
 * rectangles (a test oracle, independent of the polygon overlay under test).
 */
export interface Rectangle {
  x0: number;
  y0: number;
  x1: number;
  y1: number;
}

export function rectangleUnionArea(rectangles: Rectangle[]): number {
  const xs = [...new Set(rectangles.flatMap((r) => [r.x0, r.x1]))].sort((a, b) => a - b);
  const ys = [...new Set(rectangles.flatMap((r) => [r.y0, r.y1]))].sort((a, b) => a - b);
  let area = 0;
  for (let i = 0; i + 1 < xs.length; i += 1) {
    for (let j = 0; j + 1 < ys.length; j += 1) {
      const cx = (xs[i] + xs[i + 1]) / 2;
      const cy = (ys[j] + ys[j + 1]) / 2;
      if (rectangles.some((r) => r.x0 < cx && cx < r.x1 && r.y0 < cy && cy < r.y1)) {
        area += (xs[i + 1] - xs[i]) * (ys[j + 1] - ys[j]);
      }
    }
  }
  return area;
}
