/** The dataset summary and every input warning, as a definition list and a list. */
import type { StoredDataset } from '../api/api-client.js';
import { datasetSummaryEntries, warningRecords } from '../../../shared/charts/dataset-entries.js';
import { formatMetres, formatNumber } from '../../../shared/format.js';
import { el } from '../ui/dom.js';
import { warningTitle } from '../../../shared/messages/warning-titles.js';

export function datasetSummaryView(dataset: StoredDataset): HTMLElement {
  const entries: [string, string][] = [
    ...datasetSummaryEntries(dataset),
    ['Suggested cell sides', dataset.suggestedCellSizes.map((size) => `${formatMetres(size.cellSize)} (${formatNumber(size.perCell)} per cell)`).join(', ')],
  ];
  const list = el('dl', { class: 'summary-list', 'data-testid': 'dataset-summary' }, ...entries.flatMap(([term, value]) => [el('dt', {}, term), el('dd', {}, value)]));
  const warnings = dataset.warnings.length === 0
    ? el('p', { class: 'hint' }, 'The inputs raised no warnings.')
    : el(
        'ul',
        { class: 'warning-list', 'aria-label': 'Input warnings' },
        ...dataset.warnings.map((warning) =>
          el('li', { 'data-warning': warning.code }, el('strong', {}, `${warningTitle(warning.code)}: `), warning.message, warningRecords(warning)),
        ),
      );
  return el('div', { class: 'dataset-summary' }, el('h3', {}, 'Summary'), list, el('h3', {}, `Warnings (${dataset.warnings.length})`), warnings);
}
