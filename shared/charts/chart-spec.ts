import { NEUTRAL } from './palette.js';

/**
 * A chart.js configuration as plain JSON (no functions), so that the page and the single-file report build the
 * same charts from the same definitions: the page passes it to `new Chart`, the report embeds it as JSON.
 */
export interface ChartSpec {
  type: 'bar' | 'line' | 'scatter';
  data: { labels?: string[]; datasets: Record<string, unknown>[] };
  options: Record<string, unknown>;
}

/** A chart with its identity, title and a text table of the same numbers (for screen readers and print). */
export interface ChartBundle {
  id: string;
  title: string;
  spec: ChartSpec;
  table: { caption: string; head: string[]; rows: string[][] };
}

export interface AxisTitles {
  x: string;
  y: string;
}

const FONT = { family: 'system-ui, -apple-system, "Segoe UI", Roboto, sans-serif', size: 12 };

/** One axis: linear or category, titled with its quantity and unit. */
export function axis(title: string, extra: Record<string, unknown> = {}): Record<string, unknown> {
  return {
    title: { display: true, text: title, color: NEUTRAL.ink, font: { ...FONT, size: 12, weight: 'bold' } },
    ticks: { color: NEUTRAL.ink, font: FONT },
    grid: { color: 'rgba(0, 0, 0, 0.08)' },
    ...extra,
  };
}

/** Options every chart shares: no animation (PNG and print are drawn at once), title, subtitle, legend. */
export function baseOptions(title: string, subtitle: string[], scales: Record<string, unknown>): Record<string, unknown> {
  return {
    animation: false,
    responsive: true,
    maintainAspectRatio: false,
    plugins: {
      title: { display: true, text: title, color: NEUTRAL.ink, font: { ...FONT, size: 15, weight: 'bold' } },
      subtitle: { display: subtitle.length > 0, text: subtitle, color: NEUTRAL.ink, font: FONT },
      legend: { position: 'bottom', labels: { color: NEUTRAL.ink, font: FONT, usePointStyle: true } },
    },
    scales,
  };
}
