/** The text sections of the report: dataset, plan, per-size table, Monte Carlo results, versions. */
import type { SweepSummary } from '../../shared/contracts.js';
import { formatMetres, formatNumber } from '../../shared/format.js';
import { baselineComparisonTableData, monteCarloTableData, sizeTableData } from '../../shared/charts/size-tables.js';
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

/** Against a baseline (issue 15): the area-only and baseline verdicts side by side (shared/charts/size-tables.ts). */
export function baselineComparisonSection(summary: SweepSummary): string {
  const table = baselineComparisonTableData(summary);
  if (table === null) return '';
  return `<section><h2>Against area and against the population at risk</h2><p>${escapeHtml(table.note)}</p>${htmlTable(table.caption, table.head, table.rows)}</section>`;
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
