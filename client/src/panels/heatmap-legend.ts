/** The colour key of the offset heat map: the sequential ramp between the VMR values at its ends (see colourRange). */
import type { ChartBundle } from '../../../shared/charts/chart-spec.js';
import { sequentialGradientCss } from '../../../shared/charts/palette.js';
import { el } from '../ui/dom.js';

export function heatmapLegend(bundle: ChartBundle): HTMLElement {
  const range = bundle.spec.data.datasets[0]?.colourRange as { low: number | null; high: number | null; widened: boolean } | undefined;
  const low = range?.low ?? null;
  const high = range?.high ?? null;
  const bar = el('span', { class: 'ramp', 'aria-hidden': 'true' });
  bar.style.background = sequentialGradientCss();
  return el(
    'p',
    { class: 'ramp-legend' },
    el('span', {}, `mean VMR ${low === null ? '-' : low.toPrecision(3)}`),
    bar,
    el('span', {}, `${high === null ? '-' : high.toPrecision(3)}`),
    el('span', { class: 'field-hint' }, `${range?.widened ? ' (range widened: the bins differ little)' : ''}; light grey: no placement in that bin`),
  );
}
