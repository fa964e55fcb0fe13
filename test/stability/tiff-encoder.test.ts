/**
 * The TIFF writer (server/stability/tiff-encoder.ts) checked against readers written apart from the project: the
 * registry library geotiff (fromArrayBuffer) and the byte layout of TIFF 6.0 (Adobe 1992, section 2: "II", 42, the
 * first directory's offset; entries sorted by tag; values of more than 4 bytes at word-aligned offsets), and its
 * DEFLATE strips (Compression 8, Adobe's TIFF technical notes of 2002, from memory: each strip one zlib stream,
 * RFC 1950) inflated by node:zlib.
 */
import { inflateSync } from 'node:zlib';
import { fromArrayBuffer } from 'geotiff';
import { describe, expect, it } from 'vitest';
import { encodeFloat32Tiff, TIFF_ASCII, TIFF_DOUBLE } from '../../server/stability/tiff-encoder.js';

function readable(bytes: Uint8Array): ArrayBuffer {
  return bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength) as ArrayBuffer;
}

describe('float32 TIFF writer', () => {
  it('an image of several strips (300 x 700, two samples) reads back value for value', async () => {
    const width = 300;
    const height = 700;
    const samples = new Float32Array(width * height * 2);
    for (let k = 0; k < samples.length; k++) samples[k] = k % 97 === 0 ? Number.NaN : Math.fround(Math.sin(k) * 1e3);
    const bytes = encodeFloat32Tiff(width, height, 2, samples, [{ tag: 42113, type: TIFF_ASCII, values: 'nan' }]);
    const image = await (await fromArrayBuffer(readable(bytes))).getImage();
    expect([image.getWidth(), image.getHeight(), image.getSamplesPerPixel()]).toEqual([width, height, 2]);
    const directory = image.fileDirectory as unknown as { loadValue(tag: string): Promise<ArrayLike<number>> };
    const stripOffsets = await directory.loadValue('StripOffsets');
    expect(stripOffsets.length).toBeGreaterThan(1); // 256 KB strips of 2,400-byte rows: 109 rows each, 7 strips
    const bands = (await image.readRasters()) as unknown as Float32Array[];
    for (let p = 0; p < width * height; p++) {
      for (let b = 0; b < 2; b++) {
        const expected = samples[2 * p + b]!;
        const actual = bands[b]![p]!;
        if (Number.isNaN(expected)) expect(Number.isNaN(actual)).toBe(true);
        else if (actual !== expected) expect(actual).toBe(expected);
      }
    }
    expect(image.getGDALNoData()).toBeNaN();
  });

  it('header, sorted directory entries and word-aligned long values (TIFF 6.0 section 2)', () => {
    const bytes = encodeFloat32Tiff(
      3,
      1,
      1,
      new Float32Array([1, 2, 3]),
      [
        { tag: 33922, type: TIFF_DOUBLE, values: [0, 0, 0, 10, 20, 0] },
        { tag: 33550, type: TIFF_DOUBLE, values: [1, 1, 0] },
      ],
      { compression: 'none' },
    );
    const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
    expect([view.getUint8(0), view.getUint8(1), view.getUint16(2, true)]).toEqual([0x49, 0x49, 42]);
    const directory = view.getUint32(4, true);
    expect(directory % 2).toBe(0);
    const entries = view.getUint16(directory, true);
    const tags: number[] = [];
    for (let k = 0; k < entries; k++) {
      const entry = directory + 2 + 12 * k;
      tags.push(view.getUint16(entry, true));
      const type = view.getUint16(entry + 2, true);
      const count = view.getUint32(entry + 4, true);
      const size = { 2: 1, 3: 2, 4: 4, 12: 8 }[type as 2 | 3 | 4 | 12] * count;
      if (size > 4) expect(view.getUint32(entry + 8, true) % 2).toBe(0);
    }
    expect(tags).toEqual([...tags].sort((a, b) => a - b));
    expect(tags).toContain(33550);
    expect(view.getUint32(directory + 2 + 12 * entries, true)).toBe(0); // no further directory
    expect([1, 2, 3].map((k) => view.getFloat32(8 + 4 * (k - 1), true))).toEqual([1, 2, 3]);
  });

  it('DEFLATE strips (the default): Compression 8, each strip a zlib stream of its rows as little-endian float32, and much smaller for a mostly constant surface', async () => {
    const width = 400;
    const height = 500;
    const samples = new Float32Array(width * height * 2);
    for (let k = 0; k < samples.length; k += 2) samples[k] = k % 1000 < 40 ? 0.25 : 0;
    const bytes = encodeFloat32Tiff(width, height, 2, samples, []);
    expect(bytes.length).toBeLessThan((samples.length * 4) / 20);
    const image = await (await fromArrayBuffer(readable(bytes))).getImage();
    const directory = image.fileDirectory as unknown as { loadValue(tag: string): Promise<ArrayLike<number> | number> };
    const values = async (tag: string): Promise<number[]> => {
      const value = await directory.loadValue(tag);
      return typeof value === 'number' ? [value] : Array.from(value);
    };
    expect(await values('Compression')).toEqual([8]);
    const offsets = await values('StripOffsets');
    const counts = await values('StripByteCounts');
    const rowsPerStrip = (await values('RowsPerStrip'))[0]!;
    expect(offsets.length).toBeGreaterThan(1);
    offsets.forEach((offset, s) => {
      const strip = inflateSync(bytes.subarray(offset, offset + counts[s]!));
      const view = new DataView(strip.buffer, strip.byteOffset, strip.byteLength);
      const first = s * rowsPerStrip * width * 2;
      expect(strip.length).toBe(Math.min(rowsPerStrip, height - s * rowsPerStrip) * width * 2 * 4);
      for (let k = 0; k < strip.length / 4; k++) if (view.getFloat32(4 * k, true) !== samples[first + k]) expect(view.getFloat32(4 * k, true)).toBe(samples[first + k]);
    });
    const bands = (await image.readRasters()) as unknown as Float32Array[];
    for (let p = 0; p < width * height; p++) if (bands[0]![p] !== samples[2 * p] || bands[1]![p] !== 0) expect([bands[0]![p], bands[1]![p]]).toEqual([samples[2 * p], 0]);
  });

  it('refuses a sample array of the wrong length, an empty image and a tag given twice', () => {
    expect(() => encodeFloat32Tiff(2, 2, 2, new Float32Array(7), [])).toThrow(/needs 8 values, got 7/);
    expect(() => encodeFloat32Tiff(0, 2, 1, new Float32Array(0), [])).toThrow(/whole positive sizes/);
    expect(() => encodeFloat32Tiff(1, 1, 1, new Float32Array(1), [{ tag: 256, type: TIFF_ASCII, values: 'x' }])).toThrow(/tag 256 is given twice/);
  });

  it('writes other characters than 7-bit ASCII as "?" (TIFF 6.0 type 2)', async () => {
    const bytes = encodeFloat32Tiff(1, 1, 1, new Float32Array(1), [{ tag: 34737, type: TIFF_ASCII, values: 'Müller|' }]);
    const text = new TextDecoder('latin1').decode(bytes);
    expect(text).toContain('M?ller|');
  });
});
