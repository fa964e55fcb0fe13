/**
 * Morton (Z-order) sort of a point set (Morton 1966, "A computer oriented geodetic data base and a new technique in
 * file sequencing", IBM Ltd. technical report): each point gets the code interleaving the bits of its x and y,
 * quantized to 16 bits over the bounding box; points are reordered by code with a stable two-pass LSD radix sort.
 * Nearby points end up close in memory, so the counting kernel's increments hit cache. Counts do not depend on the
 * order. Cost O(n) time, O(n) extra memory; done once per dataset.
 */

/** Spread the low 16 bits of v to the even bit positions of a 32-bit word. */
function spreadBits(value: number): number {
  let v = value & 0xffff;
  v = (v | (v << 8)) & 0x00ff00ff;
  v = (v | (v << 4)) & 0x0f0f0f0f;
  v = (v | (v << 2)) & 0x33333333;
  v = (v | (v << 1)) & 0x55555555;
  return v;
}

/** The quantization of Morton codes: 16 bits per axis over the points' bounding box. */
interface MortonFrame {
  minX: number;
  minY: number;
  scaleX: number;
  scaleY: number;
}

function mortonFrame(xy: Float64Array): MortonFrame {
  const n = xy.length >> 1;
  let minX = Infinity;
  let minY = Infinity;
  let maxX = -Infinity;
  let maxY = -Infinity;
  for (let p = 0; p < n; p++) {
    const x = xy[2 * p]!;
    const y = xy[2 * p + 1]!;
    if (x < minX) minX = x;
    if (x > maxX) maxX = x;
    if (y < minY) minY = y;
    if (y > maxY) maxY = y;
  }
  return { minX, minY, scaleX: maxX > minX ? 65535 / (maxX - minX) : 0, scaleY: maxY > minY ? 65535 / (maxY - minY) : 0 };
}

/** The Z-order code of point p (x bits even, y bits odd). */
function mortonCode(xy: Float64Array, p: number, frame: MortonFrame): number {
  const qx = Math.min(65535, Math.max(0, Math.floor((xy[2 * p]! - frame.minX) * frame.scaleX))) || 0;
  const qy = Math.min(65535, Math.max(0, Math.floor((xy[2 * p + 1]! - frame.minY) * frame.scaleY))) || 0;
  return (spreadBits(qx) | (spreadBits(qy) << 1)) >>> 0;
}

/** Z-order code of each point (x bits even, y bits odd), 16 bits per axis over the points' bounding box. */
export function mortonCodes(xy: Float64Array): Uint32Array {
  const frame = mortonFrame(xy);
  const codes = new Uint32Array(xy.length >> 1);
  for (let p = 0; p < codes.length; p++) codes[p] = mortonCode(xy, p, frame);
  return codes;
}

/** True when the points are already in Morton order (codes never decrease). O(n) time, no array of codes. */
export function isMortonSorted(xy: Float64Array): boolean {
  const frame = mortonFrame(xy);
  const n = xy.length >> 1;
  let previous = 0;
  for (let p = 0; p < n; p++) {
    const code = mortonCode(xy, p, frame);
    if (code < previous) return false;
    previous = code;
  }
  return true;
}

/**
 * A copy of the flat points xy sorted along the Morton curve (stable: equal codes keep input order), written into
 * `out` when given (length xy.length, e.g. a view of shared memory: no second copy) or into a new array.
 * Two-pass LSD radix sort on the code's low then high 16 bits; the second pass moves the coordinates straight to
 * their place, so the temporaries are 6 bytes per point (the high halves and one permutation), 60 MB at 1e7 points.
 */
export function mortonSort(xy: Float64Array, out?: Float64Array): Float64Array {
  if (out !== undefined && out.length !== xy.length) {
    throw new RangeError(`mortonSort output holds ${out.length} numbers, the points ${xy.length}`);
  }
  const n = xy.length >> 1;
  const frame = mortonFrame(xy);
  const high = new Uint16Array(n);
  const bucketStart = new Uint32Array(65537);
  // pass 1: by the low 16 bits, from input order (the low halves are computed again rather than kept)
  for (let p = 0; p < n; p++) {
    const code = mortonCode(xy, p, frame);
    high[p] = code >>> 16;
    bucketStart[(code & 0xffff) + 1]!++;
  }
  for (let b = 0; b < 65536; b++) bucketStart[b + 1]! += bucketStart[b]!;
  const order = new Uint32Array(n);
  for (let p = 0; p < n; p++) order[bucketStart[mortonCode(xy, p, frame) & 0xffff]!++] = p;
  // pass 2: by the high 16 bits, stable over pass 1's order, writing the points
  bucketStart.fill(0);
  for (let p = 0; p < n; p++) bucketStart[high[p]! + 1]!++;
  for (let b = 0; b < 65536; b++) bucketStart[b + 1]! += bucketStart[b]!;
  const sorted = out ?? new Float64Array(2 * n);
  for (let k = 0; k < n; k++) {
    const index = order[k]!;
    const to = bucketStart[high[index]!]!++;
    sorted[2 * to] = xy[2 * index]!;
    sorted[2 * to + 1] = xy[2 * index + 1]!;
  }
  return sorted;
}
