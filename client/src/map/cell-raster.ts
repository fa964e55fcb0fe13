/**
 * Cells filled straight into an RGBA pixel buffer. Canvas paths with tens of thousands of abutting sub-paths fill in
 * time that grows faster than linearly in a software-rendered canvas (measured: 1e4 squares 1.3 s, 3e4 squares 14 s
 * in one path), so the grid's fills are scan-converted here instead: cells are convex polygons (squares, hexagons),
 * and a pixel belongs to a cell when its centre does (half-open on the right and bottom, so neighbours neither
 * overlap nor leave gaps). A cell too small to hold any pixel centre marks the pixel under its centre, so a grid
 * seen from far away still shows. Cost: the covered pixels plus a few operations per cell row.
 */

/** 0xAABBGGRR for the little-endian Uint32 view of ImageData (every browser runs little-endian). */
export function packColour(red: number, green: number, blue: number, alpha: number): number {
  return ((Math.round(alpha * 255) << 24) | (blue << 16) | (green << 8) | red) >>> 0;
}

/** '#rrggbb' and an alpha in [0, 1] as packColour. */
export function packHex(hex: string, alpha: number): number {
  const value = Number.parseInt(hex.slice(1), 16);
  return packColour((value >> 16) & 255, (value >> 8) & 255, value & 255, alpha);
}

export interface RasterTarget {
  pixels: Uint32Array;
  width: number;
  height: number;
}

/**
 * Fills the convex polygon with vertices (xs[k], ys[k]), k < count, in device pixels. `colour` fills every covered
 * pixel; with `hatch` > 0 only the pixels on diagonal lines `hatch` pixels apart (for left-out cells).
 */
export function fillConvex(target: RasterTarget, xs: Float64Array, ys: Float64Array, count: number, colour: number, hatch: number): void {
  const { pixels, width, height } = target;
  let minY = Infinity;
  let maxY = -Infinity;
  let sumX = 0;
  let sumY = 0;
  for (let k = 0; k < count; k += 1) {
    if (ys[k] < minY) minY = ys[k];
    if (ys[k] > maxY) maxY = ys[k];
    sumX += xs[k];
    sumY += ys[k];
  }
  const firstRow = Math.max(0, Math.ceil(minY - 0.5));
  const lastRow = Math.min(height - 1, Math.ceil(maxY - 0.5) - 1);
  let filled = false;
  for (let row = firstRow; row <= lastRow; row += 1) {
    const yc = row + 0.5;
    let left = Infinity;
    let right = -Infinity;
    for (let k = 0, previous = count - 1; k < count; previous = k, k += 1) {
      const y0 = ys[previous];
      const y1 = ys[k];
      if ((y0 <= yc && yc < y1) || (y1 <= yc && yc < y0)) {
        const x = xs[previous] + ((yc - y0) * (xs[k] - xs[previous])) / (y1 - y0);
        if (x < left) left = x;
        if (x > right) right = x;
      }
    }
    if (!(left < right)) continue;
    const from = Math.max(0, Math.ceil(left - 0.5));
    const to = Math.min(width, Math.ceil(right - 0.5));
    if (from >= to) continue;
    filled = true;
    const base = row * width;
    if (hatch <= 0) pixels.fill(colour, base + from, base + to);
    else for (let column = from; column < to; column += 1) if ((column + row) % hatch < 1.5) pixels[base + column] = colour;
  }
  if (!filled && hatch <= 0) {
    const column = Math.floor(sumX / count);
    const row = Math.floor(sumY / count);
    if (column >= 0 && row >= 0 && column < width && row < height) pixels[row * width + column] = colour;
  }
}
