/**
 * Step 5: the downloads. Every chart as PNG, the per-placement CSV, the grid shown on the map as GeoJSON or
 * GeoPackage, and the single-file HTML report (the same template `gridshake sweep --out` writes).
 */
import { downloads } from '../api/api-client.js';
import type { Store } from '../app-state.js';
import { formatMetres } from '../../../shared/format.js';
import { chartViews } from '../ui/chart-view.js';
import { clear, el } from '../ui/dom.js';
import { downloadName } from '../../../shared/messages/download-names.js';

export function initReportPanel(container: HTMLElement, store: Store): void {
  const render = () => {
    const { summary, sweepId, placement } = store.state;
    if (!summary || !sweepId) {
      clear(container, el('p', { class: 'hint' }, 'Downloads appear here when a sweep has finished.'));
      return;
    }
    const pngList = el(
      'ul',
      { class: 'download-list', 'aria-label': 'Charts as PNG' },
      ...[...chartViews.entries()].map(([id, view]) => {
        const button = el('button', { type: 'button', class: 'button button-small', 'data-png-download': id }, `${view.title} (PNG)`);
        button.addEventListener('click', () => view.downloadPng());
        return el('li', {}, button);
      }),
    );
    const sides = summary.sizes.map((candidate) => candidate.cellSize);
    const named = (what: string, extension: string, only?: number) => downloadName(summary.dataset.name, only === undefined ? sides : [only], what, extension);
    const size = placement ? summary.sizes.find((candidate) => candidate.sizeIndex === placement.sizeIndex) : undefined;
    const gridLink = placement && size
      ? el('div', { class: 'download-row' },
          el('a', { class: 'button', id: 'download-grid', href: downloads.grid(sweepId, placement.sizeIndex, placement.placementIndex), download: named(`grid-placement-${placement.placementIndex}`, 'geojson', size.cellSize) }, `Grid on the map (${formatMetres(size.cellSize)}, placement ${placement.placementIndex}) as GeoJSON`),
          el('a', { class: 'button', id: 'download-grid-gpkg', href: downloads.gridGeoPackage(sweepId, placement.sizeIndex, placement.placementIndex), download: named(`grid-placement-${placement.placementIndex}`, 'gpkg', size.cellSize) }, 'as GeoPackage'),
        )
      : el('p', { class: 'hint' }, 'Show a placement on the map to download its grid as GeoJSON (longitude/latitude where the coordinate system is known) or GeoPackage.');
    clear(
      container,
      el('p', {}, 'Attach the HTML report to your own: it holds the dataset summary, plan, charts, tables, methods, versions, seed and cautions, works offline and prints cleanly to PDF.'),
      el('div', { class: 'download-row' },
        el('a', { class: 'button button-primary', id: 'download-report', href: downloads.report(sweepId), download: named('report', 'html') }, 'HTML report'),
        el('a', { class: 'button', id: 'download-csv', href: downloads.placementsCsv(sweepId), download: named('placements', 'csv') }, 'Placements (CSV)'),
      ),
      el('h3', {}, 'Chosen grid'),
      gridLink,
      el('h3', {}, 'Charts'),
      pngList,
    );
  };
  store.subscribe((_state, changed) => {
    if (changed.has('summary') || changed.has('sweepId') || changed.has('placement') || changed.has('sizeIndex')) queueMicrotask(render);
  });
}
