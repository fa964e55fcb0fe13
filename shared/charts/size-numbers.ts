import type { SizeSummary } from '../contracts.js';
import { formatMetres, formatNumber, formatP, formatPercent, pPhrase } from '../format.js';
import { verdictWords } from '../verdict-words.js';

/** The numbers behind a cell size's conclusion, as one plain sentence each. */
export function sizeNumbers(size: SizeSummary): string[] {
  const spread = size.chi2PerDf;
  const shares = size.verdictShares;
  const lines = [
    `Cell side ${formatMetres(size.cellSize)}, about ${formatNumber(size.expectedPerCell)} expected points per whole cell, ${size.placements} placements.`,
    `Chi-square / df: median ${formatNumber(spread.p50)}, 5-95 % of placements ${formatNumber(spread.p5)} to ${formatNumber(spread.p95)}.`,
    `Verdicts: ${formatPercent(shares.clustered)} clustered, ${formatPercent(shares.csr)} no departure from CSR, ${formatPercent(shares.regular)} regular; agreement ${formatPercent(size.agreement)}.`,
    `Reference grid: VMR ${formatNumber(size.reference.vmr)}, verdict ${verdictWords(size.reference.verdict)}, ${formatPercent(size.referenceRank)} of placements have a lower VMR${size.referenceInTail ? ' (in the tail: the default grid is not typical)' : ''}.`,
  ];
  const monteCarlo = size.monteCarlo;
  if (monteCarlo && monteCarlo.sims > 0) {
    lines.push(
      `Monte Carlo (${monteCarlo.sims} CSR patterns): ${pPhrase(monteCarlo.pMedianClustered)} for clustering and ${formatP(monteCarlo.pMedianRegular)} for regularity on the median; ${pPhrase(monteCarlo.pMaxClustered)} on the maximum.`,
    );
  }
  return lines;
}
