/**
 * The points as one canvas layer drawn straight from typed arrays (no feature objects), so 1e5 points redraw in a
 * few milliseconds while panning and zooming. Decimation on screen: a point is drawn only when no earlier point
 * already marked its marker-sized square of the screen, so dense areas cost one mark per square, not one per point.
 * Points inside the valid region are solid; points outside it (never counted) are hollow in reddish purple.
 */
import Layer from 'ol/layer/Layer.js';
import type { FrameState } from 'ol/Map.js';
import { NEUTRAL, OKABE_ITO } from '../../../shared/charts/palette.js';
import { prepareFrameCanvas } from './canvas-frame.js';

export interface PointData {
  /** x,y interleaved, working coordinates */
  xy: Float64Array;
  /** 1 inside the valid region, 0 outside */
  inside: Uint8Array;
}

export class PointsLayer {
  readonly layer: Layer;
  private data: PointData | null = null;
  /** draw the inside points hollow-white (over a shaded grid) rather than solid ink */
  private overGrid = false;
  private readonly canvas = document.createElement('canvas');
  /** points actually marked in the last frame (after decimation) */
  lastDrawn = 0;

  constructor() {
    this.layer = new Layer({ render: (frameState) => this.render(frameState), zIndex: 40 });
    this.layer.set('title', 'points');
  }

  setData(data: PointData | null): void {
    this.data = data;
    this.layer.changed();
  }

  setOverGrid(overGrid: boolean): void {
    this.overGrid = overGrid;
    this.layer.changed();
  }

  private render(frameState: FrameState): HTMLElement {
    const frame = prepareFrameCanvas(this.canvas, frameState);
    this.lastDrawn = 0;
    if (!frame || !this.data) return this.canvas;
    const { context, a, b, c, d, e, f, width, height, pixelRatio } = frame;
    const { xy, inside } = this.data;
    const count = inside.length;
    const radius = Math.max(1, Math.round((count > 3000 ? 1.2 : 1.8) * pixelRatio));
    const side = 2 * radius + 1;
    const columns = Math.ceil(width / side) + 1;
    const rows = Math.ceil(height / side) + 1;
    const taken = new Uint8Array(columns * rows);
    const solid = new Path2D();
    const hollow = new Path2D();
    for (let k = 0; k < count; k += 1) {
      const x = xy[2 * k];
      const y = xy[2 * k + 1];
      const px = a * x + c * y + e;
      const py = b * x + d * y + f;
      if (px < -side || py < -side || px > width + side || py > height + side) continue;
      const column = Math.max(0, Math.floor(px / side));
      const row = Math.max(0, Math.floor(py / side));
      const slot = Math.min(rows - 1, row) * columns + Math.min(columns - 1, column);
      const mark = inside[k] === 1 ? 1 : 2;
      if ((taken[slot] & mark) !== 0) continue;
      taken[slot] |= mark;
      this.lastDrawn += 1;
      if (mark === 1) solid.rect(Math.round(px) - radius, Math.round(py) - radius, side, side);
      else hollow.rect(Math.round(px) - radius - 1, Math.round(py) - radius - 1, side + 2, side + 2);
    }
    if (this.overGrid) {
      context.fillStyle = NEUTRAL.paper;
      context.fill(solid);
      context.strokeStyle = NEUTRAL.ink;
      context.lineWidth = Math.max(1, 0.6 * pixelRatio);
      context.stroke(solid);
    } else {
      context.fillStyle = NEUTRAL.ink;
      context.fill(solid);
    }
    context.strokeStyle = OKABE_ITO.reddishPurple;
    context.lineWidth = 1.2 * pixelRatio;
    context.stroke(hollow);
    return this.canvas;
  }
}
