/**
 * The few functions a chart needs at draw time, shared by the page and the report. Each is self-contained (no
 * imports, no outside names) because the report embeds their source text in its inline script.
 */

/**
 * Adds the callbacks a JSON chart spec cannot carry: the legend skips datasets marked `legendHidden`. Returns the
 * same object.
 */
export function hydrateChartSpec(spec: any): any {
  const options = spec.options || (spec.options = {});
  const plugins = options.plugins || (options.plugins = {});
  const legend = plugins.legend || (plugins.legend = {});
  const labels = legend.labels || (legend.labels = {});
  labels.filter = function (item: any, data: any) {
    const dataset = data.datasets[item.datasetIndex];
    return !(dataset && dataset.legendHidden);
  };
  // a data point that carries its own tooltip text (`tip`, e.g. which placement a dot is) shows it
  const tooltip = plugins.tooltip || (plugins.tooltip = {});
  const callbacks = tooltip.callbacks || (tooltip.callbacks = {});
  if (!callbacks.label) {
    callbacks.label = function (context: any) {
      const raw = context.raw;
      if (raw && typeof raw.tip === 'string') return raw.tip;
      const label = context.dataset && context.dataset.label ? context.dataset.label + ': ' : '';
      return label + context.formattedValue;
    };
  }
  return spec;
}

/** A chart.js plugin that paints the canvas white before each draw, so PNG exports and prints have a background. */
export function whiteBackgroundPlugin(): any {
  return {
    id: 'gridshakeWhiteBackground',
    beforeDraw: function (chart: any) {
      const context = chart.canvas.getContext('2d');
      context.save();
      context.globalCompositeOperation = 'destination-over';
      context.fillStyle = '#ffffff';
      context.fillRect(0, 0, chart.width, chart.height);
      context.restore();
    },
  };
}
