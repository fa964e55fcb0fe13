/**
 * Chart layout for narrow screens (phones from 360 px): titles, subtitles and axis titles wrapped into lines that
 * fit the canvas, smaller type, and padding between the title block and the plot so that nothing runs together.
 * Changes only text layout; the data and the wide-screen charts (and PNGs drawn wide) stay as they are.
 */

/** Splits `text` into lines of at most `width` characters at spaces (a longer word stays whole). */
export function wrapText(text: string, width: number): string[] {
  const lines: string[] = [];
  let line = '';
  for (const word of text.split(/\s+/).filter((part) => part !== '')) {
    if (line !== '' && line.length + 1 + word.length > width) {
      lines.push(line);
      line = word;
    } else {
      line = line === '' ? word : `${line} ${word}`;
    }
  }
  if (line !== '') lines.push(line);
  return lines;
}

/** Below this canvas width (CSS pixels) the narrow layout applies. */
export const NARROW_CHART_WIDTH = 640;

const asLines = (text: unknown): string[] => (Array.isArray(text) ? text.map(String) : text === undefined ? [] : [String(text)]);

/** Adapts a chart.js options object in place for a canvas `width` px wide; returns it. */
export function narrowLayout(options: any, width: number): any {
  if (!(width < NARROW_CHART_WIDTH)) return options;
  // about 7 px a character at 13 px bold, 6 px at 11 px
  const titleChars = Math.max(24, Math.floor((width - 16) / 7.5));
  const smallChars = Math.max(28, Math.floor((width - 16) / 6.2));
  const plugins = options.plugins ?? (options.plugins = {});
  if (plugins.title) {
    plugins.title.text = asLines(plugins.title.text).flatMap((line) => wrapText(line, titleChars));
    plugins.title.font = { ...(plugins.title.font ?? {}), size: 13 };
    plugins.title.padding = { top: 4, bottom: 2 };
  }
  if (plugins.subtitle) {
    plugins.subtitle.text = asLines(plugins.subtitle.text).flatMap((line) => wrapText(line, smallChars));
    plugins.subtitle.font = { ...(plugins.subtitle.font ?? {}), size: 11 };
    plugins.subtitle.padding = { top: 0, bottom: 10 };
  }
  if (plugins.legend?.labels) {
    plugins.legend.labels.font = { ...(plugins.legend.labels.font ?? {}), size: 11 };
    plugins.legend.labels.boxWidth = 10;
    plugins.legend.labels.padding = 6;
  }
  for (const scale of Object.values(options.scales ?? {}) as any[]) {
    if (scale?.title?.text !== undefined) {
      scale.title.text = asLines(scale.title.text).flatMap((line) => wrapText(line, smallChars));
      scale.title.font = { ...(scale.title.font ?? {}), size: 11 };
    }
    if (scale?.ticks) scale.ticks.font = { ...(scale.ticks.font ?? {}), size: 10 };
  }
  return options;
}
