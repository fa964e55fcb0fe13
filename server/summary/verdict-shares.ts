import type { Verdict } from '../../workers/types.js';

export interface VerdictShares {
  shares: Record<Verdict, number>;
  mostCommon: Verdict;
  /** share of placements whose verdict equals the most common verdict */
  agreement: number;
}

const ORDER: readonly Verdict[] = ['clustered', 'regular', 'csr'];

/**
 * Shares of the verdicts clustered / regular / csr among placements, the most common verdict and the agreement
 * (share of placements whose verdict equals the most common one; shared/design.md, "Vocabulary").
 * Ties between verdicts go to the first of clustered, regular, csr. Cost O(n).
 */
export function verdictShares(verdicts: readonly Verdict[]): VerdictShares {
  const tally: Record<Verdict, number> = { clustered: 0, regular: 0, csr: 0 };
  for (const verdict of verdicts) tally[verdict] += 1;
  const total = verdicts.length;
  let mostCommon: Verdict = 'csr';
  let best = -1;
  for (const verdict of ORDER) {
    if (tally[verdict] > best) {
      best = tally[verdict];
      mostCommon = verdict;
    }
  }
  const share = (count: number): number => (total === 0 ? Number.NaN : count / total);
  return {
    shares: { clustered: share(tally.clustered), regular: share(tally.regular), csr: share(tally.csr) },
    mostCommon,
    agreement: share(best),
  };
}
