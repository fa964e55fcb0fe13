/**
 * The chosen placement's grid as one canvas layer drawn from packed rings (squares or hexagons alike): kept cells
 * shaded by count on the sequential ramp, left-out cells hatched in vermillion. Cells outside the view are skipped
 * by their boxes; fills are scan-converted into a pixel buffer (cell-raster.ts), and outlines are drawn only while
 * cells are at least a few pixels wide, so 1e5 cells stay responsive. The picked cell is outlined.
 */
import Layer from 'ol/layer/Layer.js';
import type { FrameState } from 'ol/Map.js';
import { NEUTRAL, OKABE_ITO, sequentialColour, withAlpha } from '../../../shared/charts/palette.js';
import { fillConvex, packHex } from './cell-raster.js';
import { prepareFrameCanvas } from './canvas-frame.js';
import type { PackedCells } from './cell-index.js';

/** Colour steps of the count ramp. */
export const RAMP_STEPS = 32;
/** Opacity of the kept cells' shading (the study area shows through a little). */
export const CELL_ALPHA = 0.78;
/** Cell outlines are drawn only with at most this many cells in view, in paths of OUTLINE_CHUNK cells. */
const OUTLINE_LIMIT = 6000;
const OUTLINE_CHUNK = 64;

export class CellsLayer {
  readonly layer: Layer;
  private cells: PackedCells | null = null;
  private highlighted = -1;
  private readonly canvas = document.createElement('canvas');
  private readonly colours = Array.from({ length: RAMP_STEPS }, (_, k) => packHex(sequentialColour(k / (RAMP_STEPS - 1)), CELL_ALPHA));
  private readonly leftOutColour = packHex(OKABE_ITO.vermillion, 0.9);
  private image: ImageData | null = null;
  /** cells drawn in the last frame */
  lastDrawn = 0;

  constructor() {
    this.layer = new Layer({ render: (frameState) => this.render(frameState), zIndex: 20 });
    this.layer.set('title', 'grid');
  }

  setCells(cells: PackedCells | null): void {
    this.cells = cells;
    this.highlighted = -1;
    this.layer.changed();
  }

  highlight(index: number): void {
    if (index === this.highlighted) return;
    this.highlighted = index;
    this.layer.changed();
  }

  private render(frameState: FrameState): HTMLElement {
    const frame = prepareFrameCanvas(this.canvas, frameState);
    this.lastDrawn = 0;
    const cells = this.cells;
    if (!frame || !cells) return this.canvas;
    const { context, a, b, c, d, e, f, width, height, pixelRatio } = frame;
    const [viewMinX, viewMinY, viewMaxX, viewMaxY] = frameState.extent ?? [-Infinity, -Infinity, Infinity, Infinity];
    if (!this.image || this.image.width !== width || this.image.height !== height) this.image = context.createImageData(width, height);
    const pixels = new Uint32Array(this.image.data.buffer);
    pixels.fill(0);
    const target = { pixels, width, height };
    const maxCount = Math.max(1, cells.maxKeptCount);
    const hatch = Math.max(3, Math.round(6 * pixelRatio));
    const { vertices, start, boxes, features } = cells;
    const xs = new Float64Array(16);
    const ys = new Float64Array(16);
    const visible: number[] = [];
    for (let k = 0; k < features.length; k += 1) {
      if (boxes[4 * k + 2] < viewMinX || boxes[4 * k] > viewMaxX || boxes[4 * k + 3] < viewMinY || boxes[4 * k + 1] > viewMaxY) continue;
      visible.push(k);
      // the closing vertex repeats the first: leave it out
      let count = 0;
      for (let v = start[k]; v < start[k + 1] - 1 && count < 16; v += 1, count += 1) {
        const x = vertices[2 * v];
        const y = vertices[2 * v + 1];
        xs[count] = a * x + c * y + e;
        ys[count] = b * x + d * y + f;
      }
      const properties = features[k].properties;
      if (properties.kept) fillConvex(target, xs, ys, count, this.colours[Math.round((Math.min(properties.count, maxCount) / maxCount) * (RAMP_STEPS - 1))], 0);
      else fillConvex(target, xs, ys, count, this.leftOutColour, hatch);
    }
    this.lastDrawn = visible.length;
    context.putImageData(this.image, 0, 0);
    // outlines only while cells are a few pixels wide (then few are in view); chunked paths keep stroking linear
    const widest = visible.length > 0 ? Math.hypot(a, b) * (boxes[4 * visible[0] + 2] - boxes[4 * visible[0]]) : 0;
    const trace = (path: Path2D, k: number) => {
      for (let v = start[k]; v < start[k + 1]; v += 1) {
        const x = vertices[2 * v];
        const y = vertices[2 * v + 1];
        if (v === start[k]) path.moveTo(a * x + c * y + e, b * x + d * y + f);
        else path.lineTo(a * x + c * y + e, b * x + d * y + f);
      }
      path.closePath();
    };
    if (widest >= 6 * pixelRatio && visible.length <= OUTLINE_LIMIT) {
      context.lineWidth = 0.8 * pixelRatio;
      for (let from = 0; from < visible.length; from += OUTLINE_CHUNK) {
        const kept = new Path2D();
        const leftOut = new Path2D();
        for (const k of visible.slice(from, from + OUTLINE_CHUNK)) trace(features[k].properties.kept ? kept : leftOut, k);
        context.strokeStyle = 'rgba(255,255,255,0.9)';
        context.stroke(kept);
        context.strokeStyle = withAlpha(OKABE_ITO.vermillion, 0.8);
        context.stroke(leftOut);
      }
    }
    if (this.highlighted >= 0 && this.highlighted < features.length) {
      const path = new Path2D();
      trace(path, this.highlighted);
      context.strokeStyle = NEUTRAL.ink;
      context.lineWidth = 2.5 * pixelRatio;
      context.stroke(path);
    }
    return this.canvas;
  }
}
