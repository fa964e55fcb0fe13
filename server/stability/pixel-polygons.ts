/**
 * Polygons of the pixels of a mask: 4-connected components (pixels sharing a side), each traced into rings along
 * pixel sides. The boundary of a component is the set of its pixel sides with a pixel outside the component across
 * them, each directed with the component on its left; linked end to start these make the outer ring counter-
 * clockwise and the holes clockwise (the right-hand rule of RFC 7946, section 3.1.6). Where two sides leave one
 * corner (pixels touching only at the corner) the left turn is taken, which keeps corner-touching pixels apart.
 * Collinear corners are dropped. Cost O(pixels) per pass.
 */
import type { StabilityRaster } from '../../workers/stability/stability-raster.js';

export interface PixelPolygon {
  /** closed ring (first point repeated), counter-clockwise, planar metres */
  outer: [number, number][];
  /** closed rings, clockwise */
  holes: [number, number][][];
  /** raster indices (row * width + col) of the component's pixels */
  pixels: number[];
}

/** 4-connected components of mask[pixel] === 1, pixels listed per component. */
function components(mask: Uint8Array, width: number, height: number): number[][] {
  const label = new Int32Array(width * height).fill(-1);
  const result: number[][] = [];
  for (let start = 0; start < mask.length; start++) {
    if (mask[start] !== 1 || label[start] !== -1) continue;
    const id = result.length;
    const members: number[] = [start];
    label[start] = id;
    for (let t = 0; t < members.length; t++) {
      const pixel = members[t]!;
      const row = Math.floor(pixel / width);
      const col = pixel - row * width;
      const neighbours = [col > 0 ? pixel - 1 : -1, col + 1 < width ? pixel + 1 : -1, row > 0 ? pixel - width : -1, row + 1 < height ? pixel + width : -1];
      for (const next of neighbours) {
        if (next >= 0 && mask[next] === 1 && label[next] === -1) {
          label[next] = id;
          members.push(next);
        }
      }
    }
    result.push(members);
  }
  return result;
}

/** Twice the signed area of a closed integer ring. */
function signedArea2(ring: [number, number][]): number {
  let sum = 0;
  for (let k = 0; k + 1 < ring.length; k++) sum += ring[k]![0] * ring[k + 1]![1] - ring[k + 1]![0] * ring[k]![1];
  return sum;
}

/**
 * The rings of one component in corner coordinates (X = column, Y = -row: y grows upward), closed, outer
 * counter-clockwise, holes clockwise, collinear corners dropped.
 */
function traceComponent(members: number[], width: number, height: number): [number, number][][] {
  const inside = new Set(members);
  // directed sides: from (ax, ay) to (bx, by)
  const ax: number[] = [];
  const ay: number[] = [];
  const bx: number[] = [];
  const by: number[] = [];
  const outgoing = new Map<number, number[]>();
  const key = (x: number, y: number): number => x * (height + 1) - y;
  const add = (x1: number, y1: number, x2: number, y2: number): void => {
    const id = ax.length;
    ax.push(x1);
    ay.push(y1);
    bx.push(x2);
    by.push(y2);
    const k = key(x1, y1);
    const list = outgoing.get(k);
    if (list === undefined) outgoing.set(k, [id]);
    else list.push(id);
  };
  const has = (col: number, row: number): boolean => col >= 0 && col < width && row >= 0 && row < height && inside.has(row * width + col);
  for (const pixel of members) {
    const row = Math.floor(pixel / width);
    const col = pixel - row * width;
    const top = -row;
    const bottom = -row - 1;
    if (!has(col, row + 1)) add(col, bottom, col + 1, bottom);
    if (!has(col + 1, row)) add(col + 1, bottom, col + 1, top);
    if (!has(col, row - 1)) add(col + 1, top, col, top);
    if (!has(col - 1, row)) add(col, top, col, bottom);
  }
  const used = new Uint8Array(ax.length);
  const rings: [number, number][][] = [];
  for (let first = 0; first < ax.length; first++) {
    if (used[first] === 1) continue;
    const corners: [number, number][] = [];
    let edge = first;
    while (used[edge] !== 1) {
      used[edge] = 1;
      corners.push([ax[edge]!, ay[edge]!]);
      const dx = bx[edge]! - ax[edge]!;
      const dy = by[edge]! - ay[edge]!;
      const candidates = (outgoing.get(key(bx[edge]!, by[edge]!)) ?? []).filter((id) => used[id] !== 1);
      if (candidates.length === 0) break;
      // prefer the left turn (-dy, dx), then straight on, then the right turn
      const rank = (id: number): number => {
        const ex = bx[id]! - ax[id]!;
        const ey = by[id]! - ay[id]!;
        if (ex === -dy && ey === dx) return 0;
        if (ex === dx && ey === dy) return 1;
        return 2;
      };
      candidates.sort((a, b) => rank(a) - rank(b));
      edge = candidates[0]!;
    }
    rings.push(dropCollinear(corners));
  }
  return rings;
}

/** A closed ring from a cycle of corners with the collinear ones removed. */
function dropCollinear(cycle: [number, number][]): [number, number][] {
  const n = cycle.length;
  const kept: [number, number][] = [];
  for (let k = 0; k < n; k++) {
    const previous = cycle[(k + n - 1) % n]!;
    const current = cycle[k]!;
    const next = cycle[(k + 1) % n]!;
    const cross = (current[0] - previous[0]) * (next[1] - current[1]) - (current[1] - previous[1]) * (next[0] - current[0]);
    if (cross !== 0) kept.push(current);
  }
  kept.push(kept[0]!);
  return kept;
}

/** The polygons of the mask's components, in planar metres of the raster. */
export function pixelPolygons(mask: Uint8Array, raster: StabilityRaster): PixelPolygon[] {
  const toPlanar = ([x, y]: [number, number]): [number, number] => [raster.x0 + x * raster.side, raster.y0 + y * raster.side];
  return components(mask, raster.width, raster.height).map((members) => {
    const rings = traceComponent(members, raster.width, raster.height);
    const outer = rings.filter((ring) => signedArea2(ring) > 0);
    const holes = rings.filter((ring) => signedArea2(ring) < 0);
    if (outer.length !== 1) throw new Error(`a component of ${members.length} pixels traced into ${outer.length} outer rings`);
    return { outer: outer[0]!.map(toPlanar), holes: holes.map((ring) => ring.map(toPlanar)), pixels: members };
  });
}
