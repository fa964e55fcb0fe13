/**
 * Exact coverage of every hexagon of one placement: |hexagon ∩ valid region| / s^2.
 *
 * Method: ring vertices go to the grid frame in units of the side a around the centre of hexagon (0, 0), and
 * hex-row-accumulation.ts adds up, row of hexagons by row, the exact area of the region in each hexagon from the
 * ring edges (winding numbers by the rightward ray, integrated over each hexagon; hexagons wholly left of an edge
 * take its term through one difference entry, so interior hexagons cost one addition per row and edge crossing).
 * Holes subtract by their orientation; float noise within 1e-12 of 0 or 1 is clamped as for squares.
 * Cost O(hexagons + Σ_edges (rows spanned + hexagons crossed)), one Float64Array of the grid. It replaced three
 * rhombus lattices on the square accumulation (nine and more accumulator cells per hexagon), measured 6 to 20 times
 * slower than the square coverage; checked in the tests against Sutherland & Hodgman (1974) clipping of every
 * hexagon to 1e-12.
 */
import { COVERAGE_NOISE, MAX_GRID_CELLS, ringsInFrame } from '../../geometry/coverage.js';
import type { CoverageGrid, Origin, Placement, Region } from '../../types.js';
import { createHexFrame } from './hex-frame.js';
import { accumulateHexAreas } from './hex-row-accumulation.js';

const ROOT3 = Math.sqrt(3);
/** Area of a hexagon of side 1 (3 sqrt(3) / 2): the coverage's denominator s^2 in units of a^2. */
const HEX_AREA = (3 * ROOT3) / 2;

/**
 * Ring vertices relative to the centre of hexagon (0, 0), grid frame, in units of the side a: one flat array of
 * (x, y) per ring.
 */
function ringsAroundFirstCentre(region: Region, origin: Origin, cellSize: number, placement: Placement): Float64Array[] {
  const frame = createHexFrame(origin, cellSize, placement);
  const { cos, sin, side } = frame;
  const centreX = placement.u * ROOT3 + (placement.v * ROOT3) / 2;
  const centreY = 1.5 * placement.v;
  return ringsInFrame(region, origin, cos, sin, side, centreX, centreY);
}

/** Hexagon index range [i0, i1] x [j0, j1] that may meet the rings (axial q = x/sqrt3 - y/3, r = y/1.5 around c(0,0)). */
function hexRange(rings: Float64Array[]): [number, number, number, number] {
  let minQ = Infinity;
  let maxQ = -Infinity;
  let minR = Infinity;
  let maxR = -Infinity;
  for (const ring of rings) {
    for (let k = 0; k < ring.length; k += 2) {
      const q = ring[k]! / ROOT3 - ring[k + 1]! / 3;
      const r = ring[k + 1]! / 1.5;
      if (q < minQ) minQ = q;
      if (q > maxQ) maxQ = q;
      if (r < minR) minR = r;
      if (r > maxR) maxR = r;
    }
  }
  if (!(maxQ >= minQ && maxR >= minR)) throw new RangeError('region has no vertices: cannot compute cell coverage');
  // a hexagon reaches 2/3 from its centre in q and in r
  return [Math.floor(minQ - 2 / 3), Math.ceil(maxQ + 2 / 3), Math.floor(minR - 2 / 3), Math.ceil(maxR + 2 / 3)];
}

/** Exact coverage of all hexagons that may meet the region; the grid is tagged `shape: 'hex'`. */
export function hexCoverage(region: Region, origin: Origin, cellSize: number, placement: Placement): CoverageGrid {
  const rings = ringsAroundFirstCentre(region, origin, cellSize, placement);
  const [i0, i1, j0, j1] = hexRange(rings);
  const nx = i1 - i0 + 1;
  const ny = j1 - j0 + 1;
  if (nx * ny > MAX_GRID_CELLS) {
    throw new RangeError(
      `hexagonal cell size ${cellSize} m gives a grid of ${nx} x ${ny} cells over the region, more than ${MAX_GRID_CELLS}: choose a larger cell size`,
    );
  }
  const coverage = new Float64Array(nx * ny);
  accumulateHexAreas(rings, i0, j0, nx, ny, coverage);
  for (let k = 0; k < coverage.length; k++) {
    const value = coverage[k]! / HEX_AREA;
    coverage[k] = value < COVERAGE_NOISE ? 0 : value > 1 - COVERAGE_NOISE ? 1 : value;
  }
  return { shape: 'hex', i0, j0, nx, ny, coverage };
}
