/**
 * Signed area of a flat ring by the shoelace formula (Gauss's area formula; see e.g. Braden 1986,
 * "The surveyor's area formula", The College Mathematics Journal 17:326-337):
 *   A = 1/2 * sum_k (x_k - x_0)(y_{k+1} - y_0) - (x_{k+1} - x_0)(y_k - y_0)
 * taken relative to the first vertex to limit cancellation with large coordinates.
 * Positive for counter-clockwise rings, negative for clockwise. Cost O(vertices).
 */
import type { Ring } from '../types.js';

export function ringSignedArea(ring: Ring): number {
  const vertexCount = ring.length >> 1;
  if (vertexCount < 3) return 0;
  const x0 = ring[0]!;
  const y0 = ring[1]!;
  let twiceArea = 0;
  for (let k = 1; k < vertexCount - 1; k++) {
    const ax = ring[2 * k]! - x0;
    const ay = ring[2 * k + 1]! - y0;
    const bx = ring[2 * k + 2]! - x0;
    const by = ring[2 * k + 3]! - y0;
    twiceArea += ax * by - bx * ay;
  }
  return twiceArea / 2;
}

/** Orientation of a ring: 1 counter-clockwise, -1 clockwise, 0 degenerate (zero area). */
export function ringOrientation(ring: Ring): 1 | -1 | 0 {
  const area = ringSignedArea(ring);
  return area > 0 ? 1 : area < 0 ? -1 : 0;
}

/** Sum of the signed areas of several rings (shells positive, holes negative): the region's area. */
export function ringsSignedArea(rings: readonly Ring[]): number {
  let total = 0;
  for (const ring of rings) total += ringSignedArea(ring);
  return total;
}

/** A copy of a ring with the requested orientation (1 counter-clockwise, -1 clockwise). */
export function orientRing(ring: Ring, orientation: 1 | -1): Ring {
  if (ringOrientation(ring) !== -orientation) return ring.slice();
  const vertexCount = ring.length >> 1;
  const reversed = new Float64Array(ring.length);
  for (let k = 0; k < vertexCount; k++) {
    reversed[2 * k] = ring[2 * (vertexCount - 1 - k)]!;
    reversed[2 * k + 1] = ring[2 * (vertexCount - 1 - k) + 1]!;
  }
  return reversed;
}
