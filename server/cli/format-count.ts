/** Plain-words rendering of a count result for the terminal: verdict, key numbers, rule of thumb, warnings, caution. */
import type { CountResult } from './count-result.js';
import { formatP, pPhrase } from '../../shared/format.js';
import { beyondNull, nullName } from '../../shared/null-hypothesis.js';

const fixed = (value: number, digits = 6): string => (Number.isFinite(value) ? value.toFixed(digits) : String(value));

export function verdictSentence(result: CountResult): string {
  const test = `two-sided test at alpha = ${result.alpha}`;
  if (result.baseline !== undefined) return baselineVerdictSentence(result, test);
  if (result.verdict === 'clustered') {
    return `The counts are more clustered than complete spatial randomness would give (${pPhrase(result.pClustered)}, ${test}).`;
  }
  if (result.verdict === 'regular') {
    return `The counts are more regular (evenly spread) than complete spatial randomness would give (${pPhrase(result.pRegular)}, ${test}).`;
  }
  return (
    `The counts do not depart from complete spatial randomness (${test}: p for clustering = ` +
    `${formatP(result.pClustered)}, p for regularity = ${formatP(result.pRegular)}).`
  );
}

/**
 * The verdict against a baseline: the sentence names the null (issue 15). With controls it is the random-labelling
 * Monte Carlo test's (calibrated: test/stress/count-labelling-calibration.test.ts), saying so and with how many
 * labellings; the chi-square p, which treats the control counts as exact, is only listed in the table.
 */
function baselineVerdictSentence(result: CountResult, test: string): string {
  const named = nullName(result.baseline);
  const monteCarlo = result.monteCarlo;
  if (monteCarlo !== undefined) {
    const how = `Monte Carlo p from ${monteCarlo.sims} random relabellings of the pooled cases and controls, seed ${monteCarlo.seed}, ${test}`;
    if (monteCarlo.verdict === 'clustered') return `The counts show clustering ${beyondNull(result.baseline)} (${pPhrase(monteCarlo.pClustered)}, ${how}).`;
    if (monteCarlo.verdict === 'regular') return `The counts are more even than ${named} would give (${pPhrase(monteCarlo.pRegular)}, ${how}).`;
    return (
      `The counts do not depart from ${named} (${how}: p for clustering = ${formatP(monteCarlo.pClustered)}, ` +
      `p for regularity = ${formatP(monteCarlo.pRegular)}).`
    );
  }
  if (result.verdict === 'clustered') {
    return `The counts show clustering ${beyondNull(result.baseline)} (${pPhrase(result.pClustered)}, ${test}).`;
  }
  if (result.verdict === 'regular') {
    return `The counts are more even than ${named} would give (${pPhrase(result.pRegular)}, ${test}).`;
  }
  return (
    `The counts do not depart from ${named} (${test}: p for clustering = ` +
    `${formatP(result.pClustered)}, p for regularity = ${formatP(result.pRegular)}).`
  );
}

/**
 * The warning that must come before the verdict when the chi-square p-value cannot be trusted: fewer than 1.6
 * expected points per whole cell (below both rules of thumb, common practice; NIST/SEMATECH e-Handbook 1.3.5.15)
 * or fewer than 2 points counted. Null when the p-value stands.
 */
export function pValueCaveat(result: CountResult): string | null {
  if (result.points < 2) {
    return `Read first: only ${result.points} point${result.points === 1 ? '' : 's'} counted; the p-values below say nothing about the pattern.`;
  }
  if (!result.meetsRuleOf1_6) {
    return (
      `Read first: ${result.expectedPerCell.toFixed(2)} expected points per whole cell is below both rules of thumb ` +
      '(1.6 and 5, common practice): the chi-square p-values below are not reliable; use larger cells.'
    );
  }
  return null;
}

function ruleOfThumb(result: CountResult): string {
  const perCell = result.expectedPerCell.toFixed(2);
  const judgement = result.meetsRuleOf5
    ? 'meets the rule of about 5 per cell'
    : result.meetsRuleOf1_6
      ? 'meets the rule of about 1.6 per cell but not that of 5 (chi-square adequacy)'
      : 'is below both rules (1.6 and 5 per cell): the chi-square approximation is doubtful; use larger cells';
  const sizes = result.dataset.suggestedCellSizes
    .map((size) => `${size.perCell} per cell: ${size.cellSize.toFixed(0)} m`)
    .join('; ');
  return `Rule of thumb (common practice): ${perCell} expected points per whole cell ${judgement}.\n  Suggested sides: ${sizes}.`;
}

