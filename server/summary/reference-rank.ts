/** The reference placement counts as "in the tail" when its rank is below this share or above 1 minus it. */
export const REFERENCE_TAIL_SHARE = 0.05;

export interface ReferenceRank {
  /** share of the other placements whose value is below the reference's, ties counted half (0..1) */
  rank: number;
  inTail: boolean;
}

/**
 * Where the reference placement's value ranks among the other placements: mid-rank share
 * rank = (#{j != ref: x_j < x_ref} + 0.5 * #{j != ref: x_j = x_ref}) / (number of other finite values);
 * 0.5 when there is no other placement or the reference value is not finite. In the tail when
 * rank < 0.05 or rank > 0.95 (common practice: the 5 % tails of an empirical distribution). Cost O(n).
 *
 * Reference: mid-ranks for ties as in W. H. Kruskal and W. A. Wallis (1952), "Use of ranks in one-criterion
 * variance analysis", JASA 47:583-621.
 */
export function referenceRank(values: ArrayLike<number>, referenceIndex: number): ReferenceRank {
  const reference = values[referenceIndex];
  if (!Number.isFinite(reference)) return { rank: 0.5, inTail: false };
  let below = 0;
  let equal = 0;
  let others = 0;
  for (let index = 0; index < values.length; index++) {
    const value = values[index];
    if (index === referenceIndex || !Number.isFinite(value)) continue;
    others += 1;
    if (value < reference) below += 1;
    else if (value === reference) equal += 1;
  }
  if (others === 0) return { rank: 0.5, inTail: false };
  const rank = (below + 0.5 * equal) / others;
  return { rank, inTail: rank < REFERENCE_TAIL_SHARE || rank > 1 - REFERENCE_TAIL_SHARE };
}

/**
 * Indices of the lowest and highest finite values (first occurrence on ties); -1 when none is finite. Cost O(n).
 */
export function extremeIndices(values: ArrayLike<number>): { lowest: number; highest: number } {
  let lowest = -1;
  let highest = -1;
  for (let index = 0; index < values.length; index++) {
    const value = values[index];
    if (!Number.isFinite(value)) continue;
    if (lowest < 0 || value < values[lowest]) lowest = index;
    if (highest < 0 || value > values[highest]) highest = index;
  }
  return { lowest, highest };
}
