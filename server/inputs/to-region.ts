/**
 * Conversion of a GeoJSON-style multipolygon (planar metres, closed rings) into the engine's Region:
 * flat open rings, shells counter-clockwise, holes clockwise, signed areas adding up to `area`.
 */
import type { BBox, Region } from '../../workers/types.js';
import { ringSignedArea } from '../../workers/geometry/ring-area.js';
import { signedRingArea } from './planar-rings.js';

function flatOpenRing(ring: number[][], counterClockwise: boolean): Float64Array {
  let positions = ring;
  const first = ring[0];
  const last = ring[ring.length - 1];
  if (first[0] === last[0] && first[1] === last[1]) positions = ring.slice(0, -1);
  const isCounterClockwise = signedRingArea(positions) > 0;
  if (isCounterClockwise !== counterClockwise) positions = positions.slice().reverse();
  const flat = new Float64Array(positions.length * 2);
  positions.forEach(([x, y], k) => {
    flat[2 * k] = x;
    flat[2 * k + 1] = y;
  });
  return flat;
}

export function toRegion(multi: number[][][][]): Region {
  const rings: Float64Array[] = [];
  const bbox: BBox = { minX: Infinity, minY: Infinity, maxX: -Infinity, maxY: -Infinity };
  let area = 0;
  for (const polygon of multi) {
    polygon.forEach((ring, index) => {
      const flat = flatOpenRing(ring, index === 0);
      rings.push(flat);
      area += ringSignedArea(flat);
      if (index === 0) {
        for (let k = 0; k < flat.length; k += 2) {
          bbox.minX = Math.min(bbox.minX, flat[k]);
          bbox.maxX = Math.max(bbox.maxX, flat[k]);
          bbox.minY = Math.min(bbox.minY, flat[k + 1]);
          bbox.maxY = Math.max(bbox.maxY, flat[k + 1]);
        }
      }
    });
  }
  return { rings, area, bbox };
}
