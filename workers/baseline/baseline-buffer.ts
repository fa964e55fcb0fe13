/**
 * A baseline (baseline.ts) packed into one shared Float64Array, so that tasks carry a reference, not a copy:
 *   polygons: [1, P, counts (P), offsets (P + 1, in values), then each piece packed as by sweep/region-buffer.ts]
 *   controls: [2, count, x0, y0, x1, y1, ...]
 * Read back as views on the shared memory. Cost O(vertices or controls) to pack, O(pieces) to read.
 */
import { packRegion, unpackRegionData } from '../sweep/region-buffer.js';
import type { Region } from '../types.js';
import type { Baseline } from './baseline.js';

export function packBaseline(baseline: Baseline): SharedArrayBuffer {
  if (baseline.kind === 'controls') {
    const buffer = new SharedArrayBuffer((2 + baseline.controls.length) * 8);
    const data = new Float64Array(buffer);
    data[0] = 2;
    data[1] = baseline.controls.length / 2;
    data.set(baseline.controls, 2);
    return buffer;
  }
  const packed = baseline.pieces.map((piece) => new Float64Array(packRegion(piece)));
  const count = packed.length;
  const header = 2 + count + count + 1;
  const total = packed.reduce((sum, piece) => sum + piece.length, 0);
  const buffer = new SharedArrayBuffer((header + total) * 8);
  const data = new Float64Array(buffer);
  data[0] = 1;
  data[1] = count;
  data.set(baseline.counts, 2);
  let cursor = 0;
  packed.forEach((piece, p) => {
    data[2 + count + p] = cursor;
    data.set(piece, header + cursor);
    cursor += piece.length;
  });
  data[2 + count + count] = cursor;
  return buffer;
}

export function unpackBaseline(buffer: SharedArrayBuffer): Baseline {
  const data = new Float64Array(buffer);
  if (data[0] === 2) return { kind: 'controls', controls: data.subarray(2, 2 + 2 * data[1]!) };
  const count = data[1]!;
  const header = 2 + count + count + 1;
  const pieces: Region[] = [];
  for (let p = 0; p < count; p++) {
    pieces.push(unpackRegionData(data.subarray(header + data[2 + count + p]!, header + data[2 + count + p + 1]!)));
  }
  return { kind: 'polygons', pieces, counts: data.subarray(2, 2 + count) };
}
