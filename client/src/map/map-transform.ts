/** Fitting planar coordinates (metres, y up) into a canvas (pixels, y down), keeping the aspect ratio. */

export interface MapBox {
  minX: number;
  minY: number;
  maxX: number;
  maxY: number;
}

export interface MapTransform {
  /** pixels per metre */
  scale: number;
  toPixel: (x: number, y: number) => [number, number];
}

/**
 * The uniform scale that fits `box` inside a width x height canvas less `padding` on every side, centred;
 * y is flipped so that north is up. A box of zero width or height is widened to 1 m.
 */
export function fitTransform(box: MapBox, width: number, height: number, padding: number): MapTransform {
  const boxWidth = Math.max(box.maxX - box.minX, 1);
  const boxHeight = Math.max(box.maxY - box.minY, 1);
  const innerWidth = Math.max(width - 2 * padding, 1);
  const innerHeight = Math.max(height - 2 * padding, 1);
  const scale = Math.min(innerWidth / boxWidth, innerHeight / boxHeight);
  const left = padding + (innerWidth - boxWidth * scale) / 2;
  const bottom = padding + (innerHeight - boxHeight * scale) / 2;
  return {
    scale,
    toPixel: (x, y) => [left + (x - box.minX) * scale, height - (bottom + (y - box.minY) * scale)],
  };
}

/** The bounding box of a list of rings given as [x, y] pairs. */
export function ringsBox(rings: readonly (readonly number[][])[]): MapBox | null {
  let minX = Infinity;
  let minY = Infinity;
  let maxX = -Infinity;
  let maxY = -Infinity;
  for (const ring of rings) {
    for (const [x, y] of ring) {
      minX = Math.min(minX, x);
      minY = Math.min(minY, y);
      maxX = Math.max(maxX, x);
      maxY = Math.max(maxY, y);
    }
  }
  return Number.isFinite(minX) ? { minX, minY, maxX, maxY } : null;
}

/** The union of two boxes (either may be null). */
export function unionBox(a: MapBox | null, b: MapBox | null): MapBox | null {
  if (!a) return b;
  if (!b) return a;
  return { minX: Math.min(a.minX, b.minX), minY: Math.min(a.minY, b.minY), maxX: Math.max(a.maxX, b.maxX), maxY: Math.max(a.maxY, b.maxY) };
}
