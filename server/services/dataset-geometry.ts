/**
 * What the page needs to draw a dataset: the study area, the no-data zones and the points (and the control points of
 * a controls baseline), decimated for large sets.
 * Decimation is a deterministic stride: every k-th point with k = ceil(n / maxPoints), so the same dataset always
 * draws the same points, and the drawn ones are spread over the file order (cost O(n / k)).
 */
import type { Dataset, DatasetGeometry } from '../../shared/contracts.js';
import { isEveryPointInside } from '../inputs/inside-points.js';

export const DEFAULT_DRAWN_POINTS = 5000;

/** The baseline pieces as closed GeoJSON-style rings with their density per km². Cost O(vertices). */
function baselineLayer(dataset: Dataset): DatasetGeometry['baseline'] {
  const engine = dataset.baseline?.engine;
  if (engine === undefined || engine.kind !== 'polygons') return undefined;
  const polygons = engine.pieces.map((piece, p) => ({
    rings: piece.rings.map((ring) => {
      const closed: number[][] = [];
      for (let k = 0; k < ring.length; k += 2) closed.push([ring[k]!, ring[k + 1]!]);
      if (closed.length > 0) closed.push([...closed[0]!]);
      return closed;
    }),
    density: (engine.counts[p]! / piece.area) * 1e6,
  }));
  return { polygons, maxDensity: Math.max(0, ...polygons.map((polygon) => polygon.density)) };
}

/** The control points inside V, every k-th with k = ceil(total / maxPoints) (the points' rule). Cost O(total / k). */
function controlsLayer(dataset: Dataset, maxPoints: number): DatasetGeometry['controls'] {
  const engine = dataset.baseline?.engine;
  if (engine === undefined || engine.kind !== 'controls') return undefined;
  const total = engine.controls.length / 2;
  const stride = Math.max(1, Math.ceil(total / Math.max(1, maxPoints)));
  const points: number[] = [];
  for (let index = 0; index < total; index += stride) points.push(engine.controls[2 * index]!, engine.controls[2 * index + 1]!);
  return { points, total, stride };
}

export function datasetGeometry(dataset: Dataset, maxPoints: number = DEFAULT_DRAWN_POINTS): DatasetGeometry {
  const totalPoints = dataset.xy.length / 2;
  const stride = Math.max(1, Math.ceil(totalPoints / Math.max(1, maxPoints)));
  const isInside = new Uint8Array(totalPoints);
  if (isEveryPointInside(dataset)) isInside.fill(1);
  else for (const index of dataset.inside) isInside[index] = 1;
  const points: number[] = [];
  const pointInside: number[] = [];
  for (let index = 0; index < totalPoints; index += stride) {
    points.push(dataset.xy[2 * index] as number, dataset.xy[2 * index + 1] as number);
    pointInside.push(isInside[index] as number);
  }
  return {
    points,
    pointInside,
    totalPoints,
    stride,
    studyArea: dataset.studyArea,
    noDataZones: dataset.noDataZones,
    bbox: dataset.region.bbox,
    origin: dataset.origin,
    ...(dataset.baseline?.engine.kind === 'polygons' ? { baseline: baselineLayer(dataset) } : {}),
    ...(dataset.baseline?.engine.kind === 'controls' ? { controls: controlsLayer(dataset, maxPoints) } : {}),
  };
}
