import { describe, it, expect } from 'vitest';
import { orientRing, ringOrientation, ringSignedArea, ringsSignedArea } from '../../../workers/geometry/ring-area.js';

describe('ringSignedArea (shoelace formula)', () => {
  it('gives the hand-computed areas of a unit square, the 3-4-5 right triangle and their orientation', () => {
    // unit square: area 1; right triangle with legs 3 and 4: area 6 (hand computation)
    expect(ringSignedArea(Float64Array.from([0, 0, 1, 0, 1, 1, 0, 1]))).toBe(1);
    expect(ringSignedArea(Float64Array.from([0, 0, 0, 1, 1, 1, 1, 0]))).toBe(-1);
    expect(ringSignedArea(Float64Array.from([0, 0, 4, 0, 0, 3]))).toBe(6);
    expect(ringOrientation(Float64Array.from([0, 0, 4, 0, 0, 3]))).toBe(1);
    expect(ringOrientation(Float64Array.from([0, 0, 1, 1, 2, 2]))).toBe(0);
  });

  it('stays exact far from the origin (projected coordinates in the millions)', () => {
    const ring = Float64Array.from([500000, 6000000, 500003, 6000000, 500003, 6000002, 500000, 6000002]);
    expect(ringSignedArea(ring)).toBe(6);
  });

  it('a shell with a hole sums to shell minus hole; orientRing flips only when needed', () => {
    const shell = Float64Array.from([0, 0, 10, 0, 10, 10, 0, 10]);
    const holeCounterClockwise = Float64Array.from([4, 4, 6, 4, 6, 6, 4, 6]);
    const hole = orientRing(holeCounterClockwise, -1);
    expect(ringOrientation(hole)).toBe(-1);
    expect(ringsSignedArea([shell, hole])).toBe(96);
    expect(Array.from(orientRing(shell, 1))).toEqual(Array.from(shell));
  });
});
