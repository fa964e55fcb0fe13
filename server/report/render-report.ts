/**
 * The single-file HTML report of a sweep: dataset, plan, charts, per-size table, Monte Carlo result, methods
 * written from the run, versions and seed, cautions. Self-contained (chart.js and CSS inline, no network), prints
 * cleanly to PDF. Used by `gridshake sweep --out` and GET /api/sweeps/:id/report.html.
 */
import type { PlacementRow, SweepSummary } from '../../shared/contracts.js';
import { CAUTIONS } from '../../shared/charts/cautions.js';
import { overviewBundles, sizeBundles } from '../../shared/charts/chart-bundles.js';
import type { ChartBundle, ChartSpec } from '../../shared/charts/chart-spec.js';
import { formatMetres } from '../../shared/format.js';
import { sizeNumbers } from '../../shared/charts/size-numbers.js';
import { orderSizes } from '../../shared/charts/size-label.js';
import { chartLibrarySource } from './chart-library.js';
import { escapeHtml } from './html-escape.js';
import { htmlTable } from './html-table.js';
import { methodsText } from './methods-text.js';
import { nullStatement } from '../../shared/null-hypothesis.js';
import { baselineComparisonSection, datasetSection, monteCarloSection, planSection, sizeTable, versionsSection } from './report-sections.js';
import { REPORT_CHART_SIZE, reportChartScript } from './report-script.js';
import { REPORT_CSS } from './report-styles.js';
import { reportMapSvg, type ReportMap } from './report-map.js';
import { stabilitySection } from './stability-section.js';

/** Long tables (one row per placement or offset bin) are folded away on screen and left out of print. */
const FOLD_TABLE_ROWS = 12;

function figure(bundle: ChartBundle): string {
  const table = htmlTable(bundle.table.caption, bundle.table.head, bundle.table.rows);
  const tableHtml = bundle.table.rows.length > FOLD_TABLE_ROWS
    ? `<details><summary>Numbers behind the chart (${bundle.table.rows.length} rows)</summary>${table}</details>`
    : table;
  return (
    `<figure><canvas id="chart-${escapeHtml(bundle.id)}" width="${REPORT_CHART_SIZE.width}" height="${REPORT_CHART_SIZE.height}" ` +
    `role="img" aria-label="${escapeHtml(bundle.title)}"></canvas><figcaption>${escapeHtml(bundle.title)}</figcaption>${tableHtml}</figure>`
  );
}

function sizeSection(summary: SweepSummary, rows: readonly PlacementRow[], sizeIndex: number, bundles: ChartBundle[]): string {
  const size = summary.sizes.find((candidate) => candidate.sizeIndex === sizeIndex)!;
  const numbers = sizeNumbers(size).map((line) => `<li>${escapeHtml(line)}</li>`).join('');
  return (
    `<section class="size"><h2>Cell side ${escapeHtml(formatMetres(size.cellSize))}${size.shape === 'hex' ? ', hexagonal cells' : ''}</h2>` +
    `<p class="conclusion">${escapeHtml(size.conclusion)}</p><ul class="numbers">${numbers}</ul>` +
    `${bundles.map(figure).join('\n')}</section>`
  );
}

/** Renders the whole report as one HTML string; with `map` (report-map.ts) it holds the map figure. */
export function renderReport(summary: SweepSummary, rows: PlacementRow[], map?: ReportMap): string {
  const overview = overviewBundles(summary);
  const perSize = orderSizes(summary.sizes)
    .map((size) => ({ sizeIndex: size.sizeIndex, bundles: sizeBundles(summary, rows, size.sizeIndex) }));
  const specs: Record<string, ChartSpec> = {};
  for (const bundle of [...overview, ...perSize.flatMap((entry) => entry.bundles)]) specs[bundle.id] = bundle.spec;
  const methods = methodsText(summary);
  const warnings = summary.warnings.length === 0 ? '' : `<h3>Warnings about this run</h3><ul class="warnings">${summary.warnings.map((warning) => `<li>${escapeHtml(warning)}</li>`).join('')}</ul>`;
  const title = `gridshake report: ${summary.dataset.name}`;
  return `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<meta http-equiv="Content-Security-Policy" content="default-src 'none'; script-src 'unsafe-inline'; style-src 'unsafe-inline'; img-src data:">
<title>${escapeHtml(title)}</title>
<style>${REPORT_CSS}</style>
</head>
<body>
<main>
<h1>${escapeHtml(title)}</h1>
<p class="meta">Quadrat test over ${summary.plan.placements} grid placements and ${summary.sizes.length} cell size${summary.sizes.length === 1 ? '' : 's'}; seed ${summary.plan.seed}; finished ${escapeHtml(summary.timings.finishedAt)}.</p>
<section class="cautions" aria-label="Cautions"><h2>Read before you act on these results</h2><ul>${CAUTIONS.map((caution) => `<li>${escapeHtml(caution)}</li>`).join('')}</ul></section>
<section><h2>Conclusion</h2>${warnings}<p class="null-tested">${escapeHtml(nullStatement(summary.baseline ?? summary.dataset.baseline))}</p><p class="conclusion">${escapeHtml(summary.conclusion)}</p></section>
${datasetSection(summary)}
${map ? `<section><h2>Map</h2>${reportMapSvg(map)}</section>` : ''}
${planSection(summary)}
<section><h2>Results across cell sizes</h2>${sizeTable(summary)}${overview.map(figure).join('\n')}</section>
${baselineComparisonSection(summary)}
${monteCarloSection(summary)}
${stabilitySection(summary, map)}
${perSize.map((entry) => sizeSection(summary, rows, entry.sizeIndex, entry.bundles)).join('\n')}
<section><h2>Methods</h2>${methods.paragraphs.map((paragraph) => `<p>${escapeHtml(paragraph)}</p>`).join('\n')}
<h3>References</h3><ol>${methods.references.map((reference) => `<li>${escapeHtml(reference)}</li>`).join('')}</ol></section>
${versionsSection(summary)}
<footer>Made with gridshake. Charts are drawn by the embedded chart.js; the tables hold the same numbers.</footer>
</main>
<script>${chartLibrarySource()}</script>
<script>${reportChartScript(specs)}</script>
</body>
</html>
`;
}
