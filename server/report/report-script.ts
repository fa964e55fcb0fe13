/**
 * The inline script of the report: draws every chart from its embedded JSON spec with the bundled chart.js, using
 * the same runtime helpers as the page (their source text is embedded, so the definitions are shared).
 */
import { hydrateChartSpec, whiteBackgroundPlugin } from '../../shared/charts/chart-runtime.js';
import type { ChartSpec } from '../../shared/charts/chart-spec.js';
import { jsonForScript } from './html-escape.js';

/** Canvas size of report charts (CSS pixels); fixed so that print and screen draw the same picture. */
export const REPORT_CHART_SIZE = { width: 900, height: 420 };

export function reportChartScript(specs: Record<string, ChartSpec>): string {
  return `
(function () {
  var hydrateChartSpec = ${hydrateChartSpec.toString()};
  var whiteBackgroundPlugin = ${whiteBackgroundPlugin.toString()};
  var specs = ${jsonForScript(specs)};
  if (typeof Chart === 'undefined') return;
  Chart.register(whiteBackgroundPlugin());
  Object.keys(specs).forEach(function (id) {
    var canvas = document.getElementById('chart-' + id);
    if (!canvas) return;
    var spec = hydrateChartSpec(specs[id]);
    spec.options.responsive = false;
    spec.options.devicePixelRatio = 2;
    new Chart(canvas, spec);
  });
})();
`;
}
