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
 * indices row * width + col in increasing order. Cost O(pixels x edges per band).
 */
export function validPixels(region: Region, raster: StabilityRaster): Uint32Array {
  const locator = createRegionLocator(region);
  const inside: number[] = [];
  for (let row = 0; row < raster.height; row++) {
    const y = raster.y0 - (row + 0.5) * raster.side;
    for (let col = 0; col < raster.width; col++) {
      if (locator.contains(raster.x0 + (col + 0.5) * raster.side, y)) inside.push(row * raster.width + col);
    }
  }
  return Uint32Array.from(inside);
}
