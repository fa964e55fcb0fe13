import type { MonteCarloResult, PlacementRow, SizeSummary } from '../../shared/contracts.js';
import { sizeConclusion } from './conclusion.js';
import { quantiles, median } from './quantiles.js';
import { extremeIndices, referenceRank } from './reference-rank.js';
import { verdictShares } from './verdict-shares.js';
import { withLogPValues } from './log-p-values.js';

/**
 * Summary of one cell size from its placement rows (placement 0 is the reference placement, angle 0, offset 0,0):
 * type 7 quantiles of vmr and chi2/df, verdict shares and agreement, the reference row and its mid-rank among
 * the placements' vmr (in the tail below 5 % or above 95 %), the rows of lowest and highest vmr, the Monte Carlo
 * result (or null without sims) and a plain-words conclusion. Cost O(P log P).
 * @throws Error when rows is empty or has no reference placement (a programming error, not a user error)
 */
export function summarizeSize(rows: readonly PlacementRow[], monteCarlo: MonteCarloResult | null): SizeSummary {
  if (rows.length === 0) throw new Error('summarizeSize needs at least one placement row');
  const referenceIndex = rows.findIndex((row) => row.placementIndex === 0);
  if (referenceIndex < 0) throw new Error('summarizeSize needs the reference placement (placementIndex 0)');
  const vmr = rows.map((row) => row.vmr);
  const shares = verdictShares(rows.map((row) => row.verdict));
  const rank = referenceRank(vmr, referenceIndex);
  const extremes = extremeIndices(vmr);
  const summary: Omit<SizeSummary, 'conclusion'> = {
    sizeIndex: rows[0].sizeIndex,
    cellSize: rows[0].cellSize,
    shape: rows[0].shape ?? 'square',
    expectedPerCell: median(rows.map((row) => row.expectedPerCell)),
    placements: rows.length,
    vmr: quantiles(vmr),
    chi2PerDf: quantiles(rows.map((row) => row.chi2PerDf)),
    verdictShares: shares.shares,
    mostCommon: shares.mostCommon,
    agreement: shares.agreement,
    reference: withLogPValues(rows[referenceIndex]),
    referenceRank: rank.rank,
    referenceInTail: rank.inTail,
    lowestVmr: withLogPValues(rows[extremes.lowest < 0 ? referenceIndex : extremes.lowest]),
    highestVmr: withLogPValues(rows[extremes.highest < 0 ? referenceIndex : extremes.highest]),
    monteCarlo,
  };
  return { ...summary, conclusion: sizeConclusion(summary) };
}
