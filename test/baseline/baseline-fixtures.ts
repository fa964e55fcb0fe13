/**
 * Hand-checkable baseline layouts (planar metres): a 400 m x 200 m study area cut by 100 m squares at angle 0 and
 * offset 0 into cells (i, j), i = 0..3, j = 0..1, and points placed inside given cells.
 */
import { tempFolder } from '../cli/run-cli.js';

export const STUDY: number[][] = [[0, 0], [400, 0], [400, 200], [0, 200], [0, 0]];

/** A closed rectangle ring. */
export function rect(x0: number, y0: number, x1: number, y1: number): number[][] {
  return [[x0, y0], [x1, y0], [x1, y1], [x0, y1], [x0, y0]];
}

/** Cell order used by every table here: (0,0), (1,0), (2,0), (3,0), (0,1), (1,1), (2,1), (3,1). */
export const CELLS: [number, number][] = [[0, 0], [1, 0], [2, 0], [3, 0], [0, 1], [1, 1], [2, 1], [3, 1]];

/** The observed counts of the layouts, in CELLS order. */
export const OBSERVED = [2, 3, 10, 12, 1, 4, 8, 10];

/** CSV of points: `counts[k]` points strictly inside cell CELLS[k] of side `side`, away from every cell side. */
export function pointsCsv(counts: readonly number[], side = 100): string {
  const lines = ['id,x,y'];
  let id = 1;
  counts.forEach((count, k) => {
    const [i, j] = CELLS[k]!;
    for (let p = 0; p < count; p++) {
      const x = i * side + side * (0.1 + ((p * 7) % 80) / 100);
      const y = j * side + side * (0.1 + ((p * 13) % 80) / 100);
      lines.push(`${id++},${x.toFixed(3)},${y.toFixed(3)}`);
    }
  });
  return `${lines.join('\n')}\n`;
}

/** GeoJSON polygons with properties (feature k gets properties[k]). */
export function featuresGeoJson(rings: number[][][], properties: Record<string, unknown>[]): string {
  return JSON.stringify({
    type: 'FeatureCollection',
    features: rings.map((ring, k) => ({ type: 'Feature', properties: properties[k] ?? {}, geometry: { type: 'Polygon', coordinates: [ring] } })),
  });
}

export function polygonFile(rings: number[][][]): string {
  return JSON.stringify({ type: 'FeatureCollection', features: rings.map((ring) => ({ type: 'Feature', properties: {}, geometry: { type: 'Polygon', coordinates: [ring] } })) });
}

export const write = (): ((name: string, content: string) => string) => tempFolder();
