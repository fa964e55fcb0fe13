/**
 * Exact coverage of every cell of one placement by the valid region, all cells at once.
 *
 * coverage(i, j) = |cell(i, j) intersect region| / s^2, with cells per the grid contract (grid-frame.ts).
 * Method: transform ring vertices to cell units, accumulate every edge's signed area (edge-accumulation.ts), then
 * a prefix sum along each row. Holes (clockwise rings) subtract by their orientation. Float noise is clamped:
 * |c| < 1e-12 -> 0, |c - 1| < 1e-12 -> 1, and c is kept in [0, 1].
 * Cost O(cells + edge crossings) time, O(cells) memory. The grid covers the transformed region's bounding box.
 * Reference for the idea: area-accumulation rasterizers (Levien 2016, font-rs); checked in the tests against
 * Sutherland & Hodgman (1974, "Reentrant polygon clipping", CACM 17:32-42) clipping per cell.
 */
import type { CoverageGrid, GridExtent, Origin, Placement, Region } from '../types.js';
import { accumulateEdge } from './edge-accumulation.js';
import { createGridFrame } from './grid-frame.js';

/** Largest grid a placement may have; beyond it the cell size is far too small for the region. */
export const MAX_GRID_CELLS = 1 << 27;

/** Coverage this close to 0 or 1 is float noise and is clamped to 0 or 1. */
export const COVERAGE_NOISE = 1e-12;
const NOISE = COVERAGE_NOISE;

/**
 * Ring vertices turned into a lattice's frame: X = x'/scale - shiftX, Y = y'/scale - shiftY with x' = dx cos + dy sin,
 * y' = -dx sin + dy cos (dx, dy from the origin); one Float64Array per ring. Used by every lattice's coverage.
 */
export function ringsInFrame(region: Region, origin: Origin, cos: number, sin: number, scale: number, shiftX: number, shiftY: number): Float64Array[] {
  return region.rings.map((ring) => {
    const out = new Float64Array(ring.length);
    for (let k = 0; k < ring.length; k += 2) {
      const dx = ring[k]! - origin.x;
      const dy = ring[k + 1]! - origin.y;
      out[k] = (dx * cos + dy * sin) / scale - shiftX;
      out[k + 1] = (-dx * sin + dy * cos) / scale - shiftY;
    }
    return out;
  });
}

/** Ring vertices in cell units (X = x'/s - u, Y = y'/s - v), one Float64Array per ring. */
export function ringsInCellUnits(region: Region, origin: Origin, cellSize: number, placement: Placement): Float64Array[] {
  const { cos, sin, u, v } = createGridFrame(origin, cellSize, placement);
  return ringsInFrame(region, origin, cos, sin, cellSize, u, v);
}

/** Bounding box [minX, minY, maxX, maxY] of rings in cell units. */
export function ringsExtent(rings: Float64Array[]): [number, number, number, number] {
  let minX = Infinity;
  let minY = Infinity;
  let maxX = -Infinity;
  let maxY = -Infinity;
  for (const ring of rings) {
    for (let k = 0; k < ring.length; k += 2) {
      const x = ring[k]!;
      const y = ring[k + 1]!;
      if (x < minX) minX = x;
      if (x > maxX) maxX = x;
      if (y < minY) minY = y;
      if (y > maxY) maxY = y;
    }
  }
  return [minX, minY, maxX, maxY];
}

/**
 * Accumulate every edge of one ring (cell units) into the grid whose lower-left cell is (i0, j0); `rowFrom`, `ny`:
 * only the band of grid rows [rowFrom, rowFrom + ny), held from row rowFrom on (accumulateEdge).
 */
export function accumulateRing(coverage: Float64Array, ring: Float64Array, i0: number, j0: number, nx: number, ny: number, rowFrom = 0): void {
  const vertexCount = ring.length >> 1;
  let previous = vertexCount - 1;
  for (let k = 0; k < vertexCount; k++) {
    accumulateEdge(coverage, nx, ny, ring[2 * previous]! - i0, ring[2 * previous + 1]! - j0, ring[2 * k]! - i0, ring[2 * k + 1]! - j0, rowFrom);
    previous = k;
  }
}

/** A running coverage sum with its rounding noise removed: 0 below COVERAGE_NOISE, 1 within it of 1. */
export function settledCoverage(running: number): number {
  return running < NOISE ? 0 : running > 1 - NOISE ? 1 : running;
}

/** Prefix sums along each of ny rows turn accumulated signed areas into coverages; float noise is clamped. */
function prefixSumRows(coverage: Float64Array, nx: number, ny: number): void {
  for (let row = 0; row < ny; row++) {
    let running = 0;
    const offset = row * nx;
    for (let column = 0; column < nx; column++) {
      running += coverage[offset + column]!;
      coverage[offset + column] = settledCoverage(running);
    }
  }
}

/** The cells (i0, j0, nx, ny) of the transformed region's bounding box, without allocating the grid. Cost O(vertices). */
export function gridExtent(region: Region, origin: Origin, cellSize: number, placement: Placement): GridExtent {
  return extentOf(ringsInCellUnits(region, origin, cellSize, placement));
}

/** The grid over rings already in cell units: the cells of their bounding box. Cost O(vertices). */
export function extentOf(rings: Float64Array[]): GridExtent {
  const [minX, minY, maxX, maxY] = ringsExtent(rings);
  if (!(maxX >= minX && maxY >= minY)) throw new RangeError('region has no vertices: cannot compute cell coverage');
  const i0 = Math.floor(minX);
  const j0 = Math.floor(minY);
  return { i0, j0, nx: Math.max(1, Math.ceil(maxX) - i0), ny: Math.max(1, Math.ceil(maxY) - j0) };
}

/** Throws a RangeError naming `what` (the cell size) when a grid of nx x ny cells exceeds MAX_GRID_CELLS. */
export function assertGridSize(nx: number, ny: number, what: string): void {
  if (nx * ny > MAX_GRID_CELLS) {
    throw new RangeError(
      `${what} gives a grid of ${nx} x ${ny} cells over the region, more than ${MAX_GRID_CELLS}: choose a larger cell size`,
    );
  }
}

/**
 * Exact coverage of the unit cells [c, c+1) x [r, r+1) by rings already in cell units (any affine image of the plane
 * with positive determinant: coverage is a ratio of areas, which such maps keep). The grid covers the rings' bounding
 * box. `what` names the cell size in the error for a grid that is too large.
 */
export function unitCellCoverage(rings: Float64Array[], what: string): CoverageGrid {
  const { i0, j0, nx, ny } = extentOf(rings);
  assertGridSize(nx, ny, what);
  const coverage = new Float64Array(nx * ny);
  for (const ring of rings) accumulateRing(coverage, ring, i0, j0, nx, ny);
  prefixSumRows(coverage, nx, ny);
  return { i0, j0, nx, ny, coverage };
}

/** Exact coverage of all cells that the transformed region's bounding box touches. */
export function placementCoverage(region: Region, origin: Origin, cellSize: number, placement: Placement): CoverageGrid {
  return unitCellCoverage(ringsInCellUnits(region, origin, cellSize, placement), `cell size ${cellSize} m`);
}
