/**
 * Excess and deficit cells of one placement: each kept cell c is tested one-sided against its expected count
 * E_c = N a_c / sum(a) (N points in the kept cells, a_c the coverage, or the weight w_c against baseline polygons,
 * issue 15, workers/sweep/evaluate-chunk.ts; shared/design.md), with exact Poisson tails
 *   excess p-value  p+_c = P(X >= O_c),  deficit p-value  p-_c = P(X <= O_c),  X ~ Poisson(E_c),
 * and the multiplicity across the placement's m kept cells controlled by Benjamini-Hochberg at alpha, separately for
 * the excess family and the deficit family (workers/stability/benjamini-hochberg.ts).
 * Cost O(m) plus a few tail evaluations: a whole cell (coverage 1) is a candidate only when its count reaches the
 * critical count of its mean, a partial cell when its count lies on the tested side of its mean; only candidates get
 * an exact p-value and enter the step-up (with the family size m), since every other p-value exceeds alpha.
 */
import { poissonLowerTail, poissonUpperTail } from '../stats/poisson-tails.js';
import { benjaminiHochberg } from './benjamini-hochberg.js';

/** Reusable buffers of flagCells; after a call, excess[0 .. excessCount-1] lists the excess cells (kept order). */
export interface CellFlagScratch {
  candidates: Int32Array;
  pValues: Float64Array;
  order: Uint32Array;
  reject: Uint8Array;
  excess: Int32Array;
  deficit: Int32Array;
}

export function createCellFlagScratch(): CellFlagScratch {
  return { candidates: new Int32Array(0), pValues: new Float64Array(0), order: new Uint32Array(0), reject: new Uint8Array(0), excess: new Int32Array(0), deficit: new Int32Array(0) };
}

function ensure(scratch: CellFlagScratch, m: number): void {
  if (scratch.candidates.length >= m) return;
  scratch.candidates = new Int32Array(m);
  scratch.pValues = new Float64Array(m);
  scratch.order = new Uint32Array(m);
  scratch.reject = new Uint8Array(m);
  scratch.excess = new Int32Array(m);
  scratch.deficit = new Int32Array(m);
}

/** Rejects among the n candidates by BH with family m; writes the rejected cells into out; returns their number. */
function stepUp(scratch: CellFlagScratch, n: number, m: number, alpha: number, out: Int32Array): number {
  if (n === 0) return 0;
  const rejected = benjaminiHochberg(scratch.pValues, n, alpha, scratch.reject, scratch.order, m);
  let written = 0;
  for (let t = 0; t < n && written < rejected; t++) if (scratch.reject[t] === 1) out[written++] = scratch.candidates[t]!;
  return written;
}

/**
 * Flags the kept cells (counts and coverages in kept order, m = counts.length). Returns the numbers of excess and
 * deficit cells, listed (kept indices, increasing) in scratch.excess and scratch.deficit.
 */
export function flagCells(counts: Float64Array, coverage: Float64Array, alpha: number, scratch: CellFlagScratch): { excess: number; deficit: number } {
  const m = counts.length;
  ensure(scratch, m);
  let total = 0;
  let area = 0;
  for (let k = 0; k < m; k++) {
    total += counts[k]!;
    area += coverage[k]!;
  }
  if (total === 0 || area <= 0) return { excess: 0, deficit: 0 };
  const rate = total / area;
  const { candidates, pValues } = scratch;
  const upper = criticalUpper(rate, alpha);
  let n = 0;
  for (let k = 0; k < m; k++) {
    const a = coverage[k]!;
    const o = counts[k]!;
    const mean = rate * a;
    if (a === 1 ? o >= upper : o > mean) {
      const p = poissonUpperTail(o, mean);
      if (p <= alpha) {
        candidates[n] = k;
        pValues[n++] = p;
      }
    }
  }
  const excess = stepUp(scratch, n, m, alpha, scratch.excess);
  const lower = criticalLower(rate, alpha);
  n = 0;
  for (let k = 0; k < m; k++) {
    const a = coverage[k]!;
    const o = counts[k]!;
    const mean = rate * a;
    if (a === 1 ? o <= lower : o < mean) {
      const p = poissonLowerTail(o, mean);
      if (p <= alpha) {
        candidates[n] = k;
        pValues[n++] = p;
      }
    }
  }
  const deficit = stepUp(scratch, n, m, alpha, scratch.deficit);
  return { excess, deficit };
}

/** The smallest k >= 1 with P(X >= k) <= alpha, X ~ Poisson(mean): counts below it have p-values above alpha. */
export function criticalUpper(mean: number, alpha: number): number {
  let k = Math.max(1, Math.floor(mean + Math.sqrt(mean)));
  while (k > 1 && poissonUpperTail(k - 1, mean) <= alpha) k -= 1;
  while (poissonUpperTail(k, mean) > alpha) k += 1;
  return k;
}

/** The largest k with P(X <= k) <= alpha (-1 when even P(X = 0) > alpha): counts above it have p-values above alpha. */
export function criticalLower(mean: number, alpha: number): number {
  if (poissonLowerTail(0, mean) > alpha) return -1;
  let k = Math.max(0, Math.ceil(mean - Math.sqrt(mean)));
  while (k > 0 && poissonLowerTail(k, mean) > alpha) k -= 1;
  while (poissonLowerTail(k + 1, mean) <= alpha) k += 1;
  return k;
}
