/**
 * Green's coefficient of dispersion.
 *
 * Formula: C = (vmr - 1) / (N - 1), with N the number of points: 0 for random, 1 for maximal clumping (all
 * points in one cell), negative for even patterns (down to -1/(N - 1) when every cell holds the same count).
 * NaN (undefined) when N < 2 or vmr is undefined.
 *
 * Cost: O(1) given vmr and N.
 *
 * Reference: R. H. Green (1966), "Measurement of non-randomness in spatial distributions", Researches on
 * Population Ecology 8:1-7 (from memory).
 */
export function greenIndex(vmr: number, points: number): number {
  if (!(points >= 2)) return Number.NaN;
  return (vmr - 1) / (points - 1);
}
