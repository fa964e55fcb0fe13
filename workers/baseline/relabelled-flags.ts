/**
 * The stability flags' input for one random labelling (issue 15, controls): the same rule as the chi-square of the
 * labelling (relabelled-chi-square.ts). Of the cells that pass the coverage rule, those holding at least one simulated
 * control, w*_c = pool_c − O*_c > 0, are tested, with E_c = N*·w*_c/Σ w* (cell-flags.ts), N* the simulated cases in
 * them; the family of the Benjamini-Hochberg step-up is those cells. Applied to the observed labelling this is
 * exactly the observed flags' input (the kept cells, w_c > 0, with the observed controls' weights), so the observed
 * flags and the relabelled ones are one function of the labelling, which random labelling calibrates.
 * The stability surface records cells by the observed placement's kept cells; a flagged cell that the observed
 * labelling leaves out (it held cases but no control) has no pixels there and is dropped (keptIndex −1).
 * Cost O(m) per labelling, m the coverage-kept cells.
 * Reference: P. J. Diggle (2003), Statistical Analysis of Spatial Point Patterns, 2nd ed., Arnold (random labelling).
 */
import type { KeptCells } from '../types.js';

/** For each coverage-kept cell, its index among the observed kept cells (−1 when left out). Both lists are in grid order. */
export function keptIndexOfCoverage(coverageKept: KeptCells, kept: KeptCells): Int32Array {
  const out = new Int32Array(coverageKept.index.length).fill(-1);
  let at = 0;
  for (let k = 0; k < out.length && at < kept.index.length; k++) {
    if (coverageKept.index[k] === kept.index[at]) out[k] = at++;
  }
  return out;
}

/** Reusable buffers; after fill(), counts, weights and keptIndex hold `length` tested cells. */
export class RelabelledFlagInput {
  counts = new Int32Array(0);
  weights = new Float64Array(0);
  keptIndex = new Int32Array(0);
  length = 0;

  /**
   * `simulatedCounts`: the labelling's cases per grid cell; `pool`: cases + controls of each coverage-kept cell (kept
   * order, poolCounts); `keptOf`: keptIndexOfCoverage. Returns the number of tested cells.
   */
  fill(simulatedCounts: Int32Array, pool: Float64Array, coverageKept: KeptCells, keptOf: Int32Array): number {
    const m0 = pool.length;
    if (this.counts.length < m0) {
      this.counts = new Int32Array(m0);
      this.weights = new Float64Array(m0);
      this.keptIndex = new Int32Array(m0);
    }
    let m = 0;
    for (let k = 0; k < m0; k++) {
      const cases = simulatedCounts[coverageKept.index[k]!]!;
      const controls = pool[k]! - cases;
      if (!(controls > 0)) continue;
      this.counts[m] = cases;
      this.weights[m] = controls;
      this.keptIndex[m++] = keptOf[k]!;
    }
    this.length = m;
    return m;
  }
}
