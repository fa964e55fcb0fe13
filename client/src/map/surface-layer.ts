/**
 * The stability surface of the chosen cell size as two optional map layers: the excess share (the fraction of
 * placements in which a spot lies in an excess cell, among those in which it lies in a kept cell) and the deficit
 * share, each a 0..1 raster drawn as one image in the working coordinates (the map's projection), pixel edges at
 * x0 + col side, y0 - row side, so planar, EPSG and longitude/latitude data all land where the GeoTIFF says.
 * A share of 0 is transparent and a share of 1 the full colour (opacity grows with the share), so the grid and the
 * study area show through where placements do not agree. Pixels with no value (NaN: outside the valid region, or in
 * no kept cell of any placement) stay transparent.
 */
import Layer from 'ol/layer/Layer.js';
import type { FrameState } from 'ol/Map.js';
import { OKABE_ITO } from '../../../shared/charts/palette.js';
import type { SurfaceFrameMeta } from '../../../shared/binary/page-frames.js';
import { formatNumber } from '../../../shared/format.js';
import { prepareFrameCanvas } from './canvas-frame.js';
import { packHex } from './cell-raster.js';
import type { MapLayerEntry } from './gridshake-map.js';

export interface StabilitySurfaceData {
  meta: SurfaceFrameMeta;
  excess: Float32Array;
  deficit: Float32Array;
}

export type SurfaceKind = 'excess' | 'deficit';

export const SURFACE_COLOURS: Readonly<Record<SurfaceKind, string>> = { excess: OKABE_ITO.vermillion, deficit: OKABE_ITO.blue };
/** Opacity at share 1. */
const FULL_ALPHA = 0.8;
/** Above the grid (20), under the no-data zones (30), the areas' outlines (35) and the points (40). */
const SURFACE_Z_INDEX = 24;

export const SURFACE_LAYER_IDS: Readonly<Record<SurfaceKind, string>> = { excess: 'surface-excess', deficit: 'surface-deficit' };

/** The share at a map coordinate (NaN outside the raster or where it has no value). */
export function shareAt(surface: StabilitySurfaceData, kind: SurfaceKind, x: number, y: number): number {
  const { x0, y0, side, width, height } = surface.meta;
  const col = Math.floor((x - x0) / side);
  const row = Math.floor((y0 - y) / side);
  if (col < 0 || row < 0 || col >= width || row >= height) return Number.NaN;
  return surface[kind][row * width + col]!;
}

/** The raster painted once into an image of width x height pixels (one canvas pixel per raster pixel). */
function paint(surface: StabilitySurfaceData, kind: SurfaceKind): HTMLCanvasElement {
  const { width, height } = surface.meta;
  const canvas = document.createElement('canvas');
  canvas.width = width;
  canvas.height = height;
  const context = canvas.getContext('2d')!;
  const image = context.createImageData(width, height);
  const pixels = new Uint32Array(image.data.buffer);
  const steps = Array.from({ length: 101 }, (_, k) => packHex(SURFACE_COLOURS[kind], (FULL_ALPHA * k) / 100));
  const values = surface[kind];
  for (let k = 0; k < values.length; k++) {
    const share = values[k]!;
    if (share > 0) pixels[k] = steps[Math.round(Math.min(1, share) * 100)]!;
  }
  context.putImageData(image, 0, 0);
  return canvas;
}

class SurfaceLayer {
  readonly layer: Layer;
  private readonly canvas = document.createElement('canvas');
  /** painted at the first frame drawn (a layer never switched on costs nothing) */
  private image: HTMLCanvasElement | null = null;

  constructor(private readonly surface: StabilitySurfaceData, private readonly kind: SurfaceKind) {
    this.layer = new Layer({ render: (frameState) => this.render(frameState), zIndex: SURFACE_Z_INDEX });
    this.layer.set('title', SURFACE_LAYER_IDS[kind]);
    this.canvas.dataset.layer = SURFACE_LAYER_IDS[kind];
  }

  private render(frameState: FrameState): HTMLElement {
    const frame = prepareFrameCanvas(this.canvas, frameState);
    if (!frame) return this.canvas;
    const { context, a, b, c, d, e, f } = frame;
    const { x0, y0, side } = this.surface.meta;
    // raster pixel (col, row) -> map (x0 + col side, y0 - row side) -> device pixels
    context.setTransform(a * side, b * side, -c * side, -d * side, a * x0 + c * y0 + e, b * x0 + d * y0 + f);
    context.imageSmoothingEnabled = false;
    this.image ??= paint(this.surface, this.kind);
    context.drawImage(this.image, 0, 0);
    context.setTransform(1, 0, 0, 1, 0, 0);
    return this.canvas;
  }
}

/** The heading of the stability layers' switches. */
export function stabilityGroup(shape: SurfaceFrameMeta['shape'], cellSize: number): string {
  return `Stability surface, ${shape === 'hex' ? 'hexagons' : 'cells'} of ${formatNumber(cellSize)} m`;
}

/** The legend and list entry of one kind's surface layer. */
export function surfaceLayerEntry(surface: StabilitySurfaceData, kind: SurfaceKind): MapLayerEntry {
  const layer = new SurfaceLayer(surface, kind).layer;
  const side = formatNumber(surface.meta.cellSize);
  const shape = surface.meta.shape === 'hex' ? 'hexagons' : 'cells';
  return {
    id: SURFACE_LAYER_IDS[kind],
    label: kind === 'excess' ? 'Excess share' : 'Deficit share',
    layer,
    group: stabilityGroup(surface.meta.shape, surface.meta.cellSize),
    legend: () => [
      { kind: 'ramp', low: '0', high: '1', colours: ['#ffffff', SURFACE_COLOURS[kind]], label: `${kind} share` },
      {
        kind: 'note',
        label: `${kind === 'excess' ? 'Excess' : 'Deficit'} share, 0 to 1: the fraction of the ${surface.meta.placements} placements (${shape} of ${side} m) ` +
          `in which the spot lies in ${kind === 'excess' ? 'an excess' : 'a deficit'} cell, among those in which it lies in a kept cell (0 clear, 1 full colour).`,
      },
    ],
  };
}
