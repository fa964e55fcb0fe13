/** The scale bar drawn onto the exported map: a round ground length (1, 2 or 5 times a power of ten metres). */
import { NEUTRAL } from '../../../shared/charts/palette.js';

export interface ScaleBar {
  metres: number;
  pixels: number;
  label: string;
}

/**
 * The largest length 1, 2 or 5 × 10^k metres whose bar is at most `maxPixels` long at `metresPerPixel`; null when
 * the scale is not a positive finite number.
 */
export function scaleBar(metresPerPixel: number, maxPixels: number): ScaleBar | null {
  if (!(metresPerPixel > 0) || !Number.isFinite(metresPerPixel) || !(maxPixels > 0)) return null;
  const longest = metresPerPixel * maxPixels;
  const power = 10 ** Math.floor(Math.log10(longest));
  const metres = [5, 2, 1].map((step) => step * power).find((length) => length <= longest * (1 + 1e-12)) ?? power;
  const label = metres >= 1000 ? `${Number((metres / 1000).toPrecision(6))} km` : `${Number(metres.toPrecision(6))} m`;
  return { metres, pixels: metres / metresPerPixel, label };
}

/** Draws the bar (alternating halves, label above) with its left end at (left, bottom), in CSS pixels. */
export function drawScaleBar(context: CanvasRenderingContext2D, bar: ScaleBar, left: number, bottom: number): void {
  const height = 6;
  context.fillStyle = 'rgba(255,255,255,0.85)';
  context.fillRect(left - 6, bottom - height - 22, bar.pixels + 12, height + 28);
  context.fillStyle = NEUTRAL.ink;
  context.fillRect(left, bottom - height, bar.pixels / 2, height);
  context.strokeStyle = NEUTRAL.ink;
  context.lineWidth = 1;
  context.strokeRect(left + 0.5, bottom - height + 0.5, bar.pixels - 1, height - 1);
  context.font = '12px sans-serif';
  context.textBaseline = 'alphabetic';
  context.textAlign = 'left';
  context.fillText('0', left - 3, bottom - height - 5);
  context.textAlign = 'right';
  context.fillText(bar.label, left + bar.pixels + 3, bottom - height - 5);
  context.textAlign = 'left';
}
