/**
 * Per-cell baseline weights w_c of one placement, on the cells of its coverage grid (same storage order).
 *
 * Polygons (areal weighting): w_c = Σ_p P_p · |c ∩ p ∩ V| / |p ∩ V|. Each piece p ∩ V goes through the lattice's
 * exact coverage (workers/lattice: signed-area accumulation for squares, three rhombus lattices for hexagons), so
 * |c ∩ p ∩ V| = coverage_p(c) · s^2 is exact, not sampled. A share below 1e-9 of the cell's area or of the piece's
 * area is clipping noise and adds nothing (BASELINE_SHARE_NOISE).
 * Reference: M. F. Goodchild and N. S.-N. Lam (1980), "Areal interpolation: a variant of the traditional spatial
 * problem", Geo-Processing 1:297-312 (areal weighting: a zone's count spread evenly over its area).
 *
 * Controls: w_c = number of control points (inside V) in cell c, by the lattice's cell-of-point rule, the one used
 * for the cases (workers/placement createCellCounter).
 *
 * Cost: polygons O(Σ_p (cells of p's bounding box + edge crossings of p)); controls O(controls) per placement.
 */
import { latticeOf } from '../lattice/registry.js';
import { createCellCounter } from '../placement/cell-counter.js';
import type { GridExtent, Origin, Placement } from '../types.js';
import { BASELINE_SHARE_NOISE, type Baseline, type ExpectedFrom, type PolygonBaseline } from './baseline.js';

/** A baseline ready for placements: its kind and the weights of a coverage grid's cells (w[k] for grid cell k). */
export interface BaselineWeigher {
  readonly expectedFrom: Exclude<ExpectedFrom, 'area'>;
  weights(grid: GridExtent, cellSize: number, placement: Placement): Float64Array;
}

/** Areal weighting of the polygon pieces onto the grid's cells (header comment). */
export function polygonWeights(
  baseline: PolygonBaseline,
  origin: Origin,
  grid: GridExtent,
  cellSize: number,
  placement: Placement,
): Float64Array {
  // the grid's own lattice (absent = square), so that weights and coverage come from the same cells
  const lattice = latticeOf(grid.shape);
  const { i0, j0, nx, ny } = grid;
  const weights = new Float64Array(nx * ny);
  const cellArea = cellSize * cellSize;
  baseline.pieces.forEach((piece, p) => {
    const count = baseline.counts[p]!;
    if (!(count > 0) || !(piece.area > 0)) return;
    const own = lattice.coverage(piece, origin, cellSize, placement);
    for (let r = 0; r < own.ny; r++) {
      const j = own.j0 + r - j0;
      if (j < 0 || j >= ny) continue;
      for (let c = 0; c < own.nx; c++) {
        const cover = own.coverage[r * own.nx + c]!;
        if (!(cover >= BASELINE_SHARE_NOISE)) continue;
        const share = (cover * cellArea) / piece.area;
        if (!(share >= BASELINE_SHARE_NOISE)) continue;
        const i = own.i0 + c - i0;
        if (i < 0 || i >= nx) continue;
        weights[j * nx + i] += count * share;
      }
    }
  });
  return weights;
}

/** The weigher of a baseline, built once per dataset (the controls' counter is built here). */
export function createBaselineWeigher(baseline: Baseline, origin: Origin): BaselineWeigher {
  if (baseline.kind === 'polygons') {
    return {
      expectedFrom: 'baseline',
      weights: (grid, cellSize, placement) => polygonWeights(baseline, origin, grid, cellSize, placement),
    };
  }
  const counter = createCellCounter(baseline.controls, origin);
  return {
    expectedFrom: 'controls',
    weights(grid, cellSize, placement) {
      const counts = new Int32Array(grid.nx * grid.ny);
      counter.count(grid, cellSize, placement, counts);
      return Float64Array.from(counts);
    },
  };
}
