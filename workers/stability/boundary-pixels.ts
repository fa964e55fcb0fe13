/**
 * The valid pixels of a stability raster whose centres may lie within `distance` of the valid region's boundary,
 * as positions q into the valid pixels (increasing). Any other valid pixel's centre is farther than `distance` from
 * every edge of the region's rings, so every square cell of diagonal below `distance` that holds it lies wholly in
 * the region: its coverage is 1 in every placement (stability-chunk.ts uses this to skip locating such pixels).
 *
 * A superset, never a subset: for each edge and each raster row whose centre lies within `distance` of the edge's
 * y-range, the columns whose centres lie within `distance` (plus one pixel) of the edge's x-range over the y-values
 * within `distance` of the row are marked. A point within distance d of a segment has a segment point within d in y,
 * whose x lies between the segment's x at the ends of that y-window, so the point's x lies in the marked range.
 * Cost O(edges x rows spanned + marked pixels + raster pixels); memory one byte per raster pixel while it runs.
 */
import { forEachRingEdge } from '../geometry/ring-edges.js';
import type { Region } from '../types.js';
import type { StabilityRaster } from './stability-raster.js';

/**
 * The distance beyond which a pixel centre lies only in whole square cells of side `cellSize`: every point of a cell
 * holding the centre is within the cell diagonal s sqrt(2) of it; a millionth wider for the rounding of the cell rule.
 */
export function squareCellReach(cellSize: number): number {
  return cellSize * Math.SQRT2 * (1 + 1e-6);
}

export function pixelsNearBoundary(region: Region, raster: StabilityRaster, pixels: Uint32Array, distance: number): Uint32Array {
  const { x0, y0, side, width, height } = raster;
  const near = new Uint8Array(width * height);
  const d = distance;
  forEachRingEdge(region.rings, (ax, ay, bx, by) => {
    const low = Math.min(ay, by);
    const high = Math.max(ay, by);
    // rows whose centre y0 - (row + 1/2) side lies in [low - d, high + d], one row of slack each way
    const rowFrom = Math.max(0, Math.floor((y0 - high - d) / side - 0.5) - 1);
    const rowTo = Math.min(height - 1, Math.ceil((y0 - low + d) / side - 0.5) + 1);
    for (let row = rowFrom; row <= rowTo; row++) {
      const y = y0 - (row + 0.5) * side;
      const windowLow = Math.max(low, y - d);
      const windowHigh = Math.min(high, y + d);
      if (windowLow > windowHigh) continue;
      let xLow: number;
      let xHigh: number;
      if (by === ay) {
        xLow = Math.min(ax, bx);
        xHigh = Math.max(ax, bx);
      } else {
        const xa = ax + ((windowLow - ay) * (bx - ax)) / (by - ay);
        const xb = ax + ((windowHigh - ay) * (bx - ax)) / (by - ay);
        xLow = Math.min(xa, xb);
        xHigh = Math.max(xa, xb);
      }
      const colFrom = Math.max(0, Math.floor((xLow - d - x0) / side - 0.5) - 1);
      const colTo = Math.min(width - 1, Math.ceil((xHigh + d - x0) / side - 0.5) + 1);
      if (colFrom <= colTo) near.fill(1, row * width + colFrom, row * width + colTo + 1);
    }
  });
  let count = 0;
  for (let q = 0; q < pixels.length; q++) if (near[pixels[q]!] === 1) count++;
  const positions = new Uint32Array(count);
  let at = 0;
  for (let q = 0; q < pixels.length; q++) if (near[pixels[q]!] === 1) positions[at++] = q;
  return positions;
}
