/**
 * Synthetic benchmark scenario (invented): the "Fennick Vale" district, an irregular 14-sided study area about
 * 20 km across with an invented reservoir as a no-data zone, and clustered points (Thomas-like: 60 % around 400
 * seeded sites with sd 250 m, 40 % uniform), all inside the valid region. Demo data only.
 */
import type { Dataset } from '../../shared/contracts.js';
import { toRegion } from '../../server/inputs/to-region.js';
import { withEveryPointInside } from '../../server/inputs/inside-points.js';
import { createRegionLocator } from '../../workers/geometry/index.js';
import { createRandom } from '../../workers/random/index.js';

const SHELL: number[][] = [
  [2000, 0], [9000, 1500], [15000, 300], [19500, 4000], [18500, 9000], [20000, 14000], [16000, 19000],
  [11000, 17500], [7000, 20000], [2500, 17000], [0, 12000], [1500, 8000], [300, 4000], [2000, 0],
];
const RESERVOIR: number[][] = [[8000, 7000], [12500, 7600], [12000, 11000], [8600, 10400], [8000, 7000]];

export const STUDY_AREA: number[][][][] = [[SHELL]];
export const NO_DATA: number[][][][] = [[RESERVOIR]];

/** The valid region (study area minus the reservoir) in the engine's form. */
export const BENCH_REGION = toRegion([[SHELL, [...RESERVOIR].reverse()]]);
export const BENCH_ORIGIN = { x: 0, y: 0 };

/** Fills out (2n values) with clustered points inside the valid region, seeded. Cost O(n) expected. */
export function fillClusteredPoints(out: Float64Array, seed = 1): void {
  const random = createRandom(seed);
  const locator = createRegionLocator(BENCH_REGION);
  const { minX, minY, maxX, maxY } = BENCH_REGION.bbox;
  const sites = Array.from({ length: 400 }, () => [minX + random() * (maxX - minX), minY + random() * (maxY - minY)]);
  const n = out.length / 2;
  let k = 0;
  while (k < n) {
    let x: number;
    let y: number;
    if (random() < 0.6) {
      const site = sites[Math.floor(random() * sites.length)];
      const radius = 250 * Math.sqrt(-2 * Math.log(1 - random()));
      const turn = 2 * Math.PI * random();
      x = site[0] + radius * Math.cos(turn);
      y = site[1] + radius * Math.sin(turn);
    } else {
      x = minX + random() * (maxX - minX);
      y = minY + random() * (maxY - minY);
    }
    if (!locator.contains(x, y)) continue;
    out[2 * k] = x;
    out[2 * k + 1] = y;
    k++;
  }
}

/** Cell side for k expected points per cell: sqrt(k A / n). */
export function cellSideForExpected(k: number, n: number): number {
  return Math.sqrt((k * BENCH_REGION.area) / n);
}

/**
 * A Dataset around given coordinates (all inside the valid region). Record ids are not part of the engine's
 * memory: the id list has the right length but holds no strings (only its length is read by the summary).
 */
export function benchDataset(xy: Float64Array): Dataset {
  const n = xy.length / 2;
  // every point is inside: no index, as server/inputs builds such a dataset
  return withEveryPointInside({
    name: 'fennick-vale-synthetic',
    crs: 'planar',
    projection: { kind: 'planar' },
    xy,
    ids: { length: n } as unknown as string[],
    outsideIds: [],
    studyArea: STUDY_AREA,
    noDataZones: NO_DATA,
    areaIsDefault: false,
    region: BENCH_REGION,
    origin: BENCH_ORIGIN,
    warnings: [],
  });
}

/** n clustered points in a new Float64Array and their Dataset. */
export function clusteredDataset(n: number, seed = 1): Dataset {
  const xy = new Float64Array(2 * n);
  fillClusteredPoints(xy, seed);
  return benchDataset(xy);
}
