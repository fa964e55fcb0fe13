/**
 * Excess and deficit cells of one placement: each kept cell c is tested one-sided against its expected count
 * E_c = N a_c / sum(a) (N points in the kept cells, a_c the coverage, or the weight w_c against baseline polygons,
 * issue 15, workers/sweep/evaluate-chunk.ts; shared/design.md), with exact Poisson tails
 *   excess p-value  p+_c = P(X >= O_c),  deficit p-value  p-_c = P(X <= O_c),  X ~ Poisson(E_c),
 * and the multiplicity across the placement's m kept cells controlled by Benjamini-Hochberg at alpha, separately for
 * the excess family and the deficit family (workers/stability/benjamini-hochberg.ts).
 * Cost O(m) plus a few tail evaluations, in two steps per family. First, one pass finds the n cells whose p-value is
 * at most alpha: a whole cell (coverage 1) when its count reaches the critical count of level alpha, a partial cell
 * when its exact p-value (computed for counts on the tested side of its mean) is at most alpha. Second, the step-up
 * rejects the k smallest p-values with p_(k) <= k alpha / m and k <= n, so every rejected p-value is at most
 * t = n alpha / m: only the cells with p <= t (whole cells from the critical count of level t) get an exact p-value
 * and enter the step-up, with the family size m. They are the smallest p-values of the family, so their ranks and
 * the rejections are those of the step-up over all m p-values; under the null t is about alpha^2 and the candidates
 * are few (measured: the flags of the simulated patterns were a quarter of the workers' time before).
 */
import { poissonLowerTail, poissonUpperTail } from '../stats/poisson-tails.js';
import type { ExtremeCells } from '../stats/dispersion-chi-square.js';
import { benjaminiHochberg } from './benjamini-hochberg.js';

/** Reusable buffers of flagCells; after a call, excess[0 .. excessCount-1] lists the excess cells (kept order). */
export interface CellFlagScratch {
  /** cells of the first step per family (kept order) and their p-values (NaN for whole cells, not computed) */
  above: Int32Array;
  aboveP: Float64Array;
  below: Int32Array;
  belowP: Float64Array;
  candidates: Int32Array;
  pValues: Float64Array;
  order: Uint32Array;
  reject: Uint8Array;
  excess: Int32Array;
  deficit: Int32Array;
}

export function createCellFlagScratch(): CellFlagScratch {
  return { above: new Int32Array(0), aboveP: new Float64Array(0), below: new Int32Array(0), belowP: new Float64Array(0), candidates: new Int32Array(0), pValues: new Float64Array(0), order: new Uint32Array(0), reject: new Uint8Array(0), excess: new Int32Array(0), deficit: new Int32Array(0) };
}

