/**
 * Cells of an axis-aligned raster that region edges pass through or come within `slack` cell units of
 * (conservative: a cell may be marked without being crossed, never the reverse). The other cells lie wholly inside
 * or wholly outside the region. Local cell units: cell (c, r) is [c, c+1) x [r, r+1) over x = (px - Ox)/s,
 * y = (py - Oy)/s. Cost O(edges + cells marked).
 */
import type { Origin, Region } from '../types.js';

export function markBoundaryCells(region: Region, origin: Origin, cellSize: number, nx: number, ny: number, slack = 1e-9): Uint8Array {
  const marked = new Uint8Array(nx * ny);
  const clampColumn = (c: number) => (c < 0 ? 0 : c >= nx ? nx - 1 : c);
  for (const ring of region.rings) {
    const vertexCount = ring.length >> 1;
    let previous = vertexCount - 1;
    for (let k = 0; k < vertexCount; k++) {
      const xa = (ring[2 * previous]! - origin.x) / cellSize;
      const ya = (ring[2 * previous + 1]! - origin.y) / cellSize;
      const xb = (ring[2 * k]! - origin.x) / cellSize;
      const yb = (ring[2 * k + 1]! - origin.y) / cellSize;
      previous = k;
      const yLow = Math.min(ya, yb);
      const yHigh = Math.max(ya, yb);
      const firstRow = Math.max(0, Math.floor(yLow - slack));
      const lastRow = Math.min(ny - 1, Math.floor(yHigh + slack));
      for (let row = firstRow; row <= lastRow; row++) {
        // x range of the edge inside the band [row - slack, row + 1 + slack]
        let xFrom: number;
        let xTo: number;
        if (yHigh === yLow) {
          xFrom = Math.min(xa, xb);
          xTo = Math.max(xa, xb);
        } else {
          const t0 = Math.max(0, Math.min(1, (row - slack - ya) / (yb - ya)));
          const t1 = Math.max(0, Math.min(1, (row + 1 + slack - ya) / (yb - ya)));
          const x0 = xa + t0 * (xb - xa);
          const x1 = xa + t1 * (xb - xa);
          xFrom = Math.min(x0, x1);
          xTo = Math.max(x0, x1);
        }
        const lastColumn = clampColumn(Math.floor(xTo + slack));
        for (let column = clampColumn(Math.floor(xFrom - slack)); column <= lastColumn; column++) marked[row * nx + column] = 1;
      }
    }
  }
  return marked;
}
