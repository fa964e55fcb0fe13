/**
 * The control points of a controls baseline (issue 15) as an optional map layer of their own, distinct from the cases:
 * small orange diamonds with a dark rim (the cases are solid ink squares), under the cases and over the grid, drawn
 * straight from a typed array with the points layer's screen decimation (one mark per marker-sized square of screen).
 * Controls can be as personal as the cases: the same privacy caution applies to exported maps.
 */
import Layer from 'ol/layer/Layer.js';
import type { FrameState } from 'ol/Map.js';
import type { DatasetGeometry } from '../api/api-client.js';
import { NEUTRAL, OKABE_ITO } from '../../../shared/charts/palette.js';
import { prepareFrameCanvas } from './canvas-frame.js';
import type { MapLayerEntry } from './gridshake-map.js';

export const CONTROLS_LAYER_ID = 'controls';

/** Above the grid (20), below the no-data hatching (30) and the cases (40). */
const CONTROLS_Z_INDEX = 25;

/** The colour of a control mark (and its legend swatch). */
export const CONTROL_COLOUR = OKABE_ITO.orange;

function drawControls(canvas: HTMLCanvasElement, frameState: FrameState, xy: Float64Array): HTMLElement {
  const frame = prepareFrameCanvas(canvas, frameState);
  if (!frame) return canvas;
  const { context, a, b, c, d, e, f, width, height, pixelRatio } = frame;
  const count = xy.length / 2;
  const radius = Math.max(2, Math.round(2.2 * pixelRatio));
  const side = 2 * radius + 1;
  const columns = Math.ceil(width / side) + 1;
  const rows = Math.ceil(height / side) + 1;
  const taken = new Uint8Array(columns * rows);
  const marks = new Path2D();
  for (let k = 0; k < count; k += 1) {
    const px = a * xy[2 * k]! + c * xy[2 * k + 1]! + e;
    const py = b * xy[2 * k]! + d * xy[2 * k + 1]! + f;
    if (px < -side || py < -side || px > width + side || py > height + side) continue;
    const slot = Math.min(rows - 1, Math.max(0, Math.floor(py / side))) * columns + Math.min(columns - 1, Math.max(0, Math.floor(px / side)));
    if (taken[slot] === 1) continue;
    taken[slot] = 1;
    const x = Math.round(px);
    const y = Math.round(py);
    marks.moveTo(x, y - radius);
    marks.lineTo(x + radius, y);
    marks.lineTo(x, y + radius);
    marks.lineTo(x - radius, y);
    marks.closePath();
  }
  context.fillStyle = CONTROL_COLOUR;
  context.fill(marks);
  context.strokeStyle = NEUTRAL.ink;
  context.lineWidth = Math.max(1, 0.5 * pixelRatio);
  context.stroke(marks);
  return canvas;
}

/** The layer entry for the map's list and legend, or null when the dataset has no control points to draw. */
export function controlsLayerEntry(geometry: DatasetGeometry | null): MapLayerEntry | null {
  const controls = geometry?.controls;
  if (!controls || controls.points.length === 0) return null;
  const xy = Float64Array.from(controls.points);
  const canvas = document.createElement('canvas');
  const layer = new Layer({ render: (frameState) => drawControls(canvas, frameState, xy), zIndex: CONTROLS_Z_INDEX });
  layer.set('title', CONTROLS_LAYER_ID);
  const drawn = xy.length / 2;
  return {
    id: CONTROLS_LAYER_ID,
    label: `Control points (${drawn === controls.total ? drawn : `${drawn} of ${controls.total}`})`,
    layer,
    legend: () => [{ kind: 'point', colour: CONTROL_COLOUR, label: 'control point (population at risk)' }],
  };
}
