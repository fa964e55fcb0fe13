/**
 * A dataset as it travels through Redis: one binary value (little-endian float64) holding what a sweep counts,
 * stored once under its content hash (queue-keys.ts datasetKey) with an expiry, fetched once by each worker
 * process: [format 1, pointCount, regionValues, origin x, origin y, points (Morton-sorted x,y…), packed region…].
 * The points are the shared copy the local pool would use (server/sweeps/shared-dataset.ts), so both executors
 * count the same coordinates in the same order. Cost O(n) to pack and unpack.
 */
import type { Origin } from '../../workers/types.js';

const FORMAT = 1;
const HEADER = 5;

export interface PackedDataset {
  pointCount: number;
  /** interleaved x, y in shared memory */
  points: SharedArrayBuffer;
  /** the packed region (workers/sweep/region-buffer.ts) in shared memory */
  region: SharedArrayBuffer;
  origin: Origin;
}

/** The bytes stored in Redis. */
export function packDataset(dataset: PackedDataset): Buffer {
  const points = new Float64Array(dataset.points);
  const region = new Float64Array(dataset.region);
  const values = new Float64Array(HEADER + points.length + region.length);
  values.set([FORMAT, dataset.pointCount, region.length, dataset.origin.x, dataset.origin.y]);
  values.set(points, HEADER);
  values.set(region, HEADER + points.length);
  return Buffer.from(values.buffer, values.byteOffset, values.byteLength);
}

/**
 * Reads back what packDataset stored, into new shared memory.
 * @throws Error when the bytes are not a dataset of this format
 */
export function unpackDataset(bytes: Buffer): PackedDataset {
  if (bytes.byteLength % 8 !== 0 || bytes.byteLength < HEADER * 8) throw new Error('the dataset in Redis is damaged (wrong length)');
  const values = new Float64Array(bytes.byteLength / 8);
  new Uint8Array(values.buffer).set(bytes);
  const [format, pointCount, regionLength, ox, oy] = values;
  if (format !== FORMAT || values.length !== HEADER + 2 * pointCount + regionLength) {
    throw new Error(`the dataset in Redis has format ${format} or a wrong length; this worker reads format ${FORMAT}`);
  }
  const points = new SharedArrayBuffer(pointCount * 16);
  new Float64Array(points).set(values.subarray(HEADER, HEADER + 2 * pointCount));
  const region = new SharedArrayBuffer(regionLength * 8);
  new Float64Array(region).set(values.subarray(HEADER + 2 * pointCount));
  return { pointCount, points, region, origin: { x: ox, y: oy } };
}