function ensure(scratch: CellFlagScratch, m: number): void {
  if (scratch.candidates.length >= m) return;
  scratch.above = new Int32Array(m);
  scratch.aboveP = new Float64Array(m);
  scratch.below = new Int32Array(m);
  scratch.belowP = new Float64Array(m);
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
 * What flagCells needs of the coverages (or weights), the same for every pattern tested on them: their sum in kept
 * order, and the smallest and largest (1 when none is below, or above, 1).
 */
export interface WeightSummary {
  area: number;
  leastPartial: number;
  greatestPartial: number;
}

/** The WeightSummary of coverages or weights in kept order. Cost O(m). */
export function summarizeWeights(coverage: Float64Array): WeightSummary {
  let area = 0;
  let leastPartial = 1;
  let greatestPartial = 1;
  for (let k = 0; k < coverage.length; k++) {
    const a = coverage[k]!;
    area += a;
    if (a < leastPartial) leastPartial = a;
    if (a > greatestPartial) greatestPartial = a;
  }
  return { area, leastPartial, greatestPartial };
}

/**
 * The points in the kept cells (sum of the counts) and the coverages' summary, when the caller has them already;
 * `extremes`: the cells listed while the counts were read (stats gatheredDispersionChiSquare), which spare the pass
 * over every cell when they hold every cell the first step can take: whole cells with counts from `from` up or up to
 * `to` (from <= the critical count above, to >= the one below), and every partial cell. Otherwise the pass runs.
 */
export interface KnownSums {
  total: number;
  weights: WeightSummary;
  extremes?: ExtremeCells;
}

/**
 * Flags the kept cells (counts and coverages in kept order, m = counts.length). Returns the numbers of excess and
 * deficit cells, listed (kept indices, increasing) in scratch.excess and scratch.deficit. `known` saves the first
 * pass over the cells (a placement's simulated patterns share its coverages, and their totals come with their
 * chi-square); it must hold exactly the sums of these counts and coverages (the sum of the counts is exact in any
 * order, the coverages' sum is taken in kept order by summarizeWeights as here).
 */
export function flagCells(counts: ArrayLike<number>, coverage: Float64Array, alpha: number, scratch: CellFlagScratch, known?: KnownSums): { excess: number; deficit: number } {
  const m = counts.length;
  ensure(scratch, m);
  let total = 0;
  let weights: WeightSummary;
  if (known === undefined) {
    for (let k = 0; k < m; k++) total += counts[k]!;
    weights = summarizeWeights(coverage);
  } else {
    total = known.total;
    weights = known.weights;
  }
  const { area, leastPartial, greatestPartial } = weights;
  if (total === 0 || area <= 0) return { excess: 0, deficit: 0 };
  const rate = total / area;
  const { above, aboveP, below, belowP } = scratch;
  const upper = criticalUpper(rate, alpha);
  const lower = criticalLower(rate, alpha);
  // other cells: P(X >= o) grows and P(X <= o) shrinks with the mean, and a cell's mean lies between
  // rate x leastPartial and rate x greatestPartial (weights above 1 come from a baseline, issue 15), so only counts
  // from the critical count of the smallest mean up, or up to the critical count of the largest mean, can have
  // p <= alpha; their exact p-values are computed, the others skipped
  const upperPartial = leastPartial < 1 ? criticalUpper(rate * leastPartial, alpha) : upper;
  const lowerPartial = greatestPartial > 1 ? criticalLower(rate * greatestPartial, alpha) : lower;
  let nAbove = 0;
  let nBelow = 0;
  const extremes = known?.extremes;
  const listed = extremes !== undefined && extremes.from <= upper && extremes.to >= lower ? extremes.cells : null;
  const visits = listed === null ? m : extremes!.count;
  for (let t = 0; t < visits; t++) {
    const k = listed === null ? t : listed[t]!;
    const a = coverage[k]!;
    const o = counts[k]!;
    if (a === 1) {
      if (o >= upper) {
        aboveP[nAbove] = Number.NaN;
        above[nAbove++] = k;
      } else if (o <= lower) {
        belowP[nBelow] = Number.NaN;
        below[nBelow++] = k;
      }
      continue;
    }
    if (o < upperPartial && o > lowerPartial) continue;
    const mean = rate * a;
    if (o > mean) {
      const p = poissonUpperTail(o, mean);
      if (p <= alpha) {
        aboveP[nAbove] = p;
        above[nAbove++] = k;
      }
    } else if (o < mean) {
      const p = poissonLowerTail(o, mean);
      if (p <= alpha) {
        belowP[nBelow] = p;
        below[nBelow++] = k;
      }
    }
  }
  const excess = rejectFamily(scratch, counts, coverage, rate, above, aboveP, nAbove, m, alpha, 'excess');
  const deficit = rejectFamily(scratch, counts, coverage, rate, below, belowP, nBelow, m, alpha, 'deficit');
  return { excess, deficit };
}

/**
 * The second step for one family (file comment): of the n cells with p <= alpha, those with p <= n alpha / m enter
 * the step-up with family m; the rejected cells go to scratch.excess or scratch.deficit. Returns their number.
 */
function rejectFamily(
  scratch: CellFlagScratch,
  counts: ArrayLike<number>,
  coverage: Float64Array,
  rate: number,
  cells: Int32Array,
  known: Float64Array,
  n: number,
  m: number,
  alpha: number,
  family: 'excess' | 'deficit',
): number {
  if (n === 0) return 0;
  const level = (n * alpha) / m;
  const upperTail = family === 'excess';
  const critical = upperTail ? criticalUpper(rate, level) : criticalLower(rate, level);
  const { candidates, pValues } = scratch;
  let count = 0;
  for (let t = 0; t < n; t++) {
    const k = cells[t]!;
    let p = known[t]!;
    if (Number.isNaN(p)) {
      // a whole cell: past the critical count of the level, or not a candidate
      const o = counts[k]!;
      if (upperTail ? o < critical : o > critical) continue;
      p = upperTail ? poissonUpperTail(o, rate) : poissonLowerTail(o, rate);
    }
    if (p <= level) {
      candidates[count] = k;
      pValues[count++] = p;
    }
  }
  return stepUp(scratch, count, m, alpha, upperTail ? scratch.excess : scratch.deficit);
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
