/**
 * The square lattice (shared/design.md, grid contract): cell (i, j) = (floor(x'/s - u), floor(y'/s - v)), cells of
 * side s, angle period 90 degrees. Coverage by signed-area accumulation (geometry/coverage.ts), counting by the
 * kernel of square-counter.ts, corners by the inverse grid frame. Its grids carry no shape tag (absent = square).
 */
import { placementCoverage } from '../../geometry/coverage.js';
import { cellCorners, cellOfPoint, cellUnitX, cellUnitY, createGridFrame } from '../../geometry/grid-frame.js';
import type { Lattice } from '../lattice.js';
import { createSquareCounter } from './square-counter.js';

export const squareLattice: Lattice = {
  shape: 'square',
  anglePeriod: 90,
  coverage: placementCoverage,
  createCounter: createSquareCounter,
  frame(origin, cellSize, placement) {
    const frame = createGridFrame(origin, cellSize, placement);
    return {
      cellOfPoint: (px, py) => cellOfPoint(frame, px, py),
      cellOfPointInto: (px, py, out) => {
        out[0] = Math.floor(cellUnitX(frame, px, py));
        out[1] = Math.floor(cellUnitY(frame, px, py));
      },
      cellPolygon: (i, j) => cellCorners(frame, i, j),
    };
  },
};
