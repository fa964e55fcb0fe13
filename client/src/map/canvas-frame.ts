/**
 * Shared by the custom canvas layers: a canvas sized to the map's frame (device pixels) and the affine transform from
 * map coordinates to device pixels of that frame.
 */
import type { FrameState } from 'ol/Map.js';

export interface FramePixels {
  context: CanvasRenderingContext2D;
  /** map x,y to device pixels: px = a·x + c·y + e, py = b·x + d·y + f */
  a: number;
  b: number;
  c: number;
  d: number;
  e: number;
  f: number;
  width: number;
  height: number;
  pixelRatio: number;
}

/** Sizes `canvas` to the frame, clears it and returns its context with the coordinate transform. */
export function prepareFrameCanvas(canvas: HTMLCanvasElement, frameState: FrameState): FramePixels | null {
  const ratio = frameState.pixelRatio;
  const [cssWidth, cssHeight] = frameState.size;
  const width = Math.round(cssWidth * ratio);
  const height = Math.round(cssHeight * ratio);
  if (canvas.width !== width) canvas.width = width;
  if (canvas.height !== height) canvas.height = height;
  canvas.style.position = 'absolute';
  canvas.style.left = '0';
  canvas.style.top = '0';
  canvas.style.width = `${cssWidth}px`;
  canvas.style.height = `${cssHeight}px`;
  const context = canvas.getContext('2d');
  if (!context) return null;
  context.setTransform(1, 0, 0, 1, 0, 0);
  context.clearRect(0, 0, width, height);
  const t = frameState.coordinateToPixelTransform;
  return { context, a: t[0] * ratio, b: t[1] * ratio, c: t[2] * ratio, d: t[3] * ratio, e: t[4] * ratio, f: t[5] * ratio, width, height, pixelRatio: ratio };
}
