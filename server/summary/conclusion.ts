import type { BaselineInfo, MonteCarloResult, OverallTest, SizeSummary } from '../contracts.js';
import { beyondNull, nullName } from './null-hypothesis.js';
import { formatPValue, pPhrase } from '../../shared/p-value.js';
import type { Verdict } from '../../workers/types.js';

/** Agreement below this share means the verdict depends on where the grid falls (our choice, stated in the text). */
export const LOW_AGREEMENT = 0.9;

const VERDICT_WORDS: Record<Verdict, string> = {
  clustered: 'clustered',
  regular: 'regular',
  csr: 'no departure from CSR',
};

/** The verdict words against a baseline: the null is named (issue 15); area mode keeps VERDICT_WORDS. */
function verdictWords(baseline: BaselineInfo | undefined): Record<Verdict, string> {
  if (baseline === undefined) return VERDICT_WORDS;
  return { clustered: 'clustered beyond the baseline', regular: 'more even than the baseline', csr: 'no departure from the baseline' };
}

/** A share 0..1 as a whole percentage that never rounds a partial share to 0 % or 100 %. */
export function formatShare(share: number): string {
  if (!Number.isFinite(share)) return 'n/a';
  if (share === 0 || share === 1) return `${share * 100} %`;
  const percent = Math.min(99, Math.max(1, Math.round(share * 100)));
  return `${percent} %`;
}

/** A p-value for text (shared/p-value.ts: "< 1e-300" below the smallest double, never "0"). */
export function formatP(p: number): string {
  return formatPValue(p);
}

/** A length in metres with at most 4 significant digits. */
export function formatMetres(metres: number): string {
  return String(Number(metres.toPrecision(4)));
}

/**
 * How a size's cells are named in sentences: "120 m cells" for squares (as before shapes existed), "120 m hexagonal
 * cells" for hexagons of area 120^2 m^2.
 */
export function cellsLabel(size: Pick<SizeSummary, 'cellSize' | 'shape'>): string {
  return `${formatMetres(size.cellSize)} m ${size.shape === 'hex' ? 'hexagonal ' : ''}cells`;
}

function monteCarloWords(verdict: Verdict, monteCarlo: MonteCarloResult): string {
  const sims = `R = ${monteCarlo.sims}, this size only`;
  if (verdict === 'regular') {
    return `Monte Carlo p = ${formatP(monteCarlo.pMedianRegular)} on the median chi2/df, ${formatP(monteCarlo.pMinRegular)} on the minimum (${sims})`;
  }
  if (verdict === 'clustered') {
    return `Monte Carlo p = ${formatP(monteCarlo.pMedianClustered)} on the median chi2/df, ${formatP(monteCarlo.pMaxClustered)} on the maximum (${sims})`;
  }
  return `Monte Carlo p = ${formatP(monteCarlo.pMedianClustered)} for clustering and ${formatP(monteCarlo.pMedianRegular)} for regularity on the median chi2/df (${sims})`;
}

/**
 * One plain-words sentence for one cell size, e.g.
 * "120 m cells: clustered in 97 % of 512 placements; Monte Carlo p = 0.01 on the median chi2/df, 0.01 on the maximum (R = 99)".
 */
export function sizeConclusion(summary: Omit<SizeSummary, 'conclusion'>, baseline?: BaselineInfo): string {
  const { verdictShares, mostCommon, placements, monteCarlo } = summary;
  const words = verdictWords(baseline);
  const parts = [`${cellsLabel(summary)}: ${words[mostCommon]} in ${formatShare(verdictShares[mostCommon])} of ${placements} placements`];
  const others = (['clustered', 'regular', 'csr'] as Verdict[]).filter((v) => v !== mostCommon && verdictShares[v] > 0);
  if (others.length > 0) parts[0] += ` (${others.map((v) => `${words[v]} in ${formatShare(verdictShares[v])}`).join(', ')})`;
  if (monteCarlo) parts.push(monteCarloWords(mostCommon, monteCarlo));
  else parts.push('per-placement evidence only, no Monte Carlo test (sims = 0)');
  return parts.join('; ');
}

/**
 * The overall conclusion across cell sizes. With sims: the result of the one overall Monte Carlo test across sizes
 * and both tails (overall-test.ts), the only sentence that claims significance for the sweep as a whole; the
 * per-size p-values stay in the per-size conclusions, labelled per size. Without sims: what most placements say,
 * labelled as per-placement evidence, not a test (shared/monte-carlo-rule.ts). Then at how many sizes the verdict
 * depends on the placement (agreement below LOW_AGREEMENT).
 */
