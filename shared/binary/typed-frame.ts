/**
 * A compact binary frame for the page's bulk data (the placement's grid, the stability surface): typed arrays sent
 * as their bytes, with a small JSON header saying what they are, so that 1e5 cells or 1e6 pixels cross in one
 * response without being written and parsed as text.
 *
 * Layout (little-endian): 4 bytes "GSTF", uint32 header length H, H bytes of UTF-8 JSON
 * { meta, arrays: [{ name, type, length }] }, zero bytes up to a multiple of 8, then each array's bytes in the listed
 * order, each padded with zero bytes to a multiple of 8 (so every array starts aligned for its element type).
 * Media type: application/octet-stream.
 */

export type TypedArrayKind = 'u8' | 'i32' | 'u32' | 'f32' | 'f64';

type AnyTyped = Uint8Array | Int32Array | Uint32Array | Float32Array | Float64Array;

const MAGIC = [0x47, 0x53, 0x54, 0x46];

const CONSTRUCTORS = {
  u8: Uint8Array,
  i32: Int32Array,
  u32: Uint32Array,
  f32: Float32Array,
  f64: Float64Array,
} as const;

function kindOf(array: AnyTyped): TypedArrayKind {
  if (array instanceof Uint8Array) return 'u8';
  if (array instanceof Int32Array) return 'i32';
  if (array instanceof Uint32Array) return 'u32';
  if (array instanceof Float32Array) return 'f32';
  return 'f64';
}

const padded = (bytes: number): number => Math.ceil(bytes / 8) * 8;

/** Encodes `meta` and the named arrays into one frame. */
export function encodeTypedFrame(meta: unknown, arrays: Record<string, AnyTyped>): Uint8Array {
  const entries = Object.entries(arrays);
  const header = new TextEncoder().encode(
    JSON.stringify({ meta, arrays: entries.map(([name, array]) => ({ name, type: kindOf(array), length: array.length })) }),
  );
  let size = padded(8 + header.length);
  for (const [, array] of entries) size += padded(array.byteLength);
  const out = new Uint8Array(size);
  out.set(MAGIC, 0);
  new DataView(out.buffer).setUint32(4, header.length, true);
  out.set(header, 8);
  let at = padded(8 + header.length);
  for (const [, array] of entries) {
    out.set(new Uint8Array(array.buffer, array.byteOffset, array.byteLength), at);
    at += padded(array.byteLength);
  }
  return out;
}

export interface TypedFrame<Meta> {
  meta: Meta;
  arrays: Record<string, AnyTyped>;
}

/** Decodes a frame (views into `buffer`, no copy); throws on a buffer that is not one. */
export function decodeTypedFrame<Meta>(buffer: ArrayBuffer): TypedFrame<Meta> {
  const bytes = new Uint8Array(buffer);
  if (bytes.length < 8 || MAGIC.some((value, k) => bytes[k] !== value)) throw new Error('not a gridshake typed frame');
  const headerLength = new DataView(buffer).getUint32(4, true);
  if (8 + headerLength > bytes.length) throw new Error('typed frame header runs past the end');
  const header = JSON.parse(new TextDecoder().decode(bytes.subarray(8, 8 + headerLength))) as {
    meta: Meta;
    arrays: { name: string; type: TypedArrayKind; length: number }[];
  };
  const arrays: Record<string, AnyTyped> = {};
  let at = padded(8 + headerLength);
  for (const { name, type, length } of header.arrays) {
    const Constructor = CONSTRUCTORS[type];
    if (Constructor === undefined) throw new Error(`typed frame array ${name} has unknown type ${String(type)}`);
    const byteLength = length * Constructor.BYTES_PER_ELEMENT;
    if (at + byteLength > bytes.length) throw new Error(`typed frame array ${name} runs past the end`);
    arrays[name] = new Constructor(buffer, at, length);
    at += padded(byteLength);
  }
  return { meta: header.meta, arrays };
}
