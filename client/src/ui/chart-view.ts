/**
 * One chart on the page: a canvas drawn by chart.js from a shared ChartSpec, a PNG download (white background,
 * title, axis titles with units) and the same numbers as a text table for screen readers (shown on request).
 */
import { Chart, registerables, type ChartConfiguration } from 'chart.js';
import { hydrateChartSpec, whiteBackgroundPlugin } from '../../../shared/charts/chart-runtime.js';
import type { ChartBundle } from '../../../shared/charts/chart-spec.js';
import { el, textTable } from './dom.js';
import { NARROW_CHART_WIDTH, narrowLayout } from '../charts/narrow-layout.js';

Chart.register(...registerables, whiteBackgroundPlugin());

/** Called with the dataset and point index that was clicked. */
export type ChartClick = (datasetIndex: number, index: number) => void;

/** Every chart view on the page by bundle id, for the report step's PNG downloads and for tests. */
export const chartViews = new Map<string, ChartView>();

/** The PNG file name of a chart; the results panel sets it to carry the dataset name and cell side. */
let pngName = (bundleId: string): string => `gridshake-${bundleId}.png`;
export function setPngNamer(namer: (bundleId: string) => string): void {
  pngName = namer;
}

export class ChartView {
  readonly element: HTMLElement;
  private chart: Chart | null = null;
  private readonly canvas: HTMLCanvasElement;
  private readonly tableBox: HTMLElement;

  constructor(private bundle: ChartBundle, private readonly onClick?: ChartClick, clickHint?: string) {
    this.canvas = el('canvas', { id: `chart-${bundle.id}`, role: 'img', 'aria-label': bundle.title });
    this.tableBox = el('div', { class: 'chart-table sr-only', id: `table-${bundle.id}` });
    const toggle = el('button', { type: 'button', class: 'button button-small', 'aria-controls': this.tableBox.id, 'aria-expanded': 'false' }, 'Show the numbers');
    toggle.addEventListener('click', () => {
      const hidden = this.tableBox.classList.toggle('sr-only');
      toggle.setAttribute('aria-expanded', String(!hidden));
      toggle.textContent = hidden ? 'Show the numbers' : 'Hide the numbers';
    });
    const png = el('button', { type: 'button', class: 'button button-small', 'data-png': bundle.id }, 'Download PNG');
    png.addEventListener('click', () => this.downloadPng());
    this.element = el(
      'figure',
      { class: 'chart-figure', 'data-chart': bundle.id },
      el('div', { class: 'chart-box' }, this.canvas),
      el('figcaption', { class: 'chart-actions' }, png, toggle, clickHint ? el('span', { class: 'field-hint' }, clickHint) : null),
      this.tableBox,
    );
    chartViews.set(bundle.id, this);
  }

  /** Draws (or redraws) the chart; call once the element is in the document. */
  render(bundle: ChartBundle = this.bundle): void {
    this.bundle = bundle;
    this.chart?.destroy();
    const spec = hydrateChartSpec(structuredClone(bundle.spec));
    spec.options.devicePixelRatio = Math.max(2, window.devicePixelRatio || 1);
    narrowLayout(spec.options, this.canvas.parentElement?.clientWidth ?? NARROW_CHART_WIDTH);
    if (this.onClick) {
      const onClick = this.onClick;
      spec.options.onClick = (_event: unknown, elements: { datasetIndex: number; index: number }[]) => {
        if (elements.length > 0) onClick(elements[0].datasetIndex, elements[0].index);
      };
      spec.options.onHover = (event: { native?: { target?: HTMLElement } }, elements: unknown[]) => {
        if (event.native?.target) event.native.target.style.cursor = elements.length > 0 ? 'pointer' : 'default';
      };
    }
    this.chart = new Chart(this.canvas, spec as ChartConfiguration);
    this.tableBox.replaceChildren(textTable(bundle.table.caption, bundle.table.head, bundle.table.rows));
  }

  get title(): string {
    return this.bundle.title;
  }

  pngDataUrl(): string {
    return this.chart ? this.chart.toBase64Image('image/png', 1) : '';
  }

  downloadPng(): void {
    const link = el('a', { href: this.pngDataUrl(), download: pngName(this.bundle.id) });
    document.body.append(link);
    link.click();
    link.remove();
  }

  destroy(): void {
    this.chart?.destroy();
    this.chart = null;
    if (chartViews.get(this.bundle.id) === this) chartViews.delete(this.bundle.id);
  }
}
