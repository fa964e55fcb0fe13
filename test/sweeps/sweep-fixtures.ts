/**
 * Invented test scenarios for sweeps: a five-sided study area in planar metres (an invented district) with an
 * invented reservoir as a no-data zone, and seeded point patterns (uniform, or clustered around a few invented
 * sites). Demo data only: the checks compare against independent computations, not against these numbers.
 */
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Dataset } from '../../shared/contracts.js';
import { loadDataset } from '../../server/inputs/index.js';

export const AREA_RING: number[][] = [
  [500000, 4000000],
  [501200, 4000000],
  [501400, 4000700],
  [500600, 4001100],
  [499900, 4000600],
  [500000, 4000000],
];

/** The reservoir, inside the study area. */
export const RESERVOIR_RING: number[][] = [
  [500500, 4000300],
  [500800, 4000300],
  [500800, 4000550],
  [500500, 4000550],
  [500500, 4000300],
];

import { seededRandom } from '../fixtures/seeded-random.js';

export const fixtureRandom = seededRandom;

export function polygonGeoJson(ring: number[][]): string {
  return JSON.stringify({
    type: 'FeatureCollection',
    features: [{ type: 'Feature', properties: {}, geometry: { type: 'Polygon', coordinates: [ring] } }],
  });
}

/** n points uniform in the bounding box of the study area, or (clustered) around 6 sites with sd 25 m. */
export function pointsCsv(n: number, clustered: boolean, seed: number): string {
  const random = fixtureRandom(seed);
  const lines = ['id,x,y'];
  const sites = Array.from({ length: 6 }, () => [500150 + random() * 1000, 4000100 + random() * 700]);
  for (let k = 0; k < n; k++) {
    let x: number;
    let y: number;
    if (clustered) {
      const site = sites[k % sites.length];
      const radius = 25 * Math.sqrt(-2 * Math.log(1 - random()));
      const turn = 2 * Math.PI * random();
      x = site[0] + radius * Math.cos(turn);
      y = site[1] + radius * Math.sin(turn);
    } else {
      x = 499900 + random() * 1500;
      y = 4000000 + random() * 1100;
    }
    lines.push(`r${k + 1},${x.toFixed(3)},${y.toFixed(3)}`);
  }
  return `${lines.join('\n')}\n`;
}

/** The scenario as a Dataset (planar metres): study area, reservoir as no-data zone, seeded points. */
export function fixtureDataset(n: number, clustered: boolean, seed = 7): Dataset {
  return loadDataset(
    {
      points: { name: 'incidents.csv', content: pointsCsv(n, clustered, seed) },
      area: { name: 'district.geojson', content: polygonGeoJson(AREA_RING) },
      noData: [{ name: 'reservoir.geojson', content: polygonGeoJson(RESERVOIR_RING) }],
    },
    { crs: 'planar' },
  );
}

/** The scenario as files in a new temporary folder: clustered points (`pointsName`), the district and the reservoir. */
export function scenarioFiles(
  folderPrefix: string,
  pointsName: string,
  n: number,
  seed: number,
): { folder: string; points: string; area: string; reservoir: string } {
  const folder = mkdtempSync(join(tmpdir(), folderPrefix));
  const write = (name: string, content: string): string => {
    const path = join(folder, name);
    writeFileSync(path, content);
    return path;
  };
  return {
    folder,
    points: write(pointsName, pointsCsv(n, true, seed)),
    area: write('district.geojson', polygonGeoJson(AREA_RING)),
    reservoir: write('reservoir.geojson', polygonGeoJson(RESERVOIR_RING)),
  };
}
