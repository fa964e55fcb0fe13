/** Whether a sweep's conclusion depends on the cells' shape (issue 16): shared by the conclusion, the page and the report. */
import type { SizeSummary } from './contracts.js';
import { formatMetres } from './format.js';
import { verdictWords } from './verdict-words.js';
import type { Verdict } from '../workers/types.js';

/** The shapes of a sweep's size entries, in order of first appearance (entries without one are squares). */
export function shapesOf(sizes: readonly Pick<SizeSummary, 'shape'>[]): string[] {
  return [...new Set(sizes.map((size) => size.shape ?? 'square'))];
}

/**
 * The one sentence on whether the conclusion depends on the cells' shape: at each cell side, the most common verdict
 * of the placements with squares against that with hexagons (a description of the placements, not a test; the
 * tests are the per-size Monte Carlo p-values and the overall test).
 */
export function shapeSentence(sizes: readonly Omit<SizeSummary, 'conclusion'>[]): string {
  const bySide = new Map<number, Map<string, Verdict>>();
  for (const size of sizes) {
    const entry = bySide.get(size.cellSize) ?? new Map<string, Verdict>();
    entry.set(size.shape ?? 'square', size.mostCommon);
    bySide.set(size.cellSize, entry);
  }
  const compared = [...bySide.entries()].filter(([, verdicts]) => verdicts.size > 1);
  const differing = compared.filter(([, verdicts]) => new Set(verdicts.values()).size > 1);
  if (differing.length === 0) {
    return `The conclusion does not depend on the cell shape: at ${compared.length === 1 ? 'the 1 cell size' : `all ${compared.length} cell sizes`} squares and hexagons give the same most common verdict`;
  }
  const details = differing
    .sort(([a], [b]) => a - b)
    .map(([side, verdicts]) => `${formatMetres(side, { significant: 4 })}: ${[...verdicts.entries()].map(([shape, verdict]) => `${shape === 'hex' ? 'hexagons' : 'squares'} ${verdictWords(verdict, 'short')}`).join(', ')}`);
  return `The conclusion depends on the cell shape at ${differing.length} of ${compared.length} cell sizes, where squares and hexagons give different most common verdicts (${details.join('; ')})`;
}
