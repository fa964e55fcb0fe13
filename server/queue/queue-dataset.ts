/**
 * A dataset as it travels through Redis: one binary value (little-endian float64) holding what a sweep counts,
 * stored once under its content hash (queue-keys.ts datasetKey) with an expiry, fetched once by each worker
 * process: [format 2, pointCount, regionValues, origin x, origin y, baselineValues, points (Morton-sorted x,y…),
 * packed region…, packed baseline… (workers/baseline/baseline-buffer.ts; none when expected counts follow area)].
 * The points are the shared copy the local pool would use (server/sweeps/shared-dataset.ts), so both executors
 * count the same coordinates in the same order. Cost O(n) to pack and unpack.
 */
import type { Origin } from '../../workers/types.js';

const FORMAT = 2;
const HEADER = 6;

export interface PackedDataset {
  pointCount: number;
  /** interleaved x, y in shared memory, pointCount points from byte 0 (the buffer may be longer) */
  points: SharedArrayBuffer;
  /** the packed region (workers/sweep/region-buffer.ts) in shared memory */
  region: SharedArrayBuffer;
  origin: Origin;
  /** the packed population at risk, or null (expected counts follow area) */
  baseline: SharedArrayBuffer | null;
}

/** The bytes stored in Redis. */
export function packDataset(dataset: PackedDataset): Buffer {
  const points = new Float64Array(dataset.points, 0, 2 * dataset.pointCount);
  const region = new Float64Array(dataset.region);
  const baseline = dataset.baseline === null ? new Float64Array(0) : new Float64Array(dataset.baseline);
  const values = new Float64Array(HEADER + points.length + region.length + baseline.length);
  values.set([FORMAT, dataset.pointCount, region.length, dataset.origin.x, dataset.origin.y, baseline.length]);
  values.set(points, HEADER);
  values.set(region, HEADER + points.length);
  values.set(baseline, HEADER + points.length + region.length);
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
  const [format, pointCount, regionLength, ox, oy, baselineLength] = values;
  if (format !== FORMAT || values.length !== HEADER + 2 * pointCount + regionLength + baselineLength) {
    throw new Error(`the dataset in Redis has format ${format} or a wrong length; this worker reads format ${FORMAT}`);
  }
  const points = new SharedArrayBuffer(pointCount * 16);
  new Float64Array(points).set(values.subarray(HEADER, HEADER + 2 * pointCount));
  const region = new SharedArrayBuffer(regionLength * 8);
  new Float64Array(region).set(values.subarray(HEADER + 2 * pointCount, HEADER + 2 * pointCount + regionLength));
  let baseline: SharedArrayBuffer | null = null;
  if (baselineLength > 0) {
    baseline = new SharedArrayBuffer(baselineLength * 8);
    new Float64Array(baseline).set(values.subarray(HEADER + 2 * pointCount + regionLength));
  }
  return { pointCount, points, region, origin: { x: ox, y: oy }, baseline };
}
