/**
 * Grid frame of one placement: the grid contract of shared/design.md, in one place.
 *
 * For origin O, cell side s (metres), offset (u, v) (cell units) and counter-clockwise angle t:
 *   x' = (px - Ox) cos t + (py - Oy) sin t
 *   y' = -(px - Ox) sin t + (py - Oy) cos t
 *   cell units X = x'/s - u, Y = y'/s - v; cell (i, j) = (floor(X), floor(Y)).
 * The inverse maps cell units back to planar metres (used to draw cells).
 * Cost: O(1) per point.
 */
import type { Origin, Placement } from '../types.js';

export interface GridFrame {
  originX: number;
  originY: number;
  cellSize: number;
  u: number;
  v: number;
  cos: number;
  sin: number;
}

/**
 * Cosine and sine of an angle in degrees, exact at multiples of 90 degrees (Math.cos(pi/2) is 6e-17, not 0).
 */
export function cosSinDegrees(angleDegrees: number): { cos: number; sin: number } {
  if (Number.isInteger(angleDegrees) && angleDegrees % 90 === 0) {
    const quarter = (((angleDegrees / 90) % 4) + 4) % 4;
    const table = [
      { cos: 1, sin: 0 },
      { cos: 0, sin: 1 },
      { cos: -1, sin: 0 },
      { cos: 0, sin: -1 },
    ];
    return table[quarter]!;
  }
  const radians = (angleDegrees * Math.PI) / 180;
  return { cos: Math.cos(radians), sin: Math.sin(radians) };
}

/** Throws a RangeError unless the cell size is a positive finite number and the placement's numbers are finite. */
export function checkFrameInputs(cellSize: number, placement: Placement): void {
  if (!(cellSize > 0) || !Number.isFinite(cellSize)) {
    throw new RangeError(`cell size must be a positive finite number of metres, got ${cellSize}`);
  }
  if (!Number.isFinite(placement.u) || !Number.isFinite(placement.v) || !Number.isFinite(placement.angle)) {
    throw new RangeError(
      `placement offset and angle must be finite numbers, got u=${placement.u} v=${placement.v} angle=${placement.angle}`,
    );
  }
}

/** The frame of one placement; throws a RangeError on a cell size that is not a positive finite number. */
export function createGridFrame(origin: Origin, cellSize: number, placement: Placement): GridFrame {
  checkFrameInputs(cellSize, placement);
  const { cos, sin } = cosSinDegrees(placement.angle);
  return { originX: origin.x, originY: origin.y, cellSize, u: placement.u, v: placement.v, cos, sin };
}

/** Cell-unit X = x'/s - u of a planar point (the grid contract's exact order of operations). */
export function cellUnitX(frame: GridFrame, px: number, py: number): number {
  const dx = px - frame.originX;
  const dy = py - frame.originY;
  return (dx * frame.cos + dy * frame.sin) / frame.cellSize - frame.u;
}

/** Cell-unit Y = y'/s - v of a planar point (the grid contract's exact order of operations). */
export function cellUnitY(frame: GridFrame, px: number, py: number): number {
  const dx = px - frame.originX;
  const dy = py - frame.originY;
  return (-dx * frame.sin + dy * frame.cos) / frame.cellSize - frame.v;
}

/** A planar point in cell units [X, Y]; its cell is [floor(X), floor(Y)]. */
export function toCellUnits(frame: GridFrame, px: number, py: number): [number, number] {
  return [cellUnitX(frame, px, py), cellUnitY(frame, px, py)];
}

/** The cell (i, j) that holds a planar point, per the grid contract. */
export function cellOfPoint(frame: GridFrame, px: number, py: number): [number, number] {
  return [Math.floor(cellUnitX(frame, px, py)), Math.floor(cellUnitY(frame, px, py))];
}

/** Inverse of toCellUnits: cell units (X, Y) back to planar metres. x' = (X + u) s, then rotate by +t. */
export function fromCellUnits(frame: GridFrame, cellX: number, cellY: number): [number, number] {
  const xPrime = (cellX + frame.u) * frame.cellSize;
  const yPrime = (cellY + frame.v) * frame.cellSize;
  return [
    frame.originX + xPrime * frame.cos - yPrime * frame.sin,
    frame.originY + xPrime * frame.sin + yPrime * frame.cos,
  ];
}

/** The four corners of cell (i, j) in planar metres as a closed ring (first corner repeated), counter-clockwise. */
export function cellCorners(frame: GridFrame, i: number, j: number): [number, number][] {
  return [
    fromCellUnits(frame, i, j),
    fromCellUnits(frame, i + 1, j),
    fromCellUnits(frame, i + 1, j + 1),
    fromCellUnits(frame, i, j + 1),
    fromCellUnits(frame, i, j),
  ];
}