export function overallConclusion(sizes: readonly Omit<SizeSummary, 'conclusion'>[], alpha: number,
  overall: OverallTest | null = null, baseline?: BaselineInfo): string {
  const total = sizes.length;
  const sentences: string[] = [];
  const shapes = shapesOf(sizes);
  const sides = new Set(sizes.map((size) => size.cellSize)).size;
  const sizesWords =
    shapes.length > 1
      ? `${sides === 1 ? 'the 1 cell size' : `all ${sides} cell sizes`}, both cell shapes`
      : total === 1 ? 'the 1 cell size' : `all ${total} cell sizes`;
  const strongest = overall === null ? '' : cellsLabel({ cellSize: overall.strongestCellSize, shape: overall.strongestShape });
  if (overall !== null) {
    const pText = pPhrase(overall.p);
    if (baseline !== undefined) {
      sentences.push(baselineOverallSentence(overall, sizesWords, alpha, pText, strongest, baseline));
    } else if (overall.rejects) {
      const kind = overall.direction === 'regular' ? 'regularity' : 'clustering';
      const beyond = overall.direction === 'regular' ? '' : ` ${beyondNull(undefined)}`;
      sentences.push(
        `The overall Monte Carlo test across ${sizesWords} and both tails finds a departure from CSR at alpha ${alpha} ` +
          `(${pText}, R = ${overall.sims}): ${kind}${beyond}, most marked at ${strongest}`,
      );
    } else {
      sentences.push(
        `The overall Monte Carlo test across ${sizesWords} and both tails finds no departure from CSR at alpha ${alpha} ` +
          `(${pText}, R = ${overall.sims})`,
      );
    }
  } else {
    const counts: Record<Verdict, number> = { clustered: 0, regular: 0, csr: 0 };
    for (const size of sizes) counts[size.mostCommon] += 1;
    const verdictText = verdictWords(baseline);
    const words = (['clustered', 'regular', 'csr'] as Verdict[])
      .filter((v) => counts[v] > 0)
      .map((v) => `${verdictText[v]} at ${counts[v]} of ${total} cell sizes`);
    const where = shapes.length > 1 ? 'cell sizes and shapes' : 'cell sizes';
    sentences.push(`Per-placement evidence only, not a test (sims = 0): most placements say ${words.join(', ').replace(/cell sizes/g, where)} at alpha ${alpha}; run with sims > 0 for a Monte Carlo test`);
  }
  const unstable = sizes.filter((size) => size.agreement < LOW_AGREEMENT).length;
  const entries = shapes.length > 1 ? 'cell sizes and shapes' : 'cell sizes';
  if (unstable > 0) {
    sentences.push(`The verdict depends on where the grid falls at ${unstable} of ${total} ${entries} (agreement below ${LOW_AGREEMENT * 100} %)`);
  } else if (total > 0) {
    sentences.push(`At every cell size${shapes.length > 1 ? ' and shape' : ''} at least ${LOW_AGREEMENT * 100} % of placements agree`);
  }
  if (shapes.length > 1) sentences.push(shapeSentence(sizes));
  return sentences.join('. ') + '.';
}

/** The overall test's sentence against a baseline: it names the null (issue 15). */
function baselineOverallSentence(overall: OverallTest, sizesWords: string, alpha: number, pText: string, strongest: string,
  baseline: BaselineInfo): string {
  const across = `The overall Monte Carlo test across ${sizesWords} and both tails`;
  const tail = `(${pText}, R = ${overall.sims})`;
  if (!overall.rejects) return `${across} finds no departure from ${nullName(baseline)} at alpha ${alpha} ${tail}`;
  if (overall.direction === 'regular') {
    return `${across} finds counts more even than ${nullName(baseline)} gives at alpha ${alpha} ${tail}, most marked at ${strongest}`;
  }
  return `${across} finds clustering ${beyondNull(baseline)} at alpha ${alpha} ${tail}, most marked at ${strongest}`;
}

/** The shapes of a sweep's size entries, in order of first appearance (entries without one are squares). */
function shapesOf(sizes: readonly Pick<SizeSummary, 'shape'>[]): string[] {
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
    .map(([side, verdicts]) => `${formatMetres(side)} m: ${[...verdicts.entries()].map(([shape, verdict]) => `${shape === 'hex' ? 'hexagons' : 'squares'} ${VERDICT_WORDS[verdict]}`).join(', ')}`);
  return `The conclusion depends on the cell shape at ${differing.length} of ${compared.length} cell sizes, where squares and hexagons give different most common verdicts (${details.join('; ')})`;
}
