/** The text sections of the report: dataset, plan, per-size table, Monte Carlo results, versions. */
import type { SweepSummary } from '../../shared/contracts.js';
import { formatMetres, formatNumber, formatP, formatPercent } from '../../shared/format.js';
import { sideLabel } from '../../shared/charts/size-label.js';
import { monteCarloTableData, sizeTableData } from '../../shared/charts/size-tables.js';
import { datasetSummaryEntries, warningRecords } from '../../shared/charts/dataset-entries.js';
import { warningTitle } from '../../shared/messages/warning-titles.js';
import { escapeHtml } from './html-escape.js';
import { definitionTable, htmlTable } from './html-table.js';
import { nullName } from '../summary/null-hypothesis.js';

export function datasetSection(summary: SweepSummary): string {
  const dataset = summary.dataset;
  const entries = datasetSummaryEntries(dataset);
  const warnings = dataset.warnings.length === 0
    ? '<p>The inputs raised no warnings.</p>'
    : `<ul class="warnings">${dataset.warnings
        .map((warning) => `<li><strong>${escapeHtml(warningTitle(warning.code))}:</strong> ${escapeHtml(warning.message + warningRecords(warning))}</li>`)
        .join('')}</ul>`;
  return `<section><h2>Dataset</h2>${definitionTable('Dataset summary', entries)}<h3>Input warnings</h3>${warnings}</section>`;
}

/** The distinct cell sides of a sweep, in plan order (a sweep of two shapes lists each side once). */
function distinctSides(summary: SweepSummary): string[] {
  return [...new Set(summary.sizes.map((size) => formatMetres(size.cellSize)))];
}

export function planSection(summary: SweepSummary): string {
  const plan = summary.plan;
  const sides = plan.perCell
    ? `${distinctSides(summary).join(', ')} (from ${plan.perCell.join(', ')} expected points per cell)`
    : distinctSides(summary).join(', ');
  const hexagons = summary.sizes.some((size) => size.shape === 'hex');
  const shapes = [...new Set(summary.sizes.map((size) => (size.shape === 'hex' ? 'hexagons (area = side², pointy-top)' : 'squares')))];
  const entries: [string, string][] = [
    ['cell sides', sides],
    ...(plan.shape === undefined ? [] : [['cell shapes', shapes.join(' and ')] as [string, string]]),
    ['placements per size', String(plan.placements)],
    ['placement design', plan.design],
    ['rotation', plan.rotation ? (hexagons ? 'on (0 to 90 degrees for squares, 0 to 60 for hexagons)' : 'on (0 to 90 degrees)') : 'off (angle 0)'],
    ['minCoverage', formatNumber(plan.minCoverage)],
    ['alpha (two-sided)', formatNumber(plan.alpha)],
    ['CSR simulations', String(plan.sims)],
    ['seed', String(plan.seed)],
  ];
  return `<section><h2>Plan</h2>${definitionTable('Sweep plan', entries)}</section>`;
}

export function sizeTable(summary: SweepSummary): string {
  const table = sizeTableData(summary);
  return htmlTable(table.caption, table.head, table.rows);
}

/**
 * Against a baseline (issue 15): per cell size, the area-only verdict of the same placements beside the baseline
 * verdict, so a reader sees how much of the "clustering" the population explains. Empty without a baseline.
 */
export function baselineComparisonSection(summary: SweepSummary): string {
  const baseline = summary.baseline ?? summary.dataset.baseline;
  if (baseline === undefined) return '';
  const words = (verdict: string, share: number) => `${verdict === 'csr' ? 'no departure' : verdict} in ${formatPercent(share)}`;
  const rows = [...summary.sizes]
    .sort((a, b) => a.cellSize - b.cellSize)
    .map((size) => [
      sideLabel(size),
      size.areaOnly === undefined ? 'n/a' : words(size.areaOnly.mostCommon, size.areaOnly.verdictShares[size.areaOnly.mostCommon]),
      size.areaOnly === undefined ? 'n/a' : formatNumber(size.areaOnly.chi2PerDfMedian),
      words(size.mostCommon, size.verdictShares[size.mostCommon]),
      formatNumber(size.chi2PerDf.p50),
      formatP(size.monteCarlo?.pMedianClustered),
    ]);
  const head = ['cell side', 'against area: verdict of placements', 'median chi2/df (area)', 'against the baseline: verdict of placements', 'median chi2/df (baseline)', 'Monte Carlo p (baseline, median)'];
  const note =
    `<p>Against area the null is complete spatial randomness; against the baseline it is ${escapeHtml(nullName(baseline))}. ` +
    'The area-only columns are per-placement chi-square verdicts (no Monte Carlo); the difference between the two shows how ' +
    'much of the apparent clustering the population at risk explains.</p>';
  return `<section><h2>Against area and against the population at risk</h2>${note}${htmlTable('Area-only and baseline verdicts per cell size', head, rows)}</section>`;
}

export function monteCarloSection(summary: SweepSummary): string {
  const table = monteCarloTableData(summary);
  if (table === null) return '<section><h2>Monte Carlo test</h2><p>No CSR simulations were run (sims = 0).</p></section>';
  return `<section><h2>Monte Carlo test</h2>${htmlTable(table.caption, table.head, table.rows)}</section>`;
}

export function versionsSection(summary: SweepSummary): string {
  const entries: [string, string][] = Object.entries(summary.versions).map(([name, version]) => [name, version]);
  entries.push(['seed', String(summary.plan.seed)], ['started', summary.timings.startedAt], ['finished', summary.timings.finishedAt], ['run time', `${formatNumber(summary.timings.seconds)} s`]);
  return `<section><h2>Versions and seed</h2>${definitionTable('Software versions, seed and timing', entries)}</section>`;
}
