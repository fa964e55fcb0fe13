/**
 * The current view as a PNG: every layer canvas of the map composited in order on a white background (as the
 * library's own export example does: each canvas with its CSS transform and its layer's opacity), then the scale
 * bar on the map and a band below with the title, the legend of the visible layers and the privacy note.
 */
import type OlMap from 'ol/Map.js';
import { NEUTRAL } from '../../../shared/charts/palette.js';
import { drawLegend, wrapText, type LegendItem } from './map-legend.js';
import { drawScaleBar, scaleBar } from './scale-bar.js';

export interface ExportText {
  title: string;
  note: string;
}

/** The 2D matrix (CSS pixels per canvas pixel) with which a layer canvas is shown in the viewport. */
function canvasMatrix(canvas: HTMLCanvasElement): [number, number, number, number, number, number] {
  const match = /^matrix\(([^)]*)\)$/.exec(canvas.style.transform);
  if (match) {
    const values = (match[1] ?? '').split(',').map(Number);
    if (values.length === 6 && values.every(Number.isFinite)) return values as [number, number, number, number, number, number];
  }
  const width = Number.parseFloat(canvas.style.width) || canvas.width;
  const height = Number.parseFloat(canvas.style.height) || canvas.height;
  return [width / canvas.width, 0, 0, height / canvas.height, 0, 0];
}

export function composeMapImage(map: OlMap, metresPerPixel: number, legend: readonly LegendItem[], text: ExportText): HTMLCanvasElement {
  const [width, height] = map.getSize() ?? [0, 0];
  const ratio = window.devicePixelRatio || 1;
  // measure the band first on a scratch context
  const scratch = document.createElement('canvas').getContext('2d')!;
  scratch.font = '12px sans-serif';
  const legendHeight = drawLegend(scratch, legend, 10, 0, width - 20);
  scratch.font = '11px sans-serif';
  const noteLines = wrapText(scratch, text.note, width - 20);
  scratch.font = 'bold 13px sans-serif';
  const titleLines = wrapText(scratch, text.title, width - 20);
  const band = 10 + titleLines.length * 17 + 6 + legendHeight + 4 + noteLines.length * 14 + 8;

  const output = document.createElement('canvas');
  output.width = Math.round(width * ratio);
  output.height = Math.round((height + band) * ratio);
  const context = output.getContext('2d')!;
  context.fillStyle = NEUTRAL.paper;
  context.fillRect(0, 0, output.width, output.height);
  for (const canvas of Array.from(map.getViewport()?.querySelectorAll<HTMLCanvasElement>('.ol-layers canvas') ?? [])) {
    if (canvas.width === 0 || canvas.height === 0) continue;
    const container = canvas.parentElement;
    const opacity = container?.style.opacity || canvas.style.opacity;
    context.globalAlpha = opacity === '' || opacity === undefined ? 1 : Number(opacity);
    const [a, b, c, d, e, f] = canvasMatrix(canvas);
    context.setTransform(a * ratio, b * ratio, c * ratio, d * ratio, e * ratio, f * ratio);
    context.drawImage(canvas, 0, 0);
  }
  context.globalAlpha = 1;
  context.setTransform(ratio, 0, 0, ratio, 0, 0);
  const bar = scaleBar(metresPerPixel, Math.min(160, width / 3));
  if (bar) drawScaleBar(context, bar, 16, height - 12);
  context.strokeStyle = NEUTRAL.lightGrey;
  context.strokeRect(0.5, 0.5, width - 1, height - 1);
  let y = drawTextLines(context, titleLines, 'bold 13px sans-serif', 17, height + 10) + 6;
  y += drawLegend(context, legend, 10, y, width - 20) + 4;
  drawTextLines(context, noteLines, '11px sans-serif', 14, y);
  return output;
}

/** Writes lines of ink text from the left margin downwards, starting at y; returns the y below the last line. */
function drawTextLines(context: CanvasRenderingContext2D, lines: readonly string[], font: string, lineHeight: number, y: number): number {
  context.fillStyle = NEUTRAL.ink;
  context.textBaseline = 'top';
  context.font = font;
  let top = y;
  for (const line of lines) {
    context.fillText(line, 10, top);
    top += lineHeight;
  }
  return top;
}
