/**
 * Which points lie inside the valid region, by the even-odd crossing-number rule over all rings (shells and
 * holes alike, since the rings do not cross): a horizontal ray from the point crosses the boundary an odd number
 * of times exactly when the point is inside. Edges are half-open in y, so a point on a shared edge is assigned
 * to exactly one side. Cost O(points x edges), with a bounding-box test per ring; run once per dataset.
 * Reference: E. Haines (1994), "Point in Polygon Strategies", Graphics Gems IV, pp. 24-46.
 */
import type { Region } from '../../workers/types.js';

interface RingBox {
  ring: Float64Array;
  minX: number;
  minY: number;
  maxX: number;
  maxY: number;
}

function ringBoxes(region: Region): RingBox[] {
  return region.rings.map((ring) => {
    let minX = Infinity;
    let minY = Infinity;
    let maxX = -Infinity;
    let maxY = -Infinity;
    for (let k = 0; k < ring.length; k += 2) {
      minX = Math.min(minX, ring[k]);
      maxX = Math.max(maxX, ring[k]);
      minY = Math.min(minY, ring[k + 1]);
      maxY = Math.max(maxY, ring[k + 1]);
    }
    return { ring, minX, minY, maxX, maxY };
  });
}

function crossings(ring: Float64Array, px: number, py: number): number {
  const n = ring.length / 2;
  let count = 0;
  for (let a = 0, b = n - 1; a < n; b = a, a += 1) {
    const ay = ring[2 * a + 1];
    const by = ring[2 * b + 1];
    if (ay > py !== by > py) {
      const ax = ring[2 * a];
      const bx = ring[2 * b];
      const xCross = ax + ((py - ay) * (bx - ax)) / (by - ay);
      if (px < xCross) count += 1;
    }
  }
  return count;
}

/** Indices (into xy/2) of the points inside the region, in input order. */
export function pointsInRegion(xy: Float64Array, region: Region): Uint32Array {
  const boxes = ringBoxes(region);
  const inside: number[] = [];
  const n = xy.length / 2;
  for (let p = 0; p < n; p += 1) {
    const px = xy[2 * p];
    const py = xy[2 * p + 1];
    let count = 0;
    for (const box of boxes) {
      if (py < box.minY || py > box.maxY || px > box.maxX) continue;
      count += crossings(box.ring, px, py);
    }
    if (count % 2 === 1) inside.push(p);
  }
  return Uint32Array.from(inside);
}
