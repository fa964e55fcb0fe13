/**
 * The valid region packed into one shared Float64Array, so that a task carries a reference to it rather than a
 * copy: [ringCount, area, minX, minY, maxX, maxY, offsets (ringCount + 1, in values), ring coordinates...].
 * Rings read back are views on the shared memory (no copy). Cost O(vertices) to pack, O(rings) to read.
 */
import type { Region } from '../types.js';

const HEADER = 6;

/** Packs a region into a new SharedArrayBuffer. */
export function packRegion(region: Region): SharedArrayBuffer {
  const ringCount = region.rings.length;
  const coordinateCount = region.rings.reduce((sum, ring) => sum + ring.length, 0);
  const buffer = new SharedArrayBuffer((HEADER + ringCount + 1 + coordinateCount) * 8);
  const data = new Float64Array(buffer);
  data.set([ringCount, region.area, region.bbox.minX, region.bbox.minY, region.bbox.maxX, region.bbox.maxY]);
  let cursor = 0;
  region.rings.forEach((ring, index) => {
    data[HEADER + index] = cursor;
    data.set(ring, HEADER + ringCount + 1 + cursor);
    cursor += ring.length;
  });
  data[HEADER + ringCount] = cursor;
  return buffer;
}

/** Reads a packed region; its rings are views on the buffer. */
export function unpackRegion(buffer: SharedArrayBuffer): Region {
  return unpackRegionData(new Float64Array(buffer));
}

/** Reads a region packed as by packRegion from a Float64Array view (rings are views on it). */
export function unpackRegionData(data: Float64Array): Region {
  const ringCount = data[0];
  const base = HEADER + ringCount + 1;
  const rings: Float64Array[] = [];
  for (let index = 0; index < ringCount; index++) {
    rings.push(data.subarray(base + data[HEADER + index], base + data[HEADER + index + 1]));
  }
  return { rings, area: data[1], bbox: { minX: data[2], minY: data[3], maxX: data[4], maxY: data[5] } };
}
