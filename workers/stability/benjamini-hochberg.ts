/**
 * The Benjamini-Hochberg step-up procedure: with the m p-values sorted p_(1) <= ... <= p_(m), reject the hypotheses
 * of the k smallest, k = max{ i : p_(i) <= i alpha / m } (none when no i qualifies). It controls the false discovery
 * rate at alpha for independent (and positively dependent) tests, and the family-wise error at alpha when every
 * hypothesis is true.
 * Reference: Y. Benjamini and Y. Hochberg (1995), "Controlling the false discovery rate: a practical and powerful
 * approach to multiple testing", Journal of the Royal Statistical Society B 57:289-300.
 * Cost O(m log m) (one sort of the indices); 0 rejections cost O(m) when no p-value is below alpha.
 */

/**
 * Sets reject[i] = 1 for the rejected hypotheses (0 otherwise) among pValues[0 .. m-1]; returns the number rejected.
 * `order` is optional scratch of length >= m. `family` (default m) is the number of hypotheses tested when only the
 * m p-values that can be rejected are given (every other p-value of the family above alpha ranks after them and is
 * never rejected, so the step-up over the given ones with thresholds i alpha / family is the same procedure).
 */
export function benjaminiHochberg(pValues: Float64Array, m: number, alpha: number, reject: Uint8Array, order?: Uint32Array, family: number = m): number {
  reject.fill(0, 0, m);
  // nothing can pass when even the smallest p-value exceeds alpha (the largest threshold, i = m)
  let candidates = 0;
  for (let i = 0; i < m; i++) if (pValues[i]! <= alpha) candidates += 1;
  if (candidates === 0) return 0;
  const index = order !== undefined && order.length >= m ? order.subarray(0, m) : new Uint32Array(m);
  // only p-values <= alpha can be rejected: sort those
  let n = 0;
  for (let i = 0; i < m; i++) if (pValues[i]! <= alpha) index[n++] = i;
  const sorted = index.subarray(0, n).sort((a, b) => pValues[a]! - pValues[b]!);
  let k = 0;
  for (let rank = n; rank >= 1; rank--) {
    if (pValues[sorted[rank - 1]!]! <= (rank * alpha) / family) {
      k = rank;
      break;
    }
  }
  for (let r = 0; r < k; r++) reject[sorted[r]!] = 1;
  return k;
}
