/**
 * Exact coverage of every hexagon of one placement: |hexagon ∩ valid region| / s^2.
 *
 * Method (three rhombus lattices): a regular hexagon is the union of three rhombi that meet at its centre, spanned by
 * the spokes (e0, e2), (e2, e4) and (e4, e0) (e_k the centre-to-vertex vector at 30 + 60 k degrees; the "tumbling
 * blocks" dissection, area s^2/3 each). For each of the three spoke pairs, the rhombi of all hexagons are cells of
 * one parallelogram lattice; in that lattice's own coordinates (alpha, beta), P = c(0,0) + alpha g1 + beta g2, its
 * cells are unit squares, so their exact coverage is the square lattice's signed-area accumulation
 * (geometry/coverage.ts unitCellCoverage; an affine map with positive determinant keeps area ratios and ring
 * orientation). Hexagon (i, j) is then (coverage of its three rhombi) / 3, read at
 *   (e0, e2): (i + 2j, j - i),   (e2, e4): (-2i - j, -i - 2j),   (e4, e0): (i - j, 2i + j)
 * (the hexagon lattice vectors E1 = e0 - e2 and E2 = 2 e0 + e2 written in each pair's basis).
 * Holes subtract by their orientation; float noise within 1e-12 of 0 or 1 is clamped as for squares.
 * Cost O(cells + edge crossings) for each of the three lattices (each has three cells per hexagon), O(hexagons) to
 * sum. Checked in the tests against Sutherland & Hodgman (1974) clipping of every hexagon.
 */
import { COVERAGE_NOISE, MAX_GRID_CELLS, unitCellCoverage } from '../../geometry/coverage.js';
import type { CoverageGrid, Origin, Placement, Region } from '../../types.js';
import { createHexFrame } from './hex-frame.js';

const ROOT3 = Math.sqrt(3);

/** The spoke pairs (g1, g2) in units of a, grid frame: (e0, e2), (e2, e4), (e4, e0); rhombus indices in hexCoverage. */
const RHOMBUS_BASES: readonly { g1: [number, number]; g2: [number, number] }[] = [
  { g1: [ROOT3 / 2, 0.5], g2: [-ROOT3 / 2, 0.5] },
  { g1: [-ROOT3 / 2, 0.5], g2: [0, -1] },
  { g1: [0, -1], g2: [ROOT3 / 2, 0.5] },
];

/**
 * Ring vertices relative to the centre of hexagon (0, 0), grid frame, in units of the side a: one flat array of
 * (x, y) per ring.
 */
function ringsAroundFirstCentre(region: Region, origin: Origin, cellSize: number, placement: Placement): Float64Array[] {
  const frame = createHexFrame(origin, cellSize, placement);
  const { cos, sin, side } = frame;
  const centreX = placement.u * ROOT3 + (placement.v * ROOT3) / 2;
  const centreY = 1.5 * placement.v;
  return region.rings.map((ring) => {
    const out = new Float64Array(ring.length);
    for (let k = 0; k < ring.length; k += 2) {
      const dx = ring[k]! - origin.x;
      const dy = ring[k + 1]! - origin.y;
      out[k] = (dx * cos + dy * sin) / side - centreX;
      out[k + 1] = (-dx * sin + dy * cos) / side - centreY;
    }
    return out;
  });
}

/** The same rings in the coordinates (alpha, beta) of basis (g1, g2). */
function toBasis(rings: Float64Array[], g1: [number, number], g2: [number, number]): Float64Array[] {
  const det = g1[0] * g2[1] - g1[1] * g2[0];
  return rings.map((ring) => {
    const out = new Float64Array(ring.length);
    for (let k = 0; k < ring.length; k += 2) {
      const x = ring[k]!;
      const y = ring[k + 1]!;
      out[k] = (x * g2[1] - y * g2[0]) / det;
      out[k + 1] = (g1[0] * y - g1[1] * x) / det;
    }
    return out;
  });
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
  const rhombi = RHOMBUS_BASES.map((lattice) =>
    unitCellCoverage(toBasis(rings, lattice.g1, lattice.g2), `hexagonal cell size ${cellSize} m`),
  );
  const coverage = new Float64Array(nx * ny);
  // rhombus (alpha, beta) of hexagon (i, j): (i + 2j, j - i), (-2i - j, -i - 2j), (i - j, 2i + j) (header comment);
  // along a row of hexagons (i + 1) they step by (1, -1), (-2, -1) and (1, 2)
  const steps: readonly [number, number][] = [[1, -1], [-2, -1], [1, 2]];
  const starts = (i: number, j: number): [number, number][] => [[i + 2 * j, j - i], [-2 * i - j, -i - 2 * j], [i - j, 2 * i + j]];
  for (let k = 0; k < 3; k++) {
    const grid = rhombi[k]!;
    const { i0: gi0, j0: gj0, nx: gnx, ny: gny, coverage: values } = grid;
    const [stepAlpha, stepBeta] = steps[k]!;
    for (let r = 0; r < ny; r++) {
      let [alpha, beta] = starts(i0, j0 + r)[k]!;
      alpha -= gi0;
      beta -= gj0;
      const offset = r * nx;
      for (let c = 0; c < nx; c++) {
        if (alpha >= 0 && alpha < gnx && beta >= 0 && beta < gny) coverage[offset + c] += values[beta * gnx + alpha]!;
        alpha += stepAlpha;
        beta += stepBeta;
      }
    }
  }
  for (let k = 0; k < coverage.length; k++) {
    const value = coverage[k]! / 3;
    coverage[k] = value < COVERAGE_NOISE ? 0 : value > 1 - COVERAGE_NOISE ? 1 : value;
  }
  return { shape: 'hex', i0, j0, nx, ny, coverage };
}
