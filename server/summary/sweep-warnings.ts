import type { DatasetSummary, SizeSummary } from '../../shared/contracts.js';
import { RULE_OF_5_EXPECTED } from '../../workers/stats/expected-per-cell.js';
import { cellsLabel, formatShare } from './conclusion.js';

/**
 * Warnings of a sweep in plain words: the dataset's input warnings, a reference (default) grid whose vmr ranks in
 * the 5 % tails of the placements (a default analysis would have been unrepresentative), and cell sizes with
 * fewer than 5 expected points per cell (common practice: the chi-square adequacy rule, NIST e-Handbook 1.3.5.15).
 */
export function sweepWarnings(dataset: DatasetSummary, sizes: readonly SizeSummary[]): string[] {
  const warnings = dataset.warnings.map((warning) => warning.message);
  for (const size of sizes) {
    const label = cellsLabel(size);
    if (size.referenceInTail) {
      const side = size.referenceRank < 0.5 ? 'lower' : 'higher';
      warnings.push(
        `${label}: the reference grid (angle 0, offset 0,0) has vmr ${size.reference.vmr.toPrecision(4)}, ` +
          `${side} than ${formatShare(side === 'lower' ? 1 - size.referenceRank : size.referenceRank)} of placements; ` +
          'a default grid would have given an unrepresentative answer',
      );
    }
    if (size.expectedPerCell < RULE_OF_5_EXPECTED) {
      warnings.push(
        `${label}: ${size.expectedPerCell.toPrecision(3)} expected points per cell, fewer than ${RULE_OF_5_EXPECTED} ` +
          '(common practice); the chi-square p-values of single placements are approximate, prefer the Monte Carlo p-values',
      );
    }
  }
  return warnings;
}
