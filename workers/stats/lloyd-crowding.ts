/**
 * Lloyd's mean crowding and patchiness.
 *
 * Formula: mean crowding m* = mean + (variance / mean - 1) = mean + vmr - 1 (the mean number of other points
 * sharing a point's cell); patchiness = m* / mean (1 under Poisson counts, > 1 for patchy patterns).
 * Both NaN (undefined) when the mean is 0.
 *
 * Cost: O(1) given mean and vmr.
 *
 * Reference: M. Lloyd (1967), "'Mean crowding'", Journal of Animal Ecology 36:1-30.
 */
export interface LloydCrowding {
  meanCrowding: number;
  patchiness: number;
}

export function lloydCrowding(mean: number, vmr: number): LloydCrowding {
  if (!(mean > 0)) return { meanCrowding: Number.NaN, patchiness: Number.NaN };
  const meanCrowding = mean + vmr - 1;
  return { meanCrowding, patchiness: meanCrowding / mean };
}
