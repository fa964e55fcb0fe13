/** The colour key of the offset heat map: the sequential ramp from the lowest to the highest bin mean. */
import type { ChartBundle } from '../charts/chart-spec.js';
import { sequentialGradientCss } from '../charts/palette.js';
import { el } from '../ui/dom.js';

export function heatmapLegend(bundle: ChartBundle): HTMLElement {
  const means = bundle.spec.data.datasets.flatMap((dataset) => (dataset.meanVmr as (number | null)[]) ?? []).filter((value): value is number => value !== null);
  const low = means.length > 0 ? Math.min(...means) : null;
  const high = means.length > 0 ? Math.max(...means) : null;
  const bar = el('span', { class: 'ramp', 'aria-hidden': 'true' });
  bar.style.background = sequentialGradientCss();
  return el(
    'p',
    { class: 'ramp-legend' },
    el('span', {}, `mean VMR ${low === null ? '-' : low.toPrecision(3)}`),
    bar,
    el('span', {}, `${high === null ? '-' : high.toPrecision(3)}`),
    el('span', { class: 'field-hint' }, ' light grey: no placement in that bin'),
  );
}
