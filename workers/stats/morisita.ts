import type { CountSums } from './moments.js';

/**
 * Morisita's index of dispersion.
 *
 * Formula: I = m * sum x_c (x_c - 1) / (N (N - 1)) = m * (sum x^2 - N) / (N (N - 1)), with m cells and N points.
 * I = 1 for random, > 1 for clumped, < 1 for even patterns; I = m when all points share one cell.
 * Identity: I * (N - 1) + m - N = X^2, the index-of-dispersion chi-square with whole cells.
 * NaN (undefined) when N < 2.
 *
 * Cost: O(1) given the count sums (O(m) to form them).
 *
 * Reference: M. Morisita (1959), "Measuring of the dispersion of individuals and analysis of the distributional
 * patterns", Memoirs of the Faculty of Science, Kyushu University, Series E (Biology) 2:215-235.
 */
export function morisitaIndex(sums: CountSums): number {
  const { cells, points, sumOfSquares } = sums;
  if (points < 2) return Number.NaN;
  return (cells * (sumOfSquares - points)) / (points * (points - 1));
}
