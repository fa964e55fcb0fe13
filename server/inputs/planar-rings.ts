/**
 * Planar ring arithmetic on coordinate arrays. Areas are planar (shoelace), never geodesic: the inputs project
 * everything to metres first, and turf.area would measure the wrong thing on projected coordinates.
 */

/**
 * Signed area of a ring by the shoelace (surveyor's) formula: A = 1/2 * sum (x_k * y_{k+1} - x_{k+1} * y_k),
 * positive for counter-clockwise rings. Works on open or closed rings (a repeated closing vertex adds 0).
 * Cost O(vertices). Reference: B. Braden (1986), "The Surveyor's Area Formula", College Mathematics Journal 17:326-337.
 * Coordinates are taken relative to the first vertex to keep precision with large projected values.
 */
export function signedRingArea(ring: number[][]): number {
  const n = ring.length;
  if (n < 3) return 0;
  const [x0, y0] = ring[0];
  let twice = 0;
  for (let k = 0; k < n; k += 1) {
    const a = ring[k];
    const b = ring[(k + 1) % n];
    twice += (a[0] - x0) * (b[1] - y0) - (b[0] - x0) * (a[1] - y0);
  }
  return twice / 2;
}

/** Planar area of a GeoJSON-style polygon (shell minus holes), whatever the rings' orientation. */
export function polygonArea(polygon: number[][][]): number {
  let area = 0;
  polygon.forEach((ring, index) => {
    const a = Math.abs(signedRingArea(ring));
    area += index === 0 ? a : -a;
  });
  return area;
}

/** Planar area of a GeoJSON-style multipolygon. */
export function multiPolygonArea(multi: number[][][][]): number {
  return multi.reduce((sum, polygon) => sum + polygonArea(polygon), 0);
}

/** Bounding box of a set of multipolygons' vertices. */
export function multiPolygonBBox(multi: number[][][][]): { minX: number; minY: number; maxX: number; maxY: number } {
  let minX = Infinity;
  let minY = Infinity;
  let maxX = -Infinity;
  let maxY = -Infinity;
  for (const polygon of multi) {
    for (const ring of polygon) {
      for (const [x, y] of ring) {
        if (x < minX) minX = x;
        if (y < minY) minY = y;
        if (x > maxX) maxX = x;
        if (y > maxY) maxY = y;
      }
    }
  }
  return { minX, minY, maxX, maxY };
}
