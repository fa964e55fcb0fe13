/**
 * The allocation-free cell-of-point of each lattice frame (used for the stability surface's pixels) gives the cell of
 * cellOfPoint, the contract's rule, on uniform points and on cell sides and corners (hexagon corners of hexCorners,
 * square corners of cellPolygon), rotated and offset.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { CELL_SHAPES } from '../../../workers/lattice/cell-shape.js';
import { latticeOf } from '../../../workers/lattice/registry.js';

describe('cellOfPointInto gives cellOfPoint', () => {
  for (const shape of CELL_SHAPES) {
    it(`${shape}: uniform points and the cells' corners and side midpoints`, () => {
      const lattice = latticeOf(shape);
      fc.assert(
        fc.property(
          fc.double({ min: 0, max: 0.999999, noNaN: true }),
          fc.double({ min: 0, max: 0.999999, noNaN: true }),
          fc.double({ min: 0, max: lattice.anglePeriod - 1e-9, noNaN: true }),
          fc.double({ min: 5, max: 500, noNaN: true }),
          fc.array(fc.tuple(fc.double({ min: -3000, max: 3000, noNaN: true }), fc.double({ min: -3000, max: 3000, noNaN: true })), { minLength: 20, maxLength: 20 }),
          (u, v, angle, cellSize, uniform) => {
            const frame = lattice.frame({ x: 250, y: -40 }, cellSize, { u, v, angle });
            const points: [number, number][] = [...uniform];
            for (let i = -2; i < 3; i++) {
              for (let j = -2; j < 3; j++) {
                const ring = frame.cellPolygon(i, j);
                for (let k = 0; k + 1 < ring.length; k++) {
                  points.push(ring[k]!, [(ring[k]![0] + ring[k + 1]![0]) / 2, (ring[k]![1] + ring[k + 1]![1]) / 2]);
                }
              }
            }
            const cell = new Float64Array(2);
            for (const [x, y] of points) {
              frame.cellOfPointInto(x, y, cell);
              expect([cell[0], cell[1]]).toEqual(frame.cellOfPoint(x, y));
            }
          },
        ),
        { numRuns: 40, seed: 1607 },
      );
    });
  }
});
