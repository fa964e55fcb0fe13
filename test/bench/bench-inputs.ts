/**
 * The benchmark scenario as the files an analyst would give gridshake: points.csv (id,x,y), area.geojson and
 * reservoir.geojson (planar metres), written to a folder. Used by the end-to-end CLI and server measurements.
 */
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { NO_DATA, STUDY_AREA } from './bench-data.js';

export interface BenchFiles {
  points: string;
  area: string;
  noData: string;
  csv: string;
}

function polygonFile(rings: number[][][][]): string {
  return JSON.stringify({ type: 'FeatureCollection', features: [{ type: 'Feature', properties: {}, geometry: { type: 'MultiPolygon', coordinates: rings } }] });
}

/** Writes the three input files of n points (xy) to folder; returns their paths and the CSV text. */
export function writeBenchInputs(folder: string, xy: Float64Array): BenchFiles {
  const lines = ['id,x,y'];
  for (let k = 0; k < xy.length / 2; k++) lines.push(`${k + 1},${xy[2 * k]},${xy[2 * k + 1]}`);
  const csv = `${lines.join('\n')}\n`;
  const files = { points: join(folder, 'points.csv'), area: join(folder, 'area.geojson'), noData: join(folder, 'reservoir.geojson'), csv };
  writeFileSync(files.points, csv);
  writeFileSync(files.area, polygonFile(STUDY_AREA));
  writeFileSync(files.noData, polygonFile(NO_DATA));
  return files;
}
