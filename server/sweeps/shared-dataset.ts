/**
 * A dataset's points and region in shared memory, built once per dataset: the points inside the valid region
 * (the only ones ever counted), Morton-sorted once so that the count array stays in cache, and the packed region.
 */
import type { Dataset } from '../contracts.js';
import { mortonSort } from '../../workers/placement/index.js';
import { packRegion } from '../../workers/sweep/region-buffer.js';
import type { Origin } from '../../workers/types.js';

export interface SharedDataset {
  key: string;
  points: SharedArrayBuffer;
  pointCount: number;
  region: SharedArrayBuffer;
  origin: Origin;
}

let nextKey = 1;

/** Coordinates (interleaved x, y) of the points inside the valid region. Cost O(n). */
export function insideCoordinates(dataset: Dataset): Float64Array {
  const { xy, inside } = dataset;
  const result = new Float64Array(inside.length * 2);
  for (let k = 0; k < inside.length; k++) {
    result[2 * k] = xy[2 * inside[k]];
    result[2 * k + 1] = xy[2 * inside[k] + 1];
  }
  return result;
}

/** Copies the inside points (Morton-sorted) and the region into shared memory. Cost O(n log n). */
export function shareDataset(dataset: Dataset): SharedDataset {
  const sorted = mortonSort(insideCoordinates(dataset));
  const points = new SharedArrayBuffer(sorted.length * 8);
  new Float64Array(points).set(sorted);
  return {
    key: `dataset-${process.pid}-${nextKey++}`,
    points,
    pointCount: sorted.length / 2,
    region: packRegion(dataset.region),
    origin: { x: dataset.origin.x, y: dataset.origin.y },
  };
}
