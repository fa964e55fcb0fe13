/**
 * Which of a dataset's points lie inside the valid region (Dataset.inside). In the common case all of them do, and
 * their index is the identity 0, 1, ..., n - 1: such a dataset carries no index but builds it on first read
 * (withEveryPointInside), 4 bytes a point (38 MB at 1e7 points) that a sweep never needs. Code that only needs the
 * number of inside points, or whether they are all inside, asks insideCount / isEveryPointInside, which never build
 * the index.
 */
import type { Dataset } from '../../shared/contracts.js';

const EVERY_POINT_INSIDE = new WeakSet<object>();

/** 0, 1, ..., n - 1. */
function identityIndex(n: number): Uint32Array {
  const index = new Uint32Array(n);
  for (let k = 0; k < n; k++) index[k] = k;
  return index;
}

/**
 * Gives `dataset` (every point of which lies inside the valid region) an `inside` built on first read and kept; the
 * dataset is marked so that insideCount and isEveryPointInside answer without building it. Assigning `inside`
 * replaces the index and drops the mark. Returns the same object.
 */
export function withEveryPointInside<T extends { xy: Float64Array }>(dataset: T): T & { inside: Uint32Array } {
  let index: Uint32Array | undefined;
  Object.defineProperty(dataset, 'inside', {
    enumerable: true,
    configurable: true,
    get(): Uint32Array {
      index ??= identityIndex(dataset.xy.length / 2);
      return index;
    },
    set(value: Uint32Array) {
      EVERY_POINT_INSIDE.delete(dataset);
      Object.defineProperty(dataset, 'inside', { value, writable: true, enumerable: true, configurable: true });
    },
  });
  EVERY_POINT_INSIDE.add(dataset);
  return dataset as T & { inside: Uint32Array };
}

/** True when every point of the dataset lies inside the valid region. O(1) for a marked dataset, else O(n). */
export function isEveryPointInside(dataset: Pick<Dataset, 'xy' | 'inside'>): boolean {
  if (EVERY_POINT_INSIDE.has(dataset)) return true;
  const { inside } = dataset;
  if (inside.length * 2 !== dataset.xy.length) return false;
  for (let k = 0; k < inside.length; k++) if (inside[k] !== k) return false;
  return true;
}

/** The number of points inside the valid region, without building a marked dataset's index. O(1). */
export function insideCount(dataset: Pick<Dataset, 'xy' | 'inside'>): number {
  return EVERY_POINT_INSIDE.has(dataset) ? dataset.xy.length / 2 : dataset.inside.length;
}
