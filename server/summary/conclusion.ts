import type { BaselineInfo, MonteCarloResult, OverallTest, SizeSummary } from '../../shared/contracts.js';
import { beyondNull, nullName } from '../../shared/null-hypothesis.js';
import { formatMetres, formatP, pPhrase } from '../../shared/format.js';
import { verdictWords } from '../../shared/verdict-words.js';
import { shapeSentence, shapesOf } from '../../shared/shape-sentence.js';
import type { Verdict } from '../../workers/types.js';

/** Agreement below this share means the verdict depends on where the grid falls (our choice, stated in the text). */
export const LOW_AGREEMENT = 0.9;

/** Verdict words against a baseline: the null is named (issue 15); area mode keeps shared/verdict-words.ts. */
const BASELINE_VERDICT_WORDS: Record<Verdict, string> = {
  clustered: 'clustered beyond the baseline',
  regular: 'more even than the baseline',
  csr: 'no departure from the baseline',
};

/** The short verdict words of a sweep, against area or against its baseline. */
function verdictText(verdict: Verdict, baseline: BaselineInfo | undefined): string {
  return baseline === undefined ? verdictWords(verdict, 'short') : BASELINE_VERDICT_WORDS[verdict];
}

/** A share 0..1 as a whole percentage that never rounds a partial share to 0 % or 100 %. */
export function formatShare(share: number): string {
  if (!Number.isFinite(share)) return 'n/a';
  if (share === 0 || share === 1) return `${share * 100} %`;
  const percent = Math.min(99, Math.max(1, Math.round(share * 100)));
  return `${percent} %`;
}

/**
 * How a size's cells are named in sentences: "120 m cells" for squares (as before shapes existed), "120 m hexagonal
 * cells" for hexagons of area 120^2 m^2.
 */
export function cellsLabel(size: Pick<SizeSummary, 'cellSize' | 'shape'>): string {
  return `${formatMetres(size.cellSize, { significant: 4 })} ${size.shape === 'hex' ? 'hexagonal ' : ''}cells`;
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
    const parts = [`${cellsLabel(summary)}: ${verdictText(mostCommon, baseline)} in ${formatShare(verdictShares[mostCommon])} of ${placements} placements`];
  const others = (['clustered', 'regular', 'csr'] as Verdict[]).filter((v) => v !== mostCommon && verdictShares[v] > 0);
  if (others.length > 0) parts[0] += ` (${others.map((v) => `${verdictText(v, baseline)} in ${formatShare(verdictShares[v])}`).join(', ')})`;
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
    const words = (['clustered', 'regular', 'csr'] as Verdict[])
      .filter((v) => counts[v] > 0)
      .map((v) => `${verdictText(v, baseline)} at ${counts[v]} of ${total} cell sizes`);
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