export function formatCount(result: CountResult): string {
  const { placement } = result;
  const lines: string[] = [];
  lines.push(`gridshake count: ${result.dataset.name} (${result.pointsTotal} points, coordinates ${result.dataset.crs})`);
  lines.push(`Projection used: ${result.dataset.projectionUsed}`);
  lines.push(
    `Grid: ${result.shape === 'hex' ? `hexagonal cells of ${result.cellSize} m x ${result.cellSize} m area` : `${result.cellSize} m cells`}, angle ${placement.angle}°, offset (${placement.u}, ${placement.v}) cells, ` +
      `cells kept with coverage >= ${result.minCoverage}`,
  );
  // warnings first: a warning that makes the p-value meaningless is read before the p-value
  if (result.warnings.length > 0) {
    lines.push('');
    lines.push('Warnings:');
    for (const warning of result.warnings) {
      const ids = warning.ids && warning.ids.length > 0 ? ` [ids: ${warning.ids.join(', ')}]` : '';
      lines.push(`  - ${warning.cliMessage ?? warning.message}${ids}`);
    }
  }
  const caveat = pValueCaveat(result);
  if (caveat !== null) {
    lines.push('');
    lines.push(caveat);
  }
  lines.push('');
  lines.push(verdictSentence(result));
  if (result.pointsInZeroBaselineCells > 0) {
    lines.push(`${result.pointsInZeroBaselineCells} points lie in cells with no population at risk (${result.zeroBaselineCells} cells left out).`);
  }
  lines.push('');
  const equalArea = result.baseline === undefined ? '' : ' (equal-area)';
  const rows: [string, string][] = [
    ['cells kept', String(result.cells)],
    ['points counted', String(result.points)],
    ['points outside the valid region', String(result.pointsOutside)],
    ['points in left-out cells', String(result.pointsInLeftOutCells)],
    ['expected counts from', result.baseline === undefined ? 'area' : `${result.expectedFrom} (total in kept cells ${result.baselineTotal.toPrecision(6)})`],
    ['mean per cell', fixed(result.mean)],
    ['variance', fixed(result.variance)],
    [`variance/mean (VMR)${equalArea}`, fixed(result.vmr)],
    [result.baseline === undefined ? 'chi-square (dispersion)' : 'chi-square (against the baseline)', `${fixed(result.chi2, 4)} on ${result.df} df (chi2/df ${fixed(result.chi2PerDf, 4)})`],
    ...(result.monteCarlo === undefined
      ? [['p clustered / p regular', `${formatP(result.pClustered)} / ${formatP(result.pRegular)}`] as [string, string]]
      : [
          ['Monte Carlo p clustered / regular', `${formatP(result.monteCarlo.pClustered)} / ${formatP(result.monteCarlo.pRegular)} (R = ${result.monteCarlo.sims} relabellings, chi2/df ${fixed(result.monteCarlo.observed, 4)})`] as [string, string],
          ['chi-square p (controls as exact)', `${formatP(result.pClustered)} / ${formatP(result.pRegular)}, not the test: it ignores the controls' own randomness`] as [string, string],
        ]),
    [`Morisita I / standardized${equalArea}`, `${fixed(result.morisita)} / ${fixed(result.morisitaStandardized)}`],
    ['Lloyd mean crowding / patchiness', `${fixed(result.meanCrowding)} / ${fixed(result.patchiness)}`],
    ['Green index', result.green.toPrecision(4)],
    ['negative-binomial k', result.negativeBinomialK === null ? 'none (variance <= mean)' : fixed(result.negativeBinomialK, 4)],
  ];
  if (result.poissonFit) {
    const fit = result.poissonFit;
    rows.push(['Poisson frequency fit', `chi-square ${fixed(fit.chi2, 4)} on ${fit.df} df, ${pPhrase(fit.p)}`]);
    rows.push(['  classes (observed/expected)', fit.classes.map((c) => `${c.label}: ${c.observed}/${c.expected.toFixed(2)}`).join(', ')]);
  } else {
    rows.push(['Poisson frequency fit', 'not available (fewer than 3 classes after merging)']);
  }
  for (const [label, value] of rows) lines.push(`  ${label.padEnd(34)} ${value}`);
  lines.push('');
  lines.push(ruleOfThumb(result));
  lines.push('');
  lines.push(
    'Caution: significance is not cause, and results depend on data quality; for disease or crime patterns ' +
      'defer to local public-health and policing guidance and licensed professionals, and protect the privacy of point records.',
  );
  return `${lines.join('\n')}\n`;
}
