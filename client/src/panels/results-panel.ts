/**
 * Step 4: results. The overall conclusion (with, for a sweep of squares and hexagons, the sentence on whether it
 * depends on the cell shape), the cell-size and verdict charts and the tables per cell size and shape (spread,
 * verdict shares, Monte Carlo p; the report's tables, shared/charts/size-tables.ts), then for a chosen entry the
 * VMR against angle, the offset heat map and the Monte Carlo histogram, with the conclusion and its numbers. Clicking
 * a placement in any chart (or the buttons) shows its grid on the map. The null tested is named above the conclusion,
 * and against a baseline the area-only and baseline verdicts stand side by side (shared/, as in the report).
 */
import type { SweepSummary } from '../../../shared/contracts.js';
import type { Store } from '../app-state.js';
import { overviewBundles, sizeBundles } from '../../../shared/charts/chart-bundles.js';
import { cellSizeSeries, type SpreadMeasure } from '../../../shared/charts/cell-size-data.js';
import { formatMetres } from '../../../shared/format.js';
import { sizeNumbers } from '../../../shared/charts/size-numbers.js';
import { ChartView, setPngNamer, type ChartClick } from '../ui/chart-view.js';
import { downloadName } from '../../../shared/messages/download-names.js';
import { clear, el, field, textTable } from '../ui/dom.js';
import { orderSizes, sideLabel } from '../../../shared/charts/size-label.js';
import { baselineComparisonTableData, monteCarloTableData, sizeTableData } from '../../../shared/charts/size-tables.js';
import { nullStatement } from '../../../shared/null-hypothesis.js';
import { shapeSentence } from '../../../shared/shape-sentence.js';
import { heatmapLegend } from './heatmap-legend.js';
import { placementPicker } from './placement-picker.js';

export type PickPlacement = (sizeIndex: number, placementIndex: number) => void;

