import { describe, it, expect } from 'vitest';
import { halton, haltonPlacements } from '../../../workers/random/halton.js';
import { latticePlacements, latticeShape } from '../../../workers/random/lattice.js';

describe('halton (radical inverse; Halton 1960, Numerische Mathematik 2)', () => {
  it('gives the first points listed in shared/reference-values.md', () => {
    const expected = [
      [0, 0, 0],
      [0.5, 1 / 3, 0.2],
      [0.25, 2 / 3, 0.4],
      [0.75, 1 / 9, 0.6],
      [0.125, 4 / 9, 0.8],
    ];
    expected.forEach((point, k) => {
      expect(halton(k, 2)).toBe(point[0]);
      expect(halton(k, 3)).toBeCloseTo(point[1]!, 15);
      expect(halton(k, 5)).toBeCloseTo(point[2]!, 15);
    });
  });

  it('is the digit-reversed fraction: 11 = 1011 in base 2 -> 0.1101 = 13/16; 7 = 21 in base 3 -> 0.12 = 5/9', () => {
    // hand computation from the definition
    expect(halton(11, 2)).toBe(13 / 16);
    expect(halton(7, 3)).toBe(5 / 9);
  });

  it('the first 2^k base-2 values are the multiples of 2^-k (a permutation)', () => {
    const values = Array.from({ length: 1024 }, (_, k) => halton(k, 2) * 1024).sort((a, b) => a - b);
    expect(values).toEqual(Array.from({ length: 1024 }, (_, k) => k));
  });

  it('haltonPlacements maps (a, b, c) to offset (a, b) and angle 90 c; angle 0 without rotation', () => {
    const rotated = haltonPlacements(5, true);
    expect(rotated[0]).toEqual({ u: 0, v: 0, angle: 0 });
    expect(rotated[1]!.u).toBe(0.5);
    expect(rotated[1]!.v).toBeCloseTo(1 / 3, 15);
    expect(rotated[1]!.angle).toBeCloseTo(18, 12);
    expect(rotated[4]!.angle).toBeCloseTo(72, 12);
    const flat = haltonPlacements(64, false);
    expect(flat.every((p) => p.angle === 0 && p.u >= 0 && p.u < 1 && p.v >= 0 && p.v < 1)).toBe(true);
  });

  it('rejects bad counts, indices and bases', () => {
    expect(() => haltonPlacements(0, true)).toThrow(/positive integer/);
    expect(() => halton(-1, 2)).toThrow(RangeError);
    expect(() => halton(3, 1)).toThrow(/base/);
  });
});

describe('latticePlacements', () => {
  it('a 4 x 4 lattice of offsets for 16 placements without rotation, reference first', () => {
    const placements = latticePlacements(16, false);
    expect(placements).toHaveLength(16);
    expect(placements[0]).toEqual({ u: 0, v: 0, angle: 0 });
    const us = [...new Set(placements.map((p) => p.u))].sort();
    expect(us).toEqual([0, 0.25, 0.5, 0.75]);
    expect(new Set(placements.map((p) => `${p.u},${p.v}`)).size).toBe(16);
  });

  it('with rotation: balanced shape, exactly count placements, all distinct, angles in [0, 90)', () => {
    expect(latticeShape(64, true)).toEqual([4, 4, 4]);
    expect(latticeShape(1024, true)).toEqual([8, 8, 16]);
    for (const count of [1, 7, 12, 64, 100, 1024]) {
      const placements = latticePlacements(count, true);
      expect(placements).toHaveLength(count);
      expect(placements[0]).toEqual({ u: 0, v: 0, angle: 0 });
      expect(new Set(placements.map((p) => `${p.u},${p.v},${p.angle}`)).size).toBe(count);
      expect(placements.every((p) => p.angle >= 0 && p.angle < 90 && p.u < 1 && p.v < 1)).toBe(true);
    }
  });
});
