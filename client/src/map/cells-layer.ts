/**
 * The chosen placement's grid as one canvas layer drawn from packed rings (squares or hexagons alike): kept cells
 * shaded by count on the sequential ramp, left-out cells hatched in vermillion. Cells outside the view are skipped
 * by their boxes; cells are batched into one path per colour step, and outlines are drawn only while cells are at
 * least a few pixels wide, so 1e5 cells stay responsive. The picked cell is outlined.
 */
import Layer from 'ol/layer/Layer.js';
import type { FrameState } from 'ol/Map.js';
import { NEUTRAL, OKABE_ITO, sequentialColour, withAlpha } from '../charts/palette.js';
import { hatchPattern } from './hatch-pattern.js';
import { prepareFrameCanvas } from './canvas-frame.js';
import type { PackedCells } from './cell-index.js';

/** Colour steps of the count ramp. */
export const RAMP_STEPS = 32;
/** Opacity of the kept cells' shading (the study area shows through a little). */
export const CELL_ALPHA = 0.78;

export class CellsLayer {
  readonly layer: Layer;
  private cells: PackedCells | null = null;
  private highlighted = -1;
  private readonly canvas = document.createElement('canvas');
  private readonly colours = Array.from({ length: RAMP_STEPS }, (_, k) => withAlpha(sequentialColour(k / (RAMP_STEPS - 1)), CELL_ALPHA));
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
    const { context, a, b, c, d, e, f, pixelRatio } = frame;
    const [viewMinX, viewMinY, viewMaxX, viewMaxY] = frameState.extent ?? [-Infinity, -Infinity, Infinity, Infinity];
    const steps = Array.from({ length: RAMP_STEPS }, () => new Path2D());
    const leftOut = new Path2D();
    const maxCount = Math.max(1, cells.maxKeptCount);
    const { vertices, start, boxes, features } = cells;
    let widest = 0;
    const trace = (path: Path2D, k: number) => {
      for (let v = start[k]; v < start[k + 1]; v += 1) {
        const x = vertices[2 * v];
        const y = vertices[2 * v + 1];
        const px = a * x + c * y + e;
        const py = b * x + d * y + f;
        if (v === start[k]) path.moveTo(px, py);
        else path.lineTo(px, py);
      }
      path.closePath();
    };
    for (let k = 0; k < features.length; k += 1) {
      if (boxes[4 * k + 2] < viewMinX || boxes[4 * k] > viewMaxX || boxes[4 * k + 3] < viewMinY || boxes[4 * k + 1] > viewMaxY) continue;
      this.lastDrawn += 1;
      if (widest === 0) widest = Math.hypot(a, b) * (boxes[4 * k + 2] - boxes[4 * k]);
      const properties = features[k].properties;
      if (properties.kept) trace(steps[Math.round((Math.min(properties.count, maxCount) / maxCount) * (RAMP_STEPS - 1))], k);
      else trace(leftOut, k);
    }
    const outlined = widest >= 6 * pixelRatio;
    steps.forEach((path, step) => {
      context.fillStyle = this.colours[step];
      context.fill(path);
      if (outlined) {
        context.strokeStyle = 'rgba(255,255,255,0.9)';
        context.lineWidth = 0.8 * pixelRatio;
        context.stroke(path);
      }
    });
    context.fillStyle = hatchPattern(context, OKABE_ITO.vermillion, Math.round(6 * pixelRatio), null);
    context.fill(leftOut);
    if (outlined) {
      context.strokeStyle = withAlpha(OKABE_ITO.vermillion, 0.8);
      context.lineWidth = 0.8 * pixelRatio;
      context.stroke(leftOut);
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
