/**
 * Kept cells under a baseline (issue 15): the coverage rule is unchanged (select-cells.ts), and a cell with w_c = 0
 * is left out as well. The points in such cells are reported, never silently dropped.
 * Cost O(kept cells).
 */
import type { KeptCells } from '../types.js';

export interface BaselineKept {
  /** the cells that pass the coverage rule and have w_c > 0 */
  kept: KeptCells;
  /** w_c of each kept cell, in kept order */
  weights: Float64Array;
  /** Σ_kept w */
  baselineTotal: number;
  /** cells that pass the coverage rule but have w_c = 0 */
  zeroBaselineCells: number;
  /** points (inside V) in those cells */
  pointsInZeroBaselineCells: number;
}

/**
 * Narrow the coverage-kept cells to those with positive weight. `weights` and `counts` are per grid cell (storage
 * order of the coverage grid).
 */
export function keepBaselineCells(coverageKept: KeptCells, weights: Float64Array, counts: Int32Array): BaselineKept {
  const m0 = coverageKept.index.length;
  let m = 0;
  for (let k = 0; k < m0; k++) if (weights[coverageKept.index[k]!]! > 0) m++;
  const index = new Int32Array(m);
  const coverage = new Float64Array(m);
  const keptWeights = new Float64Array(m);
  let baselineTotal = 0;
  let pointsInZeroBaselineCells = 0;
  let at = 0;
  for (let k = 0; k < m0; k++) {
    const cell = coverageKept.index[k]!;
    const w = weights[cell]!;
    if (w > 0) {
      index[at] = cell;
      coverage[at] = coverageKept.coverage[k]!;
      keptWeights[at++] = w;
      baselineTotal += w;
    } else {
      pointsInZeroBaselineCells += counts[cell]!;
    }
  }
  return {
    kept: { index, coverage },
    weights: keptWeights,
    baselineTotal,
    zeroBaselineCells: m0 - m,
    pointsInZeroBaselineCells,
  };
}
