/**
 * The placements of a plan as (u, v, angle) triples, placement 0 being the reference placement (offset 0,0,
 * angle 0): the Halton design (bases 2, 3, 5; Halton 1960, Numerische Mathematik 2:84-90) or the regular
 * lattice of workers/random.
 */
import type { Plan } from '../../shared/contracts.js';
import { haltonPlacements, latticePlacements } from '../../workers/random/index.js';
import type { Placement } from '../../workers/types.js';

/**
 * u, v, angle of each placement of the plan, angles spanning `anglePeriod` degrees (the lattice's: 90 for squares,
 * 60 for hexagons). Two shapes get the same design: equal offsets, and angles at the same fraction of their period.
 * Cost O(placements).
 */
export function planPlacements(plan: Plan, anglePeriod = 90): Float64Array {
  const list: readonly Placement[] =
    plan.design === 'lattice'
      ? latticePlacements(plan.placements, plan.rotation, anglePeriod)
      : haltonPlacements(plan.placements, plan.rotation, anglePeriod);
  const triples = new Float64Array(plan.placements * 3);
  for (let j = 0; j < plan.placements; j++) {
    triples[3 * j] = list[j].u;
    triples[3 * j + 1] = list[j].v;
    triples[3 * j + 2] = list[j].angle;
  }
  if (triples[0] !== 0 || triples[1] !== 0 || triples[2] !== 0) {
    throw new Error(`placement design ${plan.design} must start with the reference placement (0, 0, 0)`);
  }
  return triples;
}
