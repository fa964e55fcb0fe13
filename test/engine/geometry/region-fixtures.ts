/** Regions for engine tests: built from plain coordinate lists (invented shapes, no real places). */
import type { Region, Ring } from '../../../workers/types.js';
import { ringSignedArea } from '../../../workers/geometry/ring-area.js';

/** A Region from rings given as [x, y] lists (already oriented: shells CCW, holes CW). */
export function regionFromRings(rings: [number, number][][]): Region {
  const flat: Ring[] = rings.map((ring) => Float64Array.from(ring.flat()));
  let minX = Infinity;
  let minY = Infinity;
  let maxX = -Infinity;
  let maxY = -Infinity;
  for (const ring of flat) {
    for (let k = 0; k < ring.length; k += 2) {
      minX = Math.min(minX, ring[k]!);
      maxX = Math.max(maxX, ring[k]!);
      minY = Math.min(minY, ring[k + 1]!);
      maxY = Math.max(maxY, ring[k + 1]!);
    }
  }
  const area = flat.reduce((sum, ring) => sum + ringSignedArea(ring), 0);
  return { rings: flat, area, bbox: { minX, minY, maxX, maxY } };
}

/**
 * A star-shaped ring around (cx, cy): vertex k at angle 2 pi (k + jitter_k) / n and radius r_k, both drawn from
 * `fractions` in [0, 1). Counter-clockwise; reversed when `clockwise`.
 */
export function starRing(
  cx: number,
  cy: number,
  minRadius: number,
  maxRadius: number,
  fractions: number[],
  clockwise = false,
): [number, number][] {
  const vertexCount = Math.floor(fractions.length / 2);
  const ring: [number, number][] = [];
  for (let k = 0; k < vertexCount; k++) {
    const angle = (2 * Math.PI * (k + 0.8 * fractions[2 * k]!)) / vertexCount;
    const radius = minRadius + (maxRadius - minRadius) * fractions[2 * k + 1]!;
    ring.push([cx + radius * Math.cos(angle), cy + radius * Math.sin(angle)]);
  }
  return clockwise ? ring.reverse() : ring;
}
