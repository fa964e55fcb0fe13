/**
 * Measurement 4: the approach a newcomer writes, one polygon per cell and a point-in-polygon count with
 * @turf/turf (pointsWithinPolygon; a cell is kept when its centre lies in the valid region), on a small case,
 * extrapolated per point-placement. Its cost per point-placement grows with the number of cells (every point is
 * tested against every cell), so the small case flatters it.
 */
import { booleanPointInPolygon, featureCollection, point, polygon, pointsWithinPolygon } from '@turf/turf';
import { normalizePlan } from '../../server/sweeps/plan.js';
import { SweepPool } from '../../server/sweeps/sweep-pool.js';
import { haltonPlacements } from '../../workers/random/index.js';
import type { FeatureCollection, Point } from 'geojson';
import type { Placement } from '../../workers/types.js';
import { BENCH_ORIGIN, BENCH_REGION, NO_DATA, STUDY_AREA, cellSideForExpected, clusteredDataset } from './bench-data.js';
import { bestSecondsAsync, printTable } from './bench-table.js';

const N = 2000;
const PLACEMENTS = 4;

/** Counts per kept cell of one placement, the naive way. */
function naiveCounts(points: FeatureCollection<Point>, cellSize: number, placement: Placement): number[] {
  const t = (placement.angle * Math.PI) / 180;
  const [cos, sin] = [Math.cos(t), Math.sin(t)];
  const toWorld = (gx: number, gy: number): number[] => [BENCH_ORIGIN.x + gx * cos - gy * sin, BENCH_ORIGIN.y + gx * sin + gy * cos];
  const area = polygon(STUDY_AREA[0]);
  const reservoir = polygon(NO_DATA[0]);
  const { maxX, maxY } = BENCH_REGION.bbox;
  const reach = Math.ceil((Math.hypot(maxX - BENCH_ORIGIN.x, maxY - BENCH_ORIGIN.y) / cellSize) + 2);
  const counts: number[] = [];
  for (let i = -reach; i <= reach; i++) {
    for (let j = -reach; j <= reach; j++) {
      const x0 = (i + placement.u) * cellSize;
      const y0 = (j + placement.v) * cellSize;
      const centre = point(toWorld(x0 + cellSize / 2, y0 + cellSize / 2));
      if (!booleanPointInPolygon(centre, area) || booleanPointInPolygon(centre, reservoir)) continue;
      const ring = [toWorld(x0, y0), toWorld(x0 + cellSize, y0), toWorld(x0 + cellSize, y0 + cellSize), toWorld(x0, y0 + cellSize), toWorld(x0, y0)];
      counts.push(pointsWithinPolygon(points, polygon([ring])).features.length);
    }
  }
  return counts;
}

export async function runNaiveBench(gridshakeNsAtMillion: number): Promise<{ naiveNs: number }> {
  const dataset = clusteredDataset(N, 8);
  const cellSize = cellSideForExpected(5, N);
  const points = featureCollection(Array.from({ length: N }, (_, k) => point([dataset.xy[2 * k], dataset.xy[2 * k + 1]])));
  const placements = haltonPlacements(PLACEMENTS, true);
  const start = process.hrtime.bigint();
  let cells = 0;
  for (const placement of placements) cells += naiveCounts(points, cellSize, placement).length;
  const naiveSeconds = Number(process.hrtime.bigint() - start) / 1e9;
  const naiveNs = (naiveSeconds * 1e9) / (N * PLACEMENTS);

  const pool = new SweepPool({ threads: 1 });
  let oursSeconds: number;
  try {
    const plan = normalizePlan({ cells: [cellSize], placements: PLACEMENTS, sims: 0 });
    await pool.runSweep(dataset, plan);
    oursSeconds = await bestSecondsAsync(() => pool.runSweep(dataset, plan), 3);
  } finally {
    await pool.destroy();
  }
  const oursNs = (oursSeconds * 1e9) / (N * PLACEMENTS);
  printTable(
    `4. Naive approach (turf polygon per cell + pointsWithinPolygon), ${N} points x ${PLACEMENTS} placements, about ${Math.round(cells / PLACEMENTS)} kept cells`,
    ['approach', 'ns/point-placement', 'factor vs naive'],
    [
      ['naive turf (baseline)', naiveNs, 1],
      ['gridshake sweep, 1 thread, same small case', oursNs, naiveNs / oursNs],
      ['gridshake sweep, 2 threads, 1e6 points (measurement 2)', gridshakeNsAtMillion, naiveNs / gridshakeNsAtMillion],
    ],
  );
  return { naiveNs };
}
