/**
 * Excess and deficit cells of one placement: each kept cell c is tested one-sided against its expected count
 * E_c = N a_c / sum(a) (N points in the kept cells, a_c the coverage; shared/design.md), with exact Poisson tails
 *   excess p-value  p+_c = P(X >= O_c),  deficit p-value  p-_c = P(X <= O_c),  X ~ Poisson(E_c),
 * and the multiplicity across the placement's m kept cells controlled by Benjamini-Hochberg at alpha, separately for
 * the excess family and the deficit family (workers/stability/benjamini-hochberg.ts).
 * Cost O(m) plus a few tail evaluations: a whole cell (coverage 1) is tested exactly only when its count reaches the
 * critical count of its mean (a p-value above alpha is never rejected, so it is written as 1 without evaluating it);
 * partial cells are evaluated when their count lies on the tested side of the mean.
 */
import { poissonLowerTail, poissonUpperTail } from '../stats/poisson-tails.js';
import { benjaminiHochberg } from './benjamini-hochberg.js';

/** Reusable buffers of flagCells, grown as needed. */
export interface CellFlagScratch {
  pValues: Float64Array;
  order: Uint32Array;
  excess: Uint8Array;
  deficit: Uint8Array;
}

export function createCellFlagScratch(): CellFlagScratch {
  return { pValues: new Float64Array(0), order: new Uint32Array(0), excess: new Uint8Array(0), deficit: new Uint8Array(0) };
}

function ensure(scratch: CellFlagScratch, m: number): void {
  if (scratch.pValues.length >= m) return;
  scratch.pValues = new Float64Array(m);
  scratch.order = new Uint32Array(m);
  scratch.excess = new Uint8Array(m);
  scratch.deficit = new Uint8Array(m);
}

/**
 * Flags the kept cells (counts and coverages in kept order, m = counts.length): scratch.excess[k] / scratch.deficit[k]
 * become 1 for excess / deficit cells. Returns the numbers of excess and deficit cells.
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
  if (total === 0 || area <= 0) {
    scratch.excess.fill(0, 0, m);
    scratch.deficit.fill(0, 0, m);
    return { excess: 0, deficit: 0 };
  }
  const rate = total / area;
  const p = scratch.pValues;
  const upper = criticalUpper(rate, alpha);
  for (let k = 0; k < m; k++) {
    const a = coverage[k]!;
    const o = counts[k]!;
    const mean = rate * a;
    p[k] = (a === 1 ? o >= upper : o > mean) ? poissonUpperTail(o, mean) : 1;
  }
  const excess = benjaminiHochberg(p, m, alpha, scratch.excess, scratch.order);
  const lower = criticalLower(rate, alpha);
  for (let k = 0; k < m; k++) {
    const a = coverage[k]!;
    const o = counts[k]!;
    const mean = rate * a;
    p[k] = (a === 1 ? o <= lower : o < mean) ? poissonLowerTail(o, mean) : 1;
  }
  const deficit = benjaminiHochberg(p, m, alpha, scratch.deficit, scratch.order);
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
