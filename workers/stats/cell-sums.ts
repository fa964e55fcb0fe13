import { chiSquareFromTotals } from './dispersion-chi-square.js';
import type { CountSums } from './moments.js';

/**
 * Every sum one placement's statistics need, read in a single pass over the kept cells (the hot path of a sweep:
 * 200,000 cells a placement at 1e6 points), plus the first cell that is not valid input.
 *
 * Sums: m, N = sum(O_c), sum(O_c^2), sum(a_c), sum(O_c^2 / a_c) and max(O_c), with O_c the count and a_c the
 * coverage of kept cell c. Cost O(m), one pass, no allocation beyond the result.
 * Reference: definitions; see varianceFromSums and chiSquareFromSums for the identities used.
 */
export interface CellSums extends CountSums {
  coverageSum: number;
  /** sum(O_c^2 / a_c) */
  weightedSquares: number;
  largestCount: number;
  /** the first cell whose count is not a non-negative integer or whose coverage is not in (0, 1 + 1e-9]; -1 if none */
  firstInvalid: number;
}

export function cellSums(counts: ArrayLike<number>, coverage: ArrayLike<number>): CellSums {
  let points = 0;
  let sumOfSquares = 0;
  let coverageSum = 0;
  let weightedSquares = 0;
  let largestCount = 0;
  let firstInvalid = -1;
  const cells = counts.length;
  for (let c = 0; c < cells; c++) {
    const x = counts[c]!;
    const a = coverage[c]!;
    // no message building in the loop (it would slow the whole pass): the caller words the error
    if (firstInvalid < 0 && !(x >= 0 && Math.floor(x) === x && x < Number.POSITIVE_INFINITY && a > 0 && a <= 1 + 1e-9)) {
      firstInvalid = c;
    }
    const square = x * x;
    points += x;
    sumOfSquares += square;
    coverageSum += a;
    weightedSquares += square / a; // the order and arithmetic of dispersionChiSquare: bitwise the same chi2
    if (x > largestCount) largestCount = x;
  }
  return { cells, points, sumOfSquares, coverageSum, weightedSquares, largestCount, firstInvalid };
}

/**
 * Sample variance from the sums (Bessel's correction): variance = (sum(x^2) - N^2 / m) / (m - 1). For integer
 * counts sum(x^2) and N are exact in float64 (below 2^53), so only the one division by m rounds. NaN when m < 2.
 * Cost O(1). Reference: the computational form of the variance, e.g. G. W. Snedecor and W. G. Cochran (1989),
 * Statistical Methods, 8th ed., Iowa State University Press.
 */
export function varianceFromSums(sums: CountSums): number {
  if (sums.cells < 2) return Number.NaN;
  return Math.max(0, sums.sumOfSquares - (sums.points * sums.points) / sums.cells) / (sums.cells - 1);
}

/** The area-weighted dispersion chi-square from the sums (chiSquareFromTotals: (A / N) S - N). Cost O(1). */
export function chiSquareFromSums(sums: CellSums): number {
  return chiSquareFromTotals(sums.points, sums.coverageSum, sums.weightedSquares);
}
