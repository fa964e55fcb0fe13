/**
 * Legend entries of the map's layers, drawn two ways from one list: as HTML swatches under the map, and onto the
 * exported PNG (so the file carries its own key).
 */
import { NEUTRAL, sequentialColour, sequentialGradientCss } from '../../../shared/charts/palette.js';
import { el } from '../ui/dom.js';

export type LegendItem =
  | { kind: 'fill'; colour: string; outline?: string; label: string }
  | { kind: 'hatch'; colour: string; label: string }
  | { kind: 'point'; colour: string; hollow?: boolean; label: string }
  /** a line of text saying what a layer's colours mean (wrapped to the width) */
  | { kind: 'note'; label: string }
  /** a colour ramp: the viridis-like sequential ramp, or a linear ramp between two '#rrggbb' colours */
  | { kind: 'ramp'; low: string; high: string; label: string; colours?: readonly [string, string] };

function hatchCss(colour: string): string {
  return `repeating-linear-gradient(45deg, ${colour} 0 2px, #fff 2px 6px)`;
}

/** One legend entry as HTML (the swatch is decoration: the text says what it is). */
export function legendElement(item: LegendItem): HTMLElement {
  if (item.kind === 'note') return el('span', { class: 'legend-note' }, item.label);
  if (item.kind === 'ramp') {
    const ramp = el('span', { class: 'ramp', 'aria-hidden': 'true' });
    ramp.style.background = item.colours ? `linear-gradient(to right, ${item.colours[0]}, ${item.colours[1]})` : sequentialGradientCss();
    return el('span', { class: 'legend-item' }, `${item.label} ${item.low}`, ramp, item.high);
  }
  const box = el('span', { class: item.kind === 'point' ? 'swatch swatch-point' : 'swatch', 'aria-hidden': 'true' });
  if (item.kind === 'hatch') box.style.background = hatchCss(item.colour);
  else if (item.kind === 'point' && item.hollow) box.style.border = `2px solid ${item.colour}`;
  else box.style.background = item.colour;
  if (item.kind === 'fill' && item.outline) box.style.border = `1px solid ${item.outline}`;
  return el('span', { class: 'legend-item' }, box, item.label);
}

/** `text` in lines no wider than `width` with the context's font. */
export function wrapText(context: CanvasRenderingContext2D, text: string, width: number): string[] {
  const lines: string[] = [];
  let line = '';
  for (const word of text.split(/\s+/)) {
    const candidate = line === '' ? word : `${line} ${word}`;
    if (line !== '' && context.measureText(candidate).width > width) {
      lines.push(line);
      line = word;
    } else line = candidate;
  }
  if (line !== '') lines.push(line);
  return lines;
}

/** '#rrggbb' a mixed with b in RGB, t in [0, 1]. */
function mixHex(a: string, b: string, t: number): string {
  const from = Number.parseInt(a.slice(1), 16);
  const to = Number.parseInt(b.slice(1), 16);
  const channel = (shift: number) => Math.round(((from >> shift) & 255) + (((to >> shift) & 255) - ((from >> shift) & 255)) * t);
  return `rgb(${channel(16)}, ${channel(8)}, ${channel(0)})`;
}

const SWATCH = 14;
const GAP = 16;

/** Draws the entries in rows across `width` (CSS pixels, context already scaled); returns the height used. */
export function drawLegend(context: CanvasRenderingContext2D, items: readonly LegendItem[], left: number, top: number, width: number): number {
  context.font = '12px sans-serif';
  context.textBaseline = 'middle';
  let x = left;
  let y = top;
  const lineHeight = SWATCH + 8;
  for (const item of items) {
    if (item.kind === 'note') {
      if (x > left) y += lineHeight;
      context.fillStyle = NEUTRAL.ink;
      for (const line of wrapText(context, item.label, width)) {
        context.fillText(line, left, y + SWATCH / 2);
        y += 16;
      }
      x = left;
      continue;
    }
    const labelWidth = item.kind === 'ramp'
      ? context.measureText(`${item.label} ${item.low}`).width + 6 + 80 + 6 + context.measureText(item.high).width
      : SWATCH + 6 + context.measureText(item.label).width;
    if (x > left && x + labelWidth > left + width) {
      x = left;
      y += lineHeight;
    }
    const middle = y + SWATCH / 2;
    context.fillStyle = NEUTRAL.ink;
    if (item.kind === 'ramp') {
      const head = `${item.label} ${item.low}`;
      context.fillText(head, x, middle);
      const rampLeft = x + context.measureText(head).width + 6;
      for (let k = 0; k < 80; k += 1) {
        context.fillStyle = item.colours ? mixHex(item.colours[0], item.colours[1], k / 79) : sequentialColour(k / 79);
        context.fillRect(rampLeft + k, y + 2, 1, SWATCH - 4);
      }
      context.fillStyle = NEUTRAL.ink;
      context.fillText(item.high, rampLeft + 86, middle);
    } else {
      if (item.kind === 'hatch') {
        context.fillStyle = '#ffffff';
        context.fillRect(x, y, SWATCH, SWATCH);
        context.save();
        context.beginPath();
        context.rect(x, y, SWATCH, SWATCH);
        context.clip();
        context.strokeStyle = item.colour;
        context.lineWidth = 1.5;
        for (let offset = -SWATCH; offset < SWATCH; offset += 5) {
          context.beginPath();
          context.moveTo(x + offset, y + SWATCH);
          context.lineTo(x + offset + SWATCH, y);
          context.stroke();
        }
        context.restore();
        context.strokeStyle = item.colour;
        context.lineWidth = 1;
        context.strokeRect(x + 0.5, y + 0.5, SWATCH - 1, SWATCH - 1);
      } else if (item.kind === 'point') {
        context.beginPath();
        context.arc(x + SWATCH / 2, middle, 4, 0, 2 * Math.PI);
        if (item.hollow) {
          context.strokeStyle = item.colour;
          context.lineWidth = 1.5;
          context.stroke();
        } else {
          context.fillStyle = item.colour;
          context.fill();
        }
      } else {
        context.fillStyle = item.colour;
        context.fillRect(x, y, SWATCH, SWATCH);
        context.strokeStyle = item.outline ?? item.colour;
        context.lineWidth = 1;
        context.strokeRect(x + 0.5, y + 0.5, SWATCH - 1, SWATCH - 1);
      }
      context.fillStyle = NEUTRAL.ink;
      context.fillText(item.label, x + SWATCH + 6, middle);
    }
    x += labelWidth + GAP;
  }
  return y + lineHeight - top;
}
