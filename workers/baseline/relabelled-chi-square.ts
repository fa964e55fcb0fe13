/**
 * The chi-square of one random labelling (issue 15, controls): the pooled cases and controls of each kept cell stay
 * where they are, n of them are drawn as the simulated cases, and the rest are the simulated controls. The statistic
 * is then computed exactly as for the observed data: over the cells that pass the coverage rule and hold at least one
 * simulated control (w*_c = pool_c − O*_c > 0), E_c = N*·w*_c/Σ w*, chi2 = Σ (O*_c − E_c)^2/E_c = (W/N*) Σ O*_c^2/w*_c − N*,
 * df = m* − 1 (NaN when fewer than 2 cells or no case remain). Keeping the weights of the observed controls while
 * relabelling would compare unlike statistics (the simulated cases would include the controls' own positions).
 * Cost O(m) per simulated pattern.
 * Reference: P. J. Diggle (2003), Statistical Analysis of Spatial Point Patterns, 2nd ed., Arnold, section 8
 * (random labelling); K. Pearson (1900), Philosophical Magazine 50:157-175.
 */
import { chiSquareFromTotals } from '../stats/dispersion-chi-square.js';
import type { DispersionResult, KeptCells } from '../types.js';

/** Pool (cases + controls) of each coverage-kept cell, in kept order, from per-grid-cell case counts and weights. */
export function poolCounts(caseCounts: Int32Array, controlWeights: Float64Array, coverageKept: KeptCells): Float64Array {
  const pool = new Float64Array(coverageKept.index.length);
  for (let k = 0; k < pool.length; k++) {
    const cell = coverageKept.index[k]!;
    pool[k] = caseCounts[cell]! + controlWeights[cell]!;
  }
  return pool;
}

/** The statistic of one labelling: simulated case counts per grid cell against the pool of each coverage-kept cell. */
export function relabelledChiSquare(simulatedCounts: Int32Array, pool: Float64Array, coverageKept: KeptCells): DispersionResult {
  let cells = 0;
  let points = 0;
  let weightSum = 0;
  let weightedSquares = 0;
  for (let k = 0; k < pool.length; k++) {
    const cases = simulatedCounts[coverageKept.index[k]!]!;
    const controls = pool[k]! - cases;
    if (!(controls > 0)) continue;
    cells++;
    points += cases;
    weightSum += controls;
    weightedSquares += (cases * cases) / controls;
  }
  const chi2 = cells >= 2 ? chiSquareFromTotals(points, weightSum, weightedSquares) : Number.NaN;
  return { chi2, df: cells - 1, points };
}
