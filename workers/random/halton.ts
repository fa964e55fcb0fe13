/**
 * Low-discrepancy placements: the Halton sequence (J. H. Halton 1960, "On the efficiency of certain quasi-random
 * sequences of points in evaluating multi-dimensional integrals", Numerische Mathematik 2:84-90).
 * Radical inverse in base b: index k = sum d_i b^i -> sum d_i b^-(i+1), computed as one integer ratio so that
 * the value is correctly rounded. Point k = (h2(k), h3(k), h5(k)) gives offset (h2, h3) and angle 90 h5 degrees
 * (angle 0 without rotation); k = 0 is the reference placement (0, 0, 0).
 * Cost O(log_b k) per value.
 */
import type { Placement } from '../types.js';

/** Radical inverse of a non-negative integer index in an integer base >= 2. */
export function halton(index: number, base: number): number {
  if (!Number.isSafeInteger(index) || index < 0) throw new RangeError(`halton index must be a non-negative integer, got ${index}`);
  if (!Number.isInteger(base) || base < 2) throw new RangeError(`halton base must be an integer >= 2, got ${base}`);
  let numerator = 0;
  let denominator = 1;
  let rest = index;
  while (rest > 0) {
    const digit = rest % base;
    rest = (rest - digit) / base;
    numerator = numerator * base + digit;
    denominator *= base;
  }
  return numerator / denominator;
}

export function checkPlacementCount(count: number): void {
  if (!Number.isSafeInteger(count) || count < 1) {
    throw new RangeError(`placement count must be a positive integer, got ${count}`);
  }
}

/**
 * The first `count` Halton placements; placement 0 is the reference placement. Angles span the lattice's period
 * (workers/lattice: 90 degrees for squares, 60 for hexagons), so two shapes share one design.
 */
export function haltonPlacements(count: number, rotation: boolean, anglePeriod = 90): Placement[] {
  checkPlacementCount(count);
  const placements: Placement[] = [];
  for (let k = 0; k < count; k++) {
    placements.push({ u: halton(k, 2), v: halton(k, 3), angle: rotation ? anglePeriod * halton(k, 5) : 0 });
  }
  return placements;
}
