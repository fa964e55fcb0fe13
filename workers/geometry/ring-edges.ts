/**
 * The edges of rings given as flat x, y arrays (closed implicitly: the last vertex joins the first), each visited as
 * (ax, ay) -> (bx, by) from the previous vertex to the current one, ring by ring. Cost O(vertices) plus the visits.
 * Hot loops (point-in-region, coverage accumulation) keep their own loop; this serves the per-placement and
 * per-raster passes.
 */
export function forEachRingEdge(rings: readonly Float64Array[], visit: (ax: number, ay: number, bx: number, by: number) => void): void {
  for (const ring of rings) {
    const vertexCount = ring.length >> 1;
    let previous = vertexCount - 1;
    for (let k = 0; k < vertexCount; k++) {
      visit(ring[2 * previous]!, ring[2 * previous + 1]!, ring[2 * k]!, ring[2 * k + 1]!);
      previous = k;
    }
  }
}
