/**
 * The one place verdicts become words, for the page, the charts, the report and the conclusions. 'explained' (the
 * default) tells a lay reader what "regular" means; 'short' is for sentences that list several verdicts.
 */
import type { Verdict } from '../workers/types.js';

const WORDS: Record<Verdict, { short: string; explained: string }> = {
  clustered: { short: 'clustered', explained: 'clustered' },
  regular: { short: 'regular', explained: 'regular (more even than random)' },
  csr: { short: 'no departure from CSR', explained: 'no departure from CSR' },
};

/** Plain words for a verdict: "clustered", "regular (more even than random)" ("regular" when short), "no departure from CSR". */
export function verdictWords(verdict: Verdict, style: 'explained' | 'short' = 'explained'): string {
  return WORDS[verdict][style];
}
