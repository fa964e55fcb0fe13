/**
 * A planar cell ring as an RFC 7946 longitude/latitude ring: corners inverse-projected, each edge densified so that
 * the ring, drawn as straight lines in longitude/latitude and projected back, stays within `tolerance` metres of the
 * straight planar edge; then oriented counter-clockwise (the right-hand rule of RFC 7946, section 3.1.6).
 *
 * Densification is by recursive halving (the usual way, e.g. in GDAL's densify of transformed boundaries): the
 * midpoint of the longitude/latitude chord is projected back and its distance to the planar edge measured; the edge
 * is split at its planar midpoint while that distance exceeds the tolerance. The deviation of a short chord is
 * largest near its middle, so half the promised 1 cm is used as the tolerance at the midpoint.
 */

export type Converter = (x: number, y: number) => [number, number];

/** The densification tolerance at the chord midpoint, metres (half of the 1 cm promise). */
export const DENSIFY_TOLERANCE = 0.005;

/** Deepest halving of one edge (2^12 segments), a guard against a projection that never converges. */
const MAX_DEPTH = 12;

/** Longitude/latitude rounded to 1e-9 degree (about 0.1 mm), plenty under the 1 cm promise. */
function round(value: number): number {
  return Math.round(value * 1e9) / 1e9;
}

/** Distance from point p to the segment a-b (planar). */
export function distanceToSegment(px: number, py: number, ax: number, ay: number, bx: number, by: number): number {
  const dx = bx - ax;
  const dy = by - ay;
  const length2 = dx * dx + dy * dy;
  const t = length2 > 0 ? Math.max(0, Math.min(1, ((px - ax) * dx + (py - ay) * dy) / length2)) : 0;
  return Math.hypot(px - (ax + t * dx), py - (ay + t * dy));
}

function densifyEdge(
  a: [number, number],
  b: [number, number],
  la: [number, number],
  lb: [number, number],
  toLonLat: Converter,
  fromLonLat: Converter,
  tolerance: number,
  depth: number,
  out: [number, number][],
): void {
  const [mx, my] = fromLonLat((la[0] + lb[0]) / 2, (la[1] + lb[1]) / 2);
  if (depth >= MAX_DEPTH || distanceToSegment(mx, my, a[0], a[1], b[0], b[1]) <= tolerance) {
    out.push(lb);
    return;
  }
  const m: [number, number] = [(a[0] + b[0]) / 2, (a[1] + b[1]) / 2];
  const lm = toLonLat(m[0], m[1]);
  densifyEdge(a, m, la, lm, toLonLat, fromLonLat, tolerance, depth + 1, out);
  densifyEdge(m, b, lm, lb, toLonLat, fromLonLat, tolerance, depth + 1, out);
}

/** Twice the signed area of a ring (positive when counter-clockwise), shoelace formula. */
export function signedArea2(ring: [number, number][]): number {
  let sum = 0;
  for (let k = 0; k + 1 < ring.length; k++) sum += ring[k]![0] * ring[k + 1]![1] - ring[k + 1]![0] * ring[k]![1];
  return sum;
}

/** A closed planar ring (first corner repeated) as a closed, densified, counter-clockwise lon/lat ring. */
export function lonLatRing(
  planar: [number, number][],
  toLonLat: Converter,
  fromLonLat: Converter,
  tolerance: number = DENSIFY_TOLERANCE,
): [number, number][] {
  const corners = planar.map(([x, y]) => toLonLat(x, y));
  const ring: [number, number][] = [corners[0]!];
  for (let k = 0; k + 1 < planar.length; k++) {
    densifyEdge(planar[k]!, planar[k + 1]!, corners[k]!, corners[k + 1]!, toLonLat, fromLonLat, tolerance, 0, ring);
  }
  ring[ring.length - 1] = ring[0]!;
  const rounded = ring.map(([lon, lat]) => [round(lon), round(lat)] as [number, number]);
  return signedArea2(rounded) < 0 ? rounded.reverse() : rounded;
}
