/**
 * Patterns under the baseline's null for the Monte Carlo reference (issue 15), drawn with the engine's seeded
 * generator so that pattern r is the same whatever thread draws it.
 *
 * - polygons: n points, each independently in piece p (p ∩ V) with probability P_p / Σ P, uniform within the piece
 *   (the exact CSR sampler of workers/random on the piece): an inhomogeneous Poisson process given n whose
 *   intensity is P_p / |p ∩ V| on p ∩ V, the null the areal-weighting expected counts describe.
 * - controls: random labelling: from the pooled cases and controls inside V, n drawn without replacement (partial
 *   Fisher-Yates shuffle) are the simulated cases.
 * Reference: P. J. Diggle (2003), Statistical Analysis of Spatial Point Patterns, 2nd ed., Arnold, and
 * P. J. Diggle (2014), Statistical Analysis of Spatial and Spatio-Temporal Point Patterns, 3rd ed., CRC Press
 * (random labelling; conditional simulation given n); R. A. Fisher and F. Yates (1938) / R. Durstenfeld (1964),
 * CACM 7:420 (the shuffle).
 * Cost: polygons O(n log pieces) plus the CSR samplers' O(n); controls O(n) after an O(cases + controls) pool.
 */
import { createCsrSampler, type CsrSampler } from '../random/csr-sampler.js';
import type { RandomSource } from '../types.js';
import type { PolygonBaseline } from './baseline.js';

export interface PatternSampler {
  /** n points of the null pattern, flat x0, y0, x1, y1, ... (planar metres). */
  sample(n: number, random: RandomSource): Float64Array;
}

function checkCount(n: number): void {
  if (!Number.isSafeInteger(n) || n < 0) throw new RangeError(`number of points must be a non-negative integer, got ${n}`);
}

/** n points distributed over the pieces in proportion to their counts, uniform within each piece. */
export function createPolygonSampler(baseline: PolygonBaseline): PatternSampler {
  const used: number[] = [];
  baseline.counts.forEach((count, p) => {
    if (count > 0 && baseline.pieces[p]!.area > 0) used.push(p);
  });
  if (used.length === 0) throw new RangeError('the baseline has no positive count inside the valid region');
  const cumulative = new Float64Array(used.length);
  let total = 0;
  used.forEach((p, k) => {
    total += baseline.counts[p]!;
    cumulative[k] = total;
  });
  const samplers = new Map<number, CsrSampler>();
  const samplerOf = (k: number): CsrSampler => {
    let sampler = samplers.get(k);
    if (sampler === undefined) {
      sampler = createCsrSampler(baseline.pieces[used[k]!]!);
      samplers.set(k, sampler);
    }
    return sampler;
  };
  return {
    sample(n, random) {
      checkCount(n);
      const perPiece = new Int32Array(used.length);
      for (let point = 0; point < n; point++) {
        const target = random() * total;
        let lo = 0;
        let hi = used.length - 1;
        while (lo < hi) {
          const mid = (lo + hi) >> 1;
          if (cumulative[mid]! > target) hi = mid;
          else lo = mid + 1;
        }
        perPiece[lo]++;
      }
      const xy = new Float64Array(2 * n);
      let at = 0;
      for (let k = 0; k < used.length; k++) {
        if (perPiece[k] === 0) continue;
        xy.set(samplerOf(k).sample(perPiece[k]!, random), at);
        at += 2 * perPiece[k]!;
      }
      return xy;
    },
  };
}

/** Random labelling of the pooled cases and controls (both inside V, flat x, y). */
export function createLabellingSampler(cases: Float64Array, controls: Float64Array): PatternSampler {
  const pool = new Float64Array(cases.length + controls.length);
  pool.set(cases, 0);
  pool.set(controls, cases.length);
  const size = pool.length / 2;
  return {
    sample(n, random) {
      checkCount(n);
      if (n > size) throw new RangeError(`cannot label ${n} cases in a pool of ${size} points`);
      const order = new Int32Array(size);
      for (let k = 0; k < size; k++) order[k] = k;
      const xy = new Float64Array(2 * n);
      for (let k = 0; k < n; k++) {
        const pick = k + Math.floor(random() * (size - k));
        const chosen = order[pick]!;
        order[pick] = order[k]!;
        order[k] = chosen;
        xy[2 * k] = pool[2 * chosen]!;
        xy[2 * k + 1] = pool[2 * chosen + 1]!;
      }
      return xy;
    },
  };
}
