/** The coordinates (interleaved x, y) of a dataset's points inside the valid region: the only ones ever counted. */
import type { Dataset } from '../../shared/contracts.js';
import { isEveryPointInside } from './inside-points.js';

/**
 * Gathers xy[inside[k]] in the order of `inside`: the dataset's own array (not a copy: read it only) when every
 * point is inside. Cost O(n inside) (O(1) for a dataset of server/inputs/inside-points.ts withEveryPointInside).
 */
export function insideCoordinates(dataset: Pick<Dataset, 'xy' | 'inside'>): Float64Array {
  if (isEveryPointInside(dataset)) return dataset.xy;
  const { xy, inside } = dataset;
  const result = new Float64Array(inside.length * 2);
  for (let k = 0; k < inside.length; k++) {
    result[2 * k] = xy[2 * inside[k]!]!;
    result[2 * k + 1] = xy[2 * inside[k]! + 1]!;
  }
  return result;
}
