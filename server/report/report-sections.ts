/** The text sections of the report: dataset, plan, per-size table, Monte Carlo results, versions. */
import type { SweepSummary } from '../../shared/contracts.js';
import { formatMetres, formatNumber, formatP, formatPercent } from '../../shared/format.js';
import { datasetSummaryEntries, warningRecords } from '../../shared/charts/dataset-entries.js';
import { warningTitle } from '../../shared/messages/warning-titles.js';
import { escapeHtml } from './html-escape.js';
import { definitionTable, htmlTable } from './html-table.js';

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

/** A size entry's side in tables: "90" for squares, "90 hexagons" for hexagons of area 90^2 m^2. */
export function sideLabel(size: Pick<SweepSummary['sizes'][number], 'cellSize' | 'shape'>): string {
  return `${formatMetres(size.cellSize)}${size.shape === 'hex' ? ' hexagons' : ''}`;
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
  const rows = [...summary.sizes]
    .sort((a, b) => a.cellSize - b.cellSize)
    .map((size) => [
      sideLabel(size),
      formatNumber(size.expectedPerCell),
      String(size.placements),
      formatNumber(size.chi2PerDf.p50),
      `${formatNumber(size.chi2PerDf.p5)} to ${formatNumber(size.chi2PerDf.p95)}`,
      formatNumber(size.vmr.p50),
      formatPercent(size.verdictShares.clustered),
      formatPercent(size.verdictShares.csr),
      formatPercent(size.verdictShares.regular),
      formatPercent(size.agreement),
      `${formatNumber(size.reference.vmr)} (${formatPercent(size.referenceRank)})`,
      formatP(size.monteCarlo?.pMedianClustered),
    ]);
  const head = ['cell side', 'expected per cell', 'placements', 'median chi2/df', 'chi2/df 5-95 %', 'median VMR', 'clustered', 'CSR', 'regular', 'agreement', 'reference VMR (rank)', 'Monte Carlo p (median)'];
  return htmlTable('Results per cell size', head, rows);
}

export function monteCarloSection(summary: SweepSummary): string {
  const simulated = summary.sizes.filter((size) => size.monteCarlo && size.monteCarlo.sims > 0);
  if (simulated.length === 0) return '<section><h2>Monte Carlo test</h2><p>No CSR simulations were run (sims = 0).</p></section>';
  const rows = simulated
    .sort((a, b) => a.cellSize - b.cellSize)
    .map((size) => {
      const result = size.monteCarlo!;
      const meanShare = result.simulatedShareSignificant.reduce((sum, share) => sum + share, 0) / Math.max(1, result.simulatedShareSignificant.length);
      return [
        sideLabel(size),
        String(result.sims),
        formatNumber(result.observedMedian),
        `${formatNumber(result.envelope.lo)} to ${formatNumber(result.envelope.hi)}`,
        formatP(result.pMedianClustered),
        formatP(result.pMedianRegular),
        formatNumber(result.observedMax),
        formatP(result.pMaxClustered),
        formatP(result.pMinRegular),
        `${formatPercent(result.observedShareSignificant)} (CSR: ${formatPercent(meanShare)})`,
      ];
    });
  const head = ['cell side', 'sims', 'observed median chi2/df', 'CSR envelope', 'p clustered (median)', 'p regular (median)', 'observed maximum', 'p clustered (maximum)', 'p regular (minimum)', 'placements significant'];
  return `<section><h2>Monte Carlo test</h2>${htmlTable('Placement-robust Monte Carlo p-values', head, rows)}</section>`;
}

export function versionsSection(summary: SweepSummary): string {
  const entries: [string, string][] = Object.entries(summary.versions).map(([name, version]) => [name, version]);
  entries.push(['seed', String(summary.plan.seed)], ['started', summary.timings.startedAt], ['finished', summary.timings.finishedAt], ['run time', `${formatNumber(summary.timings.seconds)} s`]);
  return `<section><h2>Versions and seed</h2>${definitionTable('Software versions, seed and timing', entries)}</section>`;
}
