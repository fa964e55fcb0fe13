import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { cellCorners, cellOfPoint, createGridFrame, fromCellUnits, toCellUnits } from '../../../workers/geometry/grid-frame.js';

describe('grid frame (shared/design.md, grid contract)', () => {
  it('maps a hand-worked point: origin (100, 200), s = 10, offset (0.25, 0.5), angle 30', () => {
    // x' = 20 cos 30 + 10 sin 30 = 22.3205..., y' = -20 sin 30 + 10 cos 30 = -1.3397... (hand computation)
    const frame = createGridFrame({ x: 100, y: 200 }, 10, { u: 0.25, v: 0.5, angle: 30 });
    const [X, Y] = toCellUnits(frame, 120, 210);
    expect(X).toBeCloseTo((20 * Math.sqrt(3) / 2 + 5) / 10 - 0.25, 12);
    expect(Y).toBeCloseTo((-10 + 5 * Math.sqrt(3)) / 10 - 0.5, 12);
    expect(cellOfPoint(frame, 120, 210)).toEqual([1, -1]);
  });

  it('angle 0 and offset 0 give cell floor((p - O)/s)', () => {
    const frame = createGridFrame({ x: 3, y: -7 }, 2, { u: 0, v: 0, angle: 0 });
    expect(cellOfPoint(frame, 3, -7)).toEqual([0, 0]);
    expect(cellOfPoint(frame, 6.999, -3.001)).toEqual([1, 1]);
    expect(cellOfPoint(frame, 2.999, -7.5)).toEqual([-1, -1]);
  });

  it('fromCellUnits inverts toCellUnits', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -1e6, max: 1e6, noNaN: true }),
        fc.double({ min: -1e6, max: 1e6, noNaN: true }),
        fc.double({ min: 0.5, max: 5000, noNaN: true }),
        fc.double({ min: 0, max: 0.999, noNaN: true }),
        fc.double({ min: 0, max: 0.999, noNaN: true }),
        fc.double({ min: 0, max: 89.99, noNaN: true }),
        (px, py, cellSize, u, v, angle) => {
          const frame = createGridFrame({ x: 1000, y: -2000 }, cellSize, { u, v, angle });
          const [X, Y] = toCellUnits(frame, px, py);
          const [x, y] = fromCellUnits(frame, X, Y);
          expect(Math.abs(x - px)).toBeLessThan(1e-6);
          expect(Math.abs(y - py)).toBeLessThan(1e-6);
        },
      ),
      { seed: 20261201 },
    );
  });

  it('cell corners form a closed counter-clockwise square of side s, rotated by the angle', () => {
    const frame = createGridFrame({ x: 0, y: 0 }, 4, { u: 0.5, v: 0, angle: 90 - 1e-9 });
    const corners = cellCorners(frame, 0, 0);
    expect(corners).toHaveLength(5);
    expect(corners[4]).toEqual(corners[0]);
    const [a, b] = [corners[0]!, corners[1]!];
    expect(Math.hypot(b[0] - a[0], b[1] - a[1])).toBeCloseTo(4, 9);
    // the first side points along the rotated x axis: nearly straight up at 90 degrees
    expect(b[1] - a[1]).toBeCloseTo(4, 6);
  });

  it('rejects a non-positive cell size and non-finite placements', () => {
    expect(() => createGridFrame({ x: 0, y: 0 }, -1, { u: 0, v: 0, angle: 0 })).toThrow(RangeError);
    expect(() => createGridFrame({ x: 0, y: 0 }, 1, { u: Number.NaN, v: 0, angle: 0 })).toThrow(/finite/);
  });
});
