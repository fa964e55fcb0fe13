/**
 * Encoding of typed arrays and JSON for the SQLite store.
 * Typed arrays are stored as their raw little-endian bytes (exact, compact); JSON numbers that JSON cannot carry
 * (NaN, Infinity, -Infinity) are written as tagged strings and read back as numbers, so exports stay exact.
 */

/** The bytes of a typed array, without copying. */
export function typedArrayToBuffer(array: Float64Array | Uint32Array): Buffer {
  return Buffer.from(array.buffer, array.byteOffset, array.byteLength);
}

/** A Float64Array copied out of a stored BLOB (copied so that it is 8-byte aligned). */
export function bufferToFloat64(buffer: Buffer): Float64Array {
  const copy = new ArrayBuffer(buffer.byteLength);
  new Uint8Array(copy).set(buffer);
  return new Float64Array(copy);
}

/** A Uint32Array copied out of a stored BLOB. */
export function bufferToUint32(buffer: Buffer): Uint32Array {
  const copy = new ArrayBuffer(buffer.byteLength);
  new Uint8Array(copy).set(buffer);
  return new Uint32Array(copy);
}

/**
 * Several Float64Array rings in one BLOB: a header of ring lengths (float64 each, preceded by the ring count),
 * then the concatenated coordinates.
 */
export function encodeRings(rings: readonly Float64Array[]): Buffer {
  const total = rings.reduce((sum, ring) => sum + ring.length, 0);
  const packed = new Float64Array(1 + rings.length + total);
  packed[0] = rings.length;
  let at = 1 + rings.length;
  rings.forEach((ring, index) => {
    packed[1 + index] = ring.length;
    packed.set(ring, at);
    at += ring.length;
  });
  return typedArrayToBuffer(packed);
}

export function decodeRings(buffer: Buffer): Float64Array[] {
  const packed = bufferToFloat64(buffer);
  const count = packed[0] ?? 0;
  const rings: Float64Array[] = [];
  let at = 1 + count;
  for (let index = 0; index < count; index += 1) {
    const length = packed[1 + index] ?? 0;
    rings.push(packed.slice(at, at + length));
    at += length;
  }
  return rings;
}

const NON_FINITE_TAGS: Record<string, number> = {
  '__NaN__': Number.NaN,
  '__Infinity__': Number.POSITIVE_INFINITY,
  '__-Infinity__': Number.NEGATIVE_INFINITY,
};

/** JSON.stringify that keeps NaN and the infinities (as tagged strings). */
export function toStoredJson(value: unknown): string {
  return JSON.stringify(value, (_key, item: unknown) => {
    if (typeof item === 'number' && !Number.isFinite(item)) return `__${String(item)}__`;
    return item;
  });
}

/** JSON.parse that turns the tagged strings of toStoredJson back into numbers. */
export function fromStoredJson<T>(text: string): T {
  return JSON.parse(text, (_key, item: unknown) => {
    if (typeof item === 'string' && item in NON_FINITE_TAGS) return NON_FINITE_TAGS[item];
    return item;
  }) as T;
}
