/**
 * The square lattice (shared/design.md, grid contract): cell (i, j) = (floor(x'/s - u), floor(y'/s - v)), cells of
 * side s, angle period 90 degrees. Coverage by signed-area accumulation (geometry/coverage.ts), counting by the
 * kernel of square-counter.ts, corners by the inverse grid frame. Its grids carry no shape tag (absent = square).
 */
import { placementCoverage } from '../../geometry/coverage.js';
import { cellCorners, cellOfPoint, cellUnitX, cellUnitY, createGridFrame, type GridFrame } from '../../geometry/grid-frame.js';
import { frameFromRules, type Lattice } from '../lattice.js';
import { createSquareCounter } from './square-counter.js';
import { selectCellsByBand } from '../../placement/select-cells-by-band.js';

/** cellOfPoint without allocating: (floor(x'/s - u), floor(y'/s - v)) written to out. */
function cellOfPointInto(frame: GridFrame, px: number, py: number, out: Float64Array): void {
  out[0] = Math.floor(cellUnitX(frame, px, py));
  out[1] = Math.floor(cellUnitY(frame, px, py));
}

export const squareLattice: Lattice = {
  shape: 'square',
  anglePeriod: 90,
  coverage: placementCoverage,
  keptCells: selectCellsByBand,
  createCounter: createSquareCounter,
  frame: frameFromRules(createGridFrame, cellOfPoint, cellOfPointInto, cellCorners),
};
