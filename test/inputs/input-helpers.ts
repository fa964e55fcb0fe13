/** Small builders for input tests: files from text, GeoJSON polygons, and the error a call throws. */
import { GridshakeError } from '../../server/errors.js';
import type { InputFile } from '../../server/inputs/index.js';

export const file = (name: string, content: string): InputFile => ({ name, content });

export type Position = [number, number];

export function square(x0: number, y0: number, side: number): Position[] {
  return [[x0, y0], [x0 + side, y0], [x0 + side, y0 + side], [x0, y0 + side], [x0, y0]];
}

export function polygonFile(name: string, ...polygons: Position[][][]): InputFile {
  const features = polygons.map((rings, k) => ({
    type: 'Feature',
    id: `f${k + 1}`,
    properties: {},
    geometry: { type: 'Polygon', coordinates: rings },
  }));
  return file(name, JSON.stringify({ type: 'FeatureCollection', features }));
}

export function csvFile(name: string, header: string, rows: (string | number)[][], delimiter = ','): InputFile {
  return file(name, [header, ...rows.map((row) => row.join(delimiter))].join('\n') + '\n');
}

/** The GridshakeError thrown by `run`, or a failure when it does not throw one. */
export function thrown(run: () => unknown): GridshakeError {
  try {
    run();
  } catch (error) {
    if (error instanceof GridshakeError) return error;
    throw new Error(`expected a GridshakeError, got ${String(error)}`);
  }
  throw new Error('expected a GridshakeError, nothing was thrown');
}
