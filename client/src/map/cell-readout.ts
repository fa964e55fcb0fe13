/**
 * What the map says about one cell: count, coverage, expected count, residual and verdict.
 * Residual: the Pearson residual (O − E) / sqrt(E), the signed square root of the cell's term in the placement's
 * chi-square (Agresti A., 2002, Categorical Data Analysis, 2nd ed., Wiley, section 3.3.1). Verdict: the cell's own
 * verdict when the server's grid carries one (property `verdict`), otherwise the verdict of the whole placement,
 * labelled as such; a left-out cell has none.
 */
import type { GridFeature } from '../api/api-client.js';
import { formatNumber } from '../../../shared/format.js';
import { verdictWords } from '../../../shared/verdict-words.js';
import type { Verdict } from '../../../workers/types.js';

export function pearsonResidual(count: number, expected: number | null): number {
  return expected !== null && expected > 0 ? (count - expected) / Math.sqrt(expected) : Number.NaN;
}

export interface CellLine {
  name: string;
  value: string;
}

export function cellLines(cell: GridFeature, placementVerdict: Verdict | null): CellLine[] {
  const { i, j, count, coverage, expected, kept } = cell.properties;
  const own = (cell.properties as { verdict?: unknown }).verdict;
  const verdict = !kept
    ? { name: 'verdict', value: 'left out (coverage below minCoverage): not tested' }
    : typeof own === 'string'
      ? { name: 'verdict', value: own }
      : { name: 'verdict of the placement', value: placementVerdict ? verdictWords(placementVerdict) : '-' };
  return [
    { name: 'cell', value: `(${i}, ${j})` },
    { name: 'count', value: String(count) },
    { name: 'coverage', value: formatNumber(coverage, 4) },
    { name: 'expected count', value: formatNumber(expected) },
    { name: 'residual (O - E) / sqrt(E)', value: formatNumber(pearsonResidual(count, expected)) },
    verdict,
  ];
}
