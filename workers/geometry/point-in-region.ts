/**
 * Point in region by the even-odd crossing rule (ray casting; Shimrat 1962, "Algorithm 112: Position of point
 * relative to polygon", Communications of the ACM 5:434; boundary handling as in Haines 1994, "Point in polygon
 * strategies", Graphics Gems IV): a point is inside when a ray to +x crosses the region's rings an odd number of
 * times. With non-crossing rings (shells and holes, design.md) this equals "inside a shell and not in a hole".
 * Edges are half-open in y (an edge counts when exactly one endpoint lies above the point), so every point of the
 * plane gets one consistent answer.
 *
 * pointInRegion costs O(edges). partitionByRegion builds a band index once (horizontal bands over the bounding box,
 * each listing the edges that overlap it) and then costs O(edges in the point's band) per point.
 */
import type { Region } from '../types.js';

/** Even-odd test of one point against all rings of a region. Cost O(edges). */
export function pointInRegion(region: Region, x: number, y: number): boolean {
  const { bbox } = region;
  if (!(x >= bbox.minX && x <= bbox.maxX && y >= bbox.minY && y <= bbox.maxY)) return false;
  let inside = false;
  for (const ring of region.rings) {
    const vertexCount = ring.length >> 1;
    let previous = vertexCount - 1;
    for (let k = 0; k < vertexCount; k++) {
      const xa = ring[2 * k]!;
      const ya = ring[2 * k + 1]!;
      const xb = ring[2 * previous]!;
      const yb = ring[2 * previous + 1]!;
      if (ya > y !== yb > y && x < xa + ((y - ya) * (xb - xa)) / (yb - ya)) inside = !inside;
      previous = k;
    }
  }
  return inside;
}

/** A point-in-region tester with a horizontal band index, built once per region. */
export interface RegionLocator {
  contains(x: number, y: number): boolean;
  /**
   * The crossings of the horizontal line at y: for every edge that contains(x, y) would test (exactly one endpoint
   * above y), its x at y by the same expression, written to out[0 ..] unsorted (out must hold them: at most the edge
   * count); returns how many. contains(x, y) is then "x in the bounding box and an odd number of crossings > x".
   * NaN-free for y within the bounding box; 0 outside it.
   */
  crossings(y: number, out: Float64Array): number;
  /** edges of all rings (the most crossings a line can have) */
  readonly edgeCount: number;
}

/**
 * Build a band index: B bands of equal height over the bbox (B about a quarter of the edge count, at most 65536),
 * edges stored band by band in flat typed arrays (compressed rows). Build cost O(edges + band memberships).
 */
export function createRegionLocator(region: Region): RegionLocator {
  const { minX, minY, maxX, maxY } = region.bbox;
  let edgeCount = 0;
  for (const ring of region.rings) edgeCount += ring.length >> 1;
  const edges = new Float64Array(edgeCount * 4);
  let e = 0;
  for (const ring of region.rings) {
    const vertexCount = ring.length >> 1;
    let previous = vertexCount - 1;
    for (let k = 0; k < vertexCount; k++) {
      edges[e++] = ring[2 * k]!;
      edges[e++] = ring[2 * k + 1]!;
      edges[e++] = ring[2 * previous]!;
      edges[e++] = ring[2 * previous + 1]!;
      previous = k;
    }
  }
  const height = maxY - minY;
  const bandCount = height > 0 ? Math.max(1, Math.min(65536, Math.ceil(edgeCount / 4))) : 1;
  const bandScale = height > 0 ? bandCount / height : 0;
  const bandOf = (y: number): number => {
    const band = Math.floor((y - minY) * bandScale);
    return band < 0 ? 0 : band >= bandCount ? bandCount - 1 : band;
  };
  const bandStart = new Int32Array(bandCount + 1);
  for (let k = 0; k < edgeCount; k++) {
    const ya = edges[4 * k + 1]!;
    const yb = edges[4 * k + 3]!;
    if (ya === yb) continue; // horizontal edges never count as crossings
    const last = bandOf(Math.max(ya, yb));
    for (let band = bandOf(Math.min(ya, yb)); band <= last; band++) bandStart[band + 1]!++;
  }
  for (let band = 0; band < bandCount; band++) bandStart[band + 1]! += bandStart[band]!;
  const bandEdges = new Int32Array(bandStart[bandCount]!);
  const fill = bandStart.slice(0, bandCount);
  for (let k = 0; k < edgeCount; k++) {
    const ya = edges[4 * k + 1]!;
    const yb = edges[4 * k + 3]!;
    if (ya === yb) continue;
    const last = bandOf(Math.max(ya, yb));
    for (let band = bandOf(Math.min(ya, yb)); band <= last; band++) bandEdges[fill[band]!++] = k;
  }
  /**
   * The x at which band edge m crosses the horizontal line at y, or NaN when it does not cross it (exactly one
   * endpoint above y): the one expression both tests use, so that they decide alike.
   */
  const crossingX = (m: number, y: number): number => {
    const base = 4 * bandEdges[m]!;
    const xa = edges[base]!;
    const ya = edges[base + 1]!;
    const xb = edges[base + 2]!;
    const yb = edges[base + 3]!;
    return ya > y !== yb > y ? xa + ((y - ya) * (xb - xa)) / (yb - ya) : Number.NaN;
  };
  return {
    contains(x: number, y: number): boolean {
      if (!(x >= minX && x <= maxX && y >= minY && y <= maxY)) return false;
      const band = bandOf(y);
      let inside = false;
      // NaN (no crossing) compares false
      for (let m = bandStart[band]!, end = bandStart[band + 1]!; m < end; m++) if (x < crossingX(m, y)) inside = !inside;
      return inside;
    },
    crossings(y: number, out: Float64Array): number {
      if (!(y >= minY && y <= maxY)) return 0;
      const band = bandOf(y);
      let count = 0;
      for (let m = bandStart[band]!, end = bandStart[band + 1]!; m < end; m++) {
        const at = crossingX(m, y);
        if (at === at) out[count++] = at;
      }
      return count;
    },
    edgeCount,
  };
}

/** Indices of the points (flat xy) inside and outside the region, each in input order. */
export function partitionByRegion(xy: Float64Array, region: Region): { inside: Uint32Array; outside: Uint32Array } {
  const pointCount = xy.length >> 1;
  const locator = createRegionLocator(region);
  const flags = new Uint8Array(pointCount);
  let insideCount = 0;
  for (let p = 0; p < pointCount; p++) {
    if (locator.contains(xy[2 * p]!, xy[2 * p + 1]!)) {
      flags[p] = 1;
      insideCount++;
    }
  }
  const inside = new Uint32Array(insideCount);
  const outside = new Uint32Array(pointCount - insideCount);
  let a = 0;
  let b = 0;
  for (let p = 0; p < pointCount; p++) {
    if (flags[p] === 1) inside[a++] = p;
    else outside[b++] = p;
  }
  return { inside, outside };
}
