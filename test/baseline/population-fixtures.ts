/**
 * An invented town for baseline tests: a 2000 m x 2000 m study area split into 4 x 4 blocks of 500 m, each block a
 * baseline polygon with its residents (strongly uneven), and point patterns drawn from the residents (seeded).
 */
import { seededRandom } from '../fixtures/seeded-random.js';
import { featuresGeoJson, rect } from './baseline-fixtures.js';

export const TOWN = rect(0, 0, 2000, 2000);
const BLOCK = 500;

/** Residents per block, row by row from the south-west. */
export const RESIDENTS = [20, 40, 400, 900, 10, 60, 800, 300, 30, 200, 100, 50, 700, 20, 10, 5];

export function blocks(): { rings: number[][][]; counts: number[] } {
  const rings: number[][][] = [];
  RESIDENTS.forEach((_, k) => {
    const i = k % 4;
    const j = Math.floor(k / 4);
    rings.push(rect(i * BLOCK, j * BLOCK, (i + 1) * BLOCK, (j + 1) * BLOCK));
  });
  return { rings, counts: [...RESIDENTS] };
}

export function blocksGeoJson(): string {
  const { rings, counts } = blocks();
  return featuresGeoJson(rings, counts.map((residents) => ({ residents })));
}

/** n points, each in block k with probability ∝ residents, uniform in the block. */
export function populationPoints(n: number, seed: number): number[][] {
  const random = seededRandom(seed);
  const total = RESIDENTS.reduce((a, b) => a + b, 0);
  const points: number[][] = [];
  for (let p = 0; p < n; p++) {
    let target = random() * total;
    let k = 0;
    while (target >= RESIDENTS[k]!) target -= RESIDENTS[k++]!;
    const i = k % 4;
    const j = Math.floor(k / 4);
    points.push([i * BLOCK + BLOCK * random(), j * BLOCK + BLOCK * random()]);
  }
  return points;
}

/** m extra points in a disc of radius r around (cx, cy) (an excess on top of the population). */
export function discPoints(m: number, cx: number, cy: number, r: number, seed: number): number[][] {
  const random = seededRandom(seed);
  const points: number[][] = [];
  for (let p = 0; p < m; p++) {
    const a = 2 * Math.PI * random();
    const d = r * Math.sqrt(random());
    points.push([cx + d * Math.cos(a), cy + d * Math.sin(a)]);
  }
  return points;
}

export function csv(points: number[][]): string {
  return `id,x,y\n${points.map(([x, y], k) => `${k + 1},${x!.toFixed(3)},${y!.toFixed(3)}`).join('\n')}\n`;
}
