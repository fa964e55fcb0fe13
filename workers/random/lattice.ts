/**
 * Regular lattice placements: a product grid of offsets u = a/nu, v = b/nv (and, with rotation, angles
 * 90 c/na degrees) whose sizes multiply to exactly `count`, chosen as balanced as the count's divisors allow
 * (smallest largest/smallest ratio). Placement 0 is the reference (0, 0, 0). Counts with balanced divisors (squares,
 * powers of two) give square lattices; a prime count gives a single row of offsets.
 * Cost O(count + sqrt(count) * divisors).
 */
import type { Placement } from '../types.js';
import { checkPlacementCount } from './halton.js';

function divisors(value: number): number[] {
  const small: number[] = [];
  const large: number[] = [];
  for (let d = 1; d * d <= value; d++) {
    if (value % d === 0) {
      small.push(d);
      if (d * d !== value) large.unshift(value / d);
    }
  }
  return [...small, ...large];
}

/** Two factors a <= b with a * b = value and a the largest divisor up to sqrt(value). */
function balancedPair(value: number): [number, number] {
  let best = 1;
  for (const d of divisors(value)) if (d * d <= value) best = d;
  return [best, value / best];
}

/** Factor sizes [nu, nv, na] (na = 1 without rotation), product exactly count. */
export function latticeShape(count: number, rotation: boolean): [number, number, number] {
  checkPlacementCount(count);
  if (!rotation) {
    const [a, b] = balancedPair(count);
    return [b, a, 1];
  }
  let best: [number, number, number] = [count, 1, 1];
  let bestRatio = Infinity;
  for (const angleCount of divisors(count)) {
    const [a, b] = balancedPair(count / angleCount);
    const ratio = Math.max(a, b, angleCount) / Math.min(a, b, angleCount);
    // prefer equal offset factors, then the most balanced shape
    if (ratio < bestRatio - 1e-12 || (Math.abs(ratio - bestRatio) <= 1e-12 && a === b)) {
      best = [b, a, angleCount];
      bestRatio = ratio;
    }
  }
  return best;
}

/**
 * `count` placements on a regular lattice over offsets (and angles over the cell lattice's period, 90 degrees for
 * squares, 60 for hexagons); placement 0 is the reference.
 */
export function latticePlacements(count: number, rotation: boolean, anglePeriod = 90): Placement[] {
  const [nu, nv, na] = latticeShape(count, rotation);
  const placements: Placement[] = [];
  for (let c = 0; c < na; c++) {
    for (let b = 0; b < nv; b++) {
      for (let a = 0; a < nu; a++) placements.push({ u: a / nu, v: b / nv, angle: (anglePeriod * c) / na });
    }
  }
  return placements;
}
