/**
 * The grid's cells packed for drawing and picking: ring vertices in one Float64Array, a bounding box per cell and a
 * bucket index (a uniform grid over the cells' boxes) so that the cell under the pointer is found by testing a
 * handful of candidates, not every cell. Works for any cell shape (squares, hexagons): cells are polygons.
 */
import type { GridCollection, GridFeature } from '../api/api-client.js';

export interface PackedCells {
  features: GridFeature[];
  /** x,y of every ring vertex of every cell (outer rings only: cells have no holes) */
  vertices: Float64Array;
  /** cell k's vertices are pairs start[k] .. start[k+1]-1 */
  start: Uint32Array;
  /** minX, minY, maxX, maxY per cell */
  boxes: Float64Array;
  extent: [number, number, number, number];
  maxKeptCount: number;
  pick: (x: number, y: number) => number;
}

/** Even-odd ray casting (Shimrat 1962, "Algorithm 112: Position of point relative to polygon", CACM 5(8)). */
function insideRing(vertices: Float64Array, from: number, to: number, x: number, y: number): boolean {
  let inside = false;
  for (let k = from, previous = to - 1; k < to; previous = k, k += 1) {
    const xk = vertices[2 * k];
    const yk = vertices[2 * k + 1];
    const xp = vertices[2 * previous];
    const yp = vertices[2 * previous + 1];
    if (yk > y !== yp > y && x < ((xp - xk) * (y - yk)) / (yp - yk) + xk) inside = !inside;
  }
  return inside;
}

export function packCells(grid: GridCollection): PackedCells {
  const features = grid.features;
  let total = 0;
  for (const feature of features) total += feature.geometry.coordinates[0]?.length ?? 0;
  const vertices = new Float64Array(2 * total);
  const start = new Uint32Array(features.length + 1);
  const boxes = new Float64Array(4 * features.length);
  let at = 0;
  let maxKeptCount = 0;
  const extent: [number, number, number, number] = [Infinity, Infinity, -Infinity, -Infinity];
  let sumWidth = 0;
  features.forEach((feature, k) => {
    start[k] = at;
    let minX = Infinity;
    let minY = Infinity;
    let maxX = -Infinity;
    let maxY = -Infinity;
    const ring = feature.geometry.coordinates[0] ?? [];
    for (let v = 0; v < ring.length; v += 1) {
      const x = ring[v][0];
      const y = ring[v][1];
      vertices[2 * at] = x;
      vertices[2 * at + 1] = y;
      at += 1;
      if (x < minX) minX = x;
      if (y < minY) minY = y;
      if (x > maxX) maxX = x;
      if (y > maxY) maxY = y;
    }
    boxes[4 * k] = minX;
    boxes[4 * k + 1] = minY;
    boxes[4 * k + 2] = maxX;
    boxes[4 * k + 3] = maxY;
    extent[0] = Math.min(extent[0], minX);
    extent[1] = Math.min(extent[1], minY);
    extent[2] = Math.max(extent[2], maxX);
    extent[3] = Math.max(extent[3], maxY);
    sumWidth += maxX - minX;
    if (feature.properties.kept) maxKeptCount = Math.max(maxKeptCount, feature.properties.count);
  });
  start[features.length] = at;

  // buckets about one cell wide: each cell lands in a few buckets, each bucket holds a few cells
  const bucketSide = features.length > 0 ? Math.max(sumWidth / features.length, 1e-9) : 1;
  const columns = features.length > 0 ? Math.max(1, Math.ceil((extent[2] - extent[0]) / bucketSide)) : 1;
  const rows = features.length > 0 ? Math.max(1, Math.ceil((extent[3] - extent[1]) / bucketSide)) : 1;
  const buckets: number[][] = Array.from({ length: columns * rows }, () => []);
  const columnOf = (x: number) => Math.min(columns - 1, Math.max(0, Math.floor((x - extent[0]) / bucketSide)));
  const rowOf = (y: number) => Math.min(rows - 1, Math.max(0, Math.floor((y - extent[1]) / bucketSide)));
  for (let k = 0; k < features.length; k += 1) {
    for (let row = rowOf(boxes[4 * k + 1]); row <= rowOf(boxes[4 * k + 3]); row += 1) {
      for (let column = columnOf(boxes[4 * k]); column <= columnOf(boxes[4 * k + 2]); column += 1) buckets[row * columns + column].push(k);
    }
  }

  const pick = (x: number, y: number): number => {
    if (features.length === 0 || x < extent[0] || x > extent[2] || y < extent[1] || y > extent[3]) return -1;
    for (const k of buckets[rowOf(y) * columns + columnOf(x)]) {
      if (x < boxes[4 * k] || x > boxes[4 * k + 2] || y < boxes[4 * k + 1] || y > boxes[4 * k + 3]) continue;
      if (insideRing(vertices, start[k], start[k + 1], x, y)) return k;
    }
    return -1;
  };

  return { features, vertices, start, boxes, extent, maxKeptCount, pick };
}
