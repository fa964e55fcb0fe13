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

/** Z-order code of each point (x bits even, y bits odd), 16 bits per axis over the points' bounding box. */
export function mortonCodes(xy: Float64Array): Uint32Array {
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
  const scaleX = maxX > minX ? 65535 / (maxX - minX) : 0;
  const scaleY = maxY > minY ? 65535 / (maxY - minY) : 0;
  const codes = new Uint32Array(n);
  for (let p = 0; p < n; p++) {
    const qx = Math.min(65535, Math.max(0, Math.floor((xy[2 * p]! - minX) * scaleX))) || 0;
    const qy = Math.min(65535, Math.max(0, Math.floor((xy[2 * p + 1]! - minY) * scaleY))) || 0;
    codes[p] = (spreadBits(qx) | (spreadBits(qy) << 1)) >>> 0;
  }
  return codes;
}

/**
 * A copy of the flat points xy sorted along the Morton curve (stable: equal codes keep input order), written into
 * `out` when given (length xy.length, e.g. a view of shared memory: no second copy) or into a new array.
 */
export function mortonSort(xy: Float64Array, out?: Float64Array): Float64Array {
  if (out !== undefined && out.length !== xy.length) {
    throw new RangeError(`mortonSort output holds ${out.length} numbers, the points ${xy.length}`);
  }
  const n = xy.length >> 1;
  const codes = mortonCodes(xy);
  let order = new Uint32Array(n);
  let scratch = new Uint32Array(n);
  for (let p = 0; p < n; p++) order[p] = p;
  const bucketStart = new Uint32Array(65537);
  for (const shift of [0, 16]) {
    bucketStart.fill(0);
    for (let p = 0; p < n; p++) bucketStart[((codes[order[p]!]! >>> shift) & 0xffff) + 1]!++;
    for (let b = 0; b < 65536; b++) bucketStart[b + 1]! += bucketStart[b]!;
    for (let p = 0; p < n; p++) {
      const index = order[p]!;
      scratch[bucketStart[(codes[index]! >>> shift) & 0xffff]!++] = index;
    }
    [order, scratch] = [scratch, order];
  }
  const sorted = out ?? new Float64Array(2 * n);
  for (let k = 0; k < n; k++) {
    sorted[2 * k] = xy[2 * order[k]!]!;
    sorted[2 * k + 1] = xy[2 * order[k]! + 1]!;
  }
  return sorted;
}
