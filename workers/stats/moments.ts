/**
 * Sums of one placement's cell counts, shared by the moment and index modules so that the counts are read once.
 * cells = m, points = N = sum(x), sumOfSquares = sum(x^2).
 */
export interface CountSums {
  cells: number;
  points: number;
  sumOfSquares: number;
}

/**
 * Count sums: m, N = sum(x_c), sum(x_c^2). Cost O(m), one pass, no allocation beyond the result.
 * Reference: none needed (definitions).
 */
export function countSums(counts: ArrayLike<number>): CountSums {
  let points = 0;
  let sumOfSquares = 0;
  for (let c = 0; c < counts.length; c++) {
    const x = counts[c]!;
    points += x;
    sumOfSquares += x * x;
  }
  return { cells: counts.length, points, sumOfSquares };
}

/**
 * Mean count per cell: mean = N / m. NaN when m = 0 (undefined). Cost O(m).
 * Reference: definition (arithmetic mean).
 */
export function meanCount(counts: ArrayLike<number>): number {
  let points = 0;
  for (let c = 0; c < counts.length; c++) points += counts[c]!;
  return counts.length === 0 ? Number.NaN : points / counts.length;
}

/**
 * Sample variance of the cell counts (Bessel's correction, divisor m - 1):
 * variance = sum (x_c - mean)^2 / (m - 1), computed in two passes for accuracy. NaN when m < 2 (undefined).
 * Cost O(m).
 * Reference: F. W. Bessel's correction, as in any statistics text, e.g. G. W. Snedecor and W. G. Cochran (1989),
 * Statistical Methods, 8th ed., Iowa State University Press.
 */
export function sampleVariance(counts: ArrayLike<number>): number {
  const m = counts.length;
  if (m < 2) return Number.NaN;
  const mean = meanCount(counts);
  let sumOfSquaredDeviations = 0;
  for (let c = 0; c < m; c++) {
    const deviation = counts[c]! - mean;
    sumOfSquaredDeviations += deviation * deviation;
  }
  return sumOfSquaredDeviations / (m - 1);
}

/**
 * Variance-to-mean ratio (index of dispersion): vmr = variance / mean, with the sample variance (divisor m - 1).
 * About 1 under complete spatial randomness (Poisson counts), above 1 for clustering, below 1 for regularity.
 * NaN when the mean is 0 (no points: undefined) or m < 2. Cost O(m).
 * Reference: R. A. Fisher, H. G. Thornton and W. A. Mackenzie (1922), "The accuracy of the plating method of
 * estimating the density of bacterial populations", Annals of Applied Biology 9:325-359.
 */
export function varianceToMeanRatio(counts: ArrayLike<number>): number {
  const mean = meanCount(counts);
  if (!(mean > 0)) return Number.NaN;
  return sampleVariance(counts) / mean;
}
