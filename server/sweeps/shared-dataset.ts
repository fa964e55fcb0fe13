/**
 * A dataset's points and region in shared memory, built once per dataset: the points inside the valid region
 * (the only ones ever counted), Morton-sorted once so that the count array stays in cache, and the packed region.
 */
import { insideCoordinates } from '../inputs/inside-coordinates.js';
import { insideCount, isEveryPointInside } from '../inputs/inside-points.js';
import type { Dataset } from '../../shared/contracts.js';
import { isMortonSorted, mortonSort } from '../../workers/placement/index.js';
import { packRegion } from '../../workers/sweep/region-buffer.js';
import { packBaseline } from '../../workers/baseline/baseline-buffer.js';
import { collectGarbage, COLLECT_FROM_POINTS } from './collect-garbage.js';
import type { Origin } from '../../workers/types.js';
import { createPointBuffer, type WasmMemory } from '../../workers/wasm/wasm-memory.js';

export interface SharedDataset {
  key: string;
  /** the inside points, x y float64 each, from byte 0 (the buffer may be longer: read pointCount points) */
  points: SharedArrayBuffer;
  /** the shared WebAssembly memory whose buffer `points` is (the SIMD counting kernel), or null */
  memory: WasmMemory | null;
  pointCount: number;
  region: SharedArrayBuffer;
  origin: Origin;
  /** the packed baseline (workers/baseline/baseline-buffer.ts), null when expected counts follow area */
  baseline: SharedArrayBuffer | null;
}

/**
 * True when the dataset's coordinates can be shared as they are: the whole of a SharedArrayBuffer, every point
 * inside the valid region in storage order, and already in Morton order. Cost O(n).
 */
export function isShareableAsIs(dataset: Dataset): boolean {
  const { xy } = dataset;
  if (!(xy.buffer instanceof SharedArrayBuffer) || xy.byteOffset !== 0 || xy.byteLength !== xy.buffer.byteLength) return false;
  return isEveryPointInside(dataset) && isMortonSorted(xy);
}

/**
 * Puts the inside points (Morton-sorted) and the region into shared memory. Zero-copy when the dataset's
 * coordinates are already shared, all inside and sorted (isShareableAsIs); otherwise one sorted copy.
 * `key` names the shared copy for the workers' caches (dataset-key.ts). Cost O(n) (radix sort).
 */
export function shareDataset(dataset: Dataset, key: string): SharedDataset {
  const shared = {
    key,
    pointCount: insideCount(dataset),
    region: packRegion(dataset.region),
    origin: { x: dataset.origin.x, y: dataset.origin.y },
    baseline: dataset.baseline === undefined ? null : packBaseline(dataset.baseline.engine),
  };
  const points = isShareableAsIs(dataset) ? { buffer: dataset.xy.buffer as SharedArrayBuffer, memory: null } : sortedCopy(dataset);
  // the Morton codes and the sorted temporaries are garbage now; an idle main thread would keep them
  if (shared.pointCount >= COLLECT_FROM_POINTS) collectGarbage();
  return { ...shared, points: points.buffer, memory: points.memory };
}

/**
 * The inside points sorted straight into shared memory (insideCoordinates: no gathered copy when all are inside), a
 * WebAssembly memory where the runtime can make one (createPointBuffer).
 */
function sortedCopy(dataset: Dataset): { buffer: SharedArrayBuffer; memory: WasmMemory | null } {
  const count = insideCount(dataset);
  const points = createPointBuffer(count * 16);
  mortonSort(insideCoordinates(dataset), new Float64Array(points.buffer, 0, 2 * count));
  return points;
}
