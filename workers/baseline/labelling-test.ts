/**
 * The random-labelling Monte Carlo test of one grid placement against control points (issue 15; `gridshake count
 * --controls`). Under the null the cases and the controls inside the valid region V are one population, and which of
 * them are cases is a random labelling: every n-subset of the N = n + c pooled points is equally likely to be the
 * cases. The statistic is chi2/df of the relabelled chi-square (relabelled-chi-square.ts: over the cells that pass
 * the coverage rule and hold at least one control of the labelling, E_c = N*·w*_c/Σ w*), computed by the same code
 * for the observed labelling and for R random ones, so the R + 1 values are exchangeable under the null and
 * p = (1 + #{r: t_r >= t_obs}) / (R + 1) is exact (server/summary/monte-carlo-p-value.ts).
 * Each pooled point is located once (the lattice's cell-of-point rule); a labelling is a partial Fisher-Yates shuffle
 * of the pool (any starting order gives a uniform n-subset), drawn with the generator seeded by deriveSeed(seed, r),
 * so labelling r is the same on every run.
 * Cost O(N) once, then O(n + m) per labelling (m the coverage-kept cells).
 * Reference: P. J. Diggle (2003), Statistical Analysis of Spatial Point Patterns, 2nd ed., Arnold, and P. J. Diggle
 * (2014), 3rd ed., CRC Press (random labelling); J. Besag and P. J. Diggle (1977), Applied Statistics 26:327-333
 * (Monte Carlo tests); R. Durstenfeld (1964), CACM 7:420 (the shuffle).
 */
import { createRandom, deriveSeed } from '../random/index.js';
import type { KeptCells } from '../types.js';
import { relabelledChiSquare } from './relabelled-chi-square.js';

export interface LabellingTestInput {
  /** the cases inside V, flat x, y */
  cases: Float64Array;
  /** the controls inside V, flat x, y */
  controls: Float64Array;
  /** the grid cell (storage order) of a point, or −1 outside the placement's grid */
  locate: (x: number, y: number) => number;
  /** cells of the grid (nx·ny) */
  gridCells: number;
  /** the cells that pass the coverage rule */
  coverageKept: KeptCells;
  /** R random labellings */
  sims: number;
  seed: number;
}

export interface LabellingTestResult {
  /** chi2/df of the observed labelling (NaN when fewer than 2 cells hold controls) */
  observed: number;
  /** chi2/df of each random labelling, in order r = 0 .. R − 1 */
  simulated: Float64Array;
}

function statistic(counts: Int32Array, pool: Float64Array, coverageKept: KeptCells): number {
  const { chi2, df } = relabelledChiSquare(counts, pool, coverageKept);
  return chi2 / df;
}

export function labellingMonteCarlo(input: LabellingTestInput): LabellingTestResult {
  const { cases, controls, locate, gridCells, coverageKept, sims, seed } = input;
  const n = cases.length / 2;
  const size = n + controls.length / 2;
  const cellOf = new Int32Array(size);
  for (let k = 0; k < size; k++) {
    const xy = k < n ? cases : controls;
    const at = k < n ? 2 * k : 2 * (k - n);
    cellOf[k] = locate(xy[at]!, xy[at + 1]!);
  }
  const counts = new Int32Array(gridCells);
  for (let k = 0; k < size; k++) if (cellOf[k]! >= 0) counts[cellOf[k]!]! += 1;
  const pool = new Float64Array(coverageKept.index.length);
  for (let k = 0; k < pool.length; k++) pool[k] = counts[coverageKept.index[k]!]!;
  counts.fill(0);
  for (let k = 0; k < n; k++) if (cellOf[k]! >= 0) counts[cellOf[k]!]! += 1;
  const observed = statistic(counts, pool, coverageKept);
  const simulated = new Float64Array(sims);
  const order = new Int32Array(size);
  for (let k = 0; k < size; k++) order[k] = k;
  counts.fill(0);
  for (let r = 0; r < sims; r++) {
    const random = createRandom(deriveSeed(seed, r));
    for (let k = 0; k < n; k++) {
      const pick = k + Math.floor(random() * (size - k));
      const chosen = order[pick]!;
      order[pick] = order[k]!;
      order[k] = chosen;
      const cell = cellOf[chosen]!;
      if (cell >= 0) counts[cell]! += 1;
    }
    simulated[r] = statistic(counts, pool, coverageKept);
    // back to zero by undoing this labelling's counts: O(n), not O(grid cells)
    for (let k = 0; k < n; k++) {
      const cell = cellOf[order[k]!]!;
      if (cell >= 0) counts[cell]! -= 1;
    }
  }
  return { observed, simulated };
}
