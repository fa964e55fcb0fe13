/**
 * The raster of the stability surface for one cell size: square pixels over the valid region's bounding box, pixel
 * side about s / 8 (coarsened so that the raster holds at most MAX_STABILITY_PIXELS), row 0 at the top (north), as
 * in a GeoTIFF. Pixel (col, row) has its centre at (x0 + (col + 1/2) side, y0 - (row + 1/2) side), (x0, y0) being
 * the raster's upper-left corner (the bounding box's minX, maxY), planar metres.
 */
import { createRegionLocator } from '../geometry/point-in-region.js';
import type { Region } from '../types.js';

/** Pixels per cell side aimed at. */
export const PIXELS_PER_CELL_SIDE = 8;
/** The most pixels a stability raster may hold (about 4 million). */
export const MAX_STABILITY_PIXELS = 4_194_304;

export interface StabilityRaster {
  /** upper-left corner, planar metres */
  x0: number;
  y0: number;
  /** pixel side, metres */
  side: number;
  width: number;
  height: number;
}

/** The raster for cells of side `cellSize` over the region's bounding box (only the box is read). Cost O(1). */
export function stabilityRaster(region: Pick<Region, 'bbox'>, cellSize: number): StabilityRaster {
  const { minX, minY, maxX, maxY } = region.bbox;
  const spanX = Math.max(maxX - minX, Number.MIN_VALUE);
  const spanY = Math.max(maxY - minY, Number.MIN_VALUE);
  let side = cellSize / PIXELS_PER_CELL_SIDE;
  // coarsen so that ceil(spanX / side) * ceil(spanY / side) <= MAX_STABILITY_PIXELS
  const least = Math.sqrt((spanX * spanY) / MAX_STABILITY_PIXELS);
  if (side < least) side = least;
  let width = Math.max(1, Math.ceil(spanX / side));
  let height = Math.max(1, Math.ceil(spanY / side));
  while (width * height > MAX_STABILITY_PIXELS) {
    side *= 1.01;
    width = Math.max(1, Math.ceil(spanX / side));
    height = Math.max(1, Math.ceil(spanY / side));
  }
  return { x0: minX, y0: maxY, side, width, height };
}

/** Planar centre of pixel (col, row). */
export function pixelCentre(raster: StabilityRaster, col: number, row: number): [number, number] {
  return [raster.x0 + (col + 0.5) * raster.side, raster.y0 - (row + 0.5) * raster.side];
}

/**
 * The pixels whose centres lie in the valid region (even-odd rule of workers/geometry/point-in-region.ts), as
 * indices row * width + col in increasing order. One scan per row: the row's edge crossings (the locator's own
 * expression) sorted, then the pixels walked left to right counting the crossings at or left of each centre, so that
 * a centre is inside exactly when contains() says so (an odd number of crossings strictly right of it, and within
 * the bounding box). Measured 6x faster than one contains() per pixel (0.2 s a sweep on a 2.6-million-pixel raster).
 * Cost O(rows x (edges per band + crossings log crossings) + pixels).
 */
export function validPixels(region: Region, raster: StabilityRaster): Uint32Array {
  const locator = createRegionLocator(region);
  const { minX, maxX } = region.bbox;
  const crossings = new Float64Array(Math.max(1, locator.edgeCount));
  let inside = new Uint32Array(1024);
  let count = 0;
  for (let row = 0; row < raster.height; row++) {
    const y = raster.y0 - (row + 0.5) * raster.side;
    const found = locator.crossings(y, crossings);
    if (found === 0) continue;
    const sorted = crossings.subarray(0, found).sort();
    let passed = 0;
    for (let col = 0; col < raster.width; col++) {
      const x = raster.x0 + (col + 0.5) * raster.side;
      if (x > maxX) break;
      if (!(x >= minX)) continue;
      while (passed < found && sorted[passed]! <= x) passed++;
      if ((found - passed) % 2 === 1) {
        if (count === inside.length) {
          const grown = new Uint32Array(inside.length * 2);
          grown.set(inside);
          inside = grown;
        }
        inside[count++] = row * raster.width + col;
      }
    }
  }
  return inside.slice(0, count);
}