export function initResultsPanel(container: HTMLElement, store: Store, pick: PickPlacement): void {
  let views: ChartView[] = [];
  let detailViews: ChartView[] = [];
  let measure: SpreadMeasure = 'chi2PerDf';
  const overviewBox = el('div', { class: 'chart-grid' });
  const detailBox = el('div', { id: 'size-detail' });

  const renderOverview = (summary: SweepSummary) => {
    views.forEach((view) => view.destroy());
    const series = cellSizeSeries(summary.sizes, measure);
    const [cellSize, verdicts] = overviewBundles(summary, measure);
    const clickCellSize: ChartClick = (datasetIndex, index) => {
      // any element of a size column selects that entry (cell size and shape); the reference triangle also shows the
      // reference grid. Each point carries its entry's index in the series (cell-size-chart.ts).
      const dataset = cellSize.spec.data.datasets[datasetIndex];
      const entry = (dataset?.data as { entry?: number }[] | undefined)?.[index]?.entry;
      if (entry === undefined) return;
      const sizeIndex = series.sizeIndex[entry]!;
      store.update({ sizeIndex });
      if (String(dataset?.label).startsWith('reference placement')) pick(sizeIndex, series.referencePlacementIndex[entry]!);
    };
    const clickVerdicts: ChartClick = (_datasetIndex, index) => store.update({ sizeIndex: series.sizeIndex[index] });
    views = [
      new ChartView(cellSize, clickCellSize, 'Click a cell side to see it in detail; click a triangle to show the reference grid on the map.'),
      new ChartView(verdicts, clickVerdicts, 'Click a bar to see that cell side in detail.'),
    ];
    clear(overviewBox, ...views.map((view) => view.element));
    views.forEach((view) => view.render());
  };

  const renderDetail = (summary: SweepSummary, sizeIndex: number) => {
    detailViews.forEach((view) => view.destroy());
    const size = summary.sizes.find((candidate) => candidate.sizeIndex === sizeIndex);
    if (!size) return;
    const bundles = sizeBundles(summary, store.state.rows, sizeIndex);
    detailViews = bundles.map((bundle) => {
      if (bundle.id.startsWith('angle-')) {
        return new ChartView(bundle, (datasetIndex, index) => {
          const point = (bundle.spec.data.datasets[datasetIndex]?.data as { placementIndex?: number }[] | undefined)?.[index];
          if (point?.placementIndex !== undefined) pick(sizeIndex, point.placementIndex);
        }, 'Click a dot to show that placement on the map.');
      }
      if (bundle.id.startsWith('offsets-')) {
        return new ChartView(bundle, (datasetIndex, index) => {
          const placement = (bundle.spec.data.datasets[datasetIndex]?.placementOf as (number | null)[] | undefined)?.[index];
          if (placement !== null && placement !== undefined) pick(sizeIndex, placement);
        }, 'Click a cell to show the placement nearest its centre on the map.');
      }
      return new ChartView(bundle);
    });
    const heatmapIndex = bundles.findIndex((bundle) => bundle.id.startsWith('offsets-'));
    clear(
      detailBox,
      el('h4', {}, `Cell side ${formatMetres(size.cellSize)}${size.shape === 'hex' ? ', hexagonal cells' : ''}`),
      el('p', { class: 'conclusion', 'data-testid': 'size-conclusion' }, size.conclusion),
      el('ul', { class: 'numbers', 'data-testid': 'size-numbers' }, ...sizeNumbers(size).map((line) => el('li', {}, line))),
      placementPicker(size, (placementIndex) => pick(sizeIndex, placementIndex)),
      el('div', { class: 'chart-grid' }, ...detailViews.flatMap((view, k) => (k === heatmapIndex ? [el('div', {}, view.element, heatmapLegend(bundles[k]))] : [view.element]))),
    );
    detailViews.forEach((view) => view.render());
  };

  store.subscribe((state, changed) => {
    if (changed.has('summary') || changed.has('sweepId')) {
      if (!state.summary) {
        views.forEach((view) => view.destroy());
        detailViews.forEach((view) => view.destroy());
        views = [];
        detailViews = [];
        clear(container, el('p', { class: 'hint' }, 'Results appear here when a sweep has finished.'));
        return;
      }
      buildLayout(state.summary);
    }
    if ((changed.has('sizeIndex') || changed.has('summary')) && state.summary && state.sizeIndex !== null) {
      const select = container.querySelector<HTMLSelectElement>('#size-select');
      if (select) select.value = String(state.sizeIndex);
      renderDetail(state.summary, state.sizeIndex);
    }
  });

  function buildLayout(summary: SweepSummary): void {
    // chart PNGs carry the dataset name and the cell side: a per-size chart (id "angle-2") its own, the others all
    setPngNamer((bundleId) => {
      const sizeIndex = /-(\d+)$/.exec(bundleId);
      const size = sizeIndex ? summary.sizes.find((candidate) => candidate.sizeIndex === Number(sizeIndex[1])) : undefined;
      const sides = size ? [size.cellSize] : summary.sizes.map((candidate) => candidate.cellSize);
      return downloadName(summary.dataset.name, sides, `chart-${bundleId.replace(/-\d+$/, '')}`, 'png');
    });
    const measureSelect = el('select', { id: 'measure-select' }, el('option', { value: 'chi2PerDf' }, 'chi-square / df'), el('option', { value: 'vmr' }, 'VMR'));
    measureSelect.value = measure;
    measureSelect.addEventListener('change', () => {
      measure = measureSelect.value === 'vmr' ? 'vmr' : 'chi2PerDf';
      renderOverview(summary);
    });
    const ordered = orderSizes(summary.sizes);
    const sizeSelect = el('select', { id: 'size-select' }, ...ordered.map((size) => el('option', { value: String(size.sizeIndex) }, sideLabel(size))));
    const twoShapes = new Set(summary.sizes.map((size) => size.shape ?? 'square')).size > 1;
    const sizeTable = sizeTableData(summary);
    const monteCarloTable = monteCarloTableData(summary);
    // against a baseline (issue 15): the area-only and baseline verdicts side by side, as in the report
    const comparison = baselineComparisonTableData(summary);
    sizeSelect.addEventListener('change', () => store.update({ sizeIndex: Number(sizeSelect.value) }));
    clear(
      container,
      // warnings first: a warning that makes a p-value meaningless is read before the p-value
      el('div', { class: 'conclusion-box' }, el('h3', {}, 'In plain words'),
        el('p', { class: 'null-tested', 'data-testid': 'null-tested' }, nullStatement(summary.baseline ?? summary.dataset.baseline)),
        summary.warnings.length > 0 ? el('ul', { class: 'warning-list', 'aria-label': 'Warnings about this run' }, ...summary.warnings.map((warning) => el('li', {}, warning))) : null,
        el('p', { class: 'conclusion', 'data-testid': 'overall-conclusion' }, summary.conclusion),
        twoShapes ? el('p', { class: 'conclusion', 'data-testid': 'shape-sentence' }, `${shapeSentence(summary.sizes)}.`) : null),
      el('h3', {}, twoShapes ? 'All cell sides, squares and hexagons side by side' : 'All cell sides'),
      field('Spread shown', measureSelect),
      overviewBox,
      el('div', { class: 'table-scroll', 'data-testid': 'size-table' }, textTable(sizeTable.caption, sizeTable.head, sizeTable.rows)),
      monteCarloTable ? el('div', { class: 'table-scroll', 'data-testid': 'monte-carlo-table' }, textTable(monteCarloTable.caption, monteCarloTable.head, monteCarloTable.rows)) : null,
      comparison ? el('h3', {}, 'Against area and against the population at risk') : null,
      comparison ? el('p', { class: 'hint', 'data-testid': 'baseline-comparison-note' }, comparison.note) : null,
      comparison ? el('div', { class: 'table-scroll', 'data-testid': 'baseline-comparison' }, textTable(comparison.caption, comparison.head, comparison.rows)) : null,
      el('h3', {}, 'One cell side in detail'),
      field('Cell side', sizeSelect),
      detailBox,
    );
    renderOverview(summary);
  }
}
