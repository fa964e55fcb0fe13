import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Dataset } from '../../shared/contracts.js';
import { loadDataset } from '../../server/inputs/index.js';
import { normalizePlan } from '../../server/sweeps/plan.js';
import { SweepPool } from '../../server/sweeps/sweep-pool.js';
import { startRedis, type TestRedis } from '../bench/redis-server.js';
import { keptFiles, queueRunner, startWorker } from '../queue/queue-helpers.js';
import { polygonFile } from './baseline-fixtures.js';
import { blocksGeoJson, csv, populationPoints, TOWN } from './population-fixtures.js';

// A sweep against a baseline on the Redis queue (one `gridshake worker` process, the built CLI) gives the local pool's
// placements.csv and summary.json numbers byte for byte: polygons and controls. Starts its own redis-server.
describe('sweeps against a baseline on the Redis queue', () => {
  let redis: TestRedis;
  let local: SweepPool;
  const plan = normalizePlan({ cells: [250], placements: 12, sims: 19, seed: 3 });
  const town = (extra: Partial<Parameters<typeof loadDataset>[0]>, field?: string): Dataset =>
    loadDataset(
      { points: { name: 'points.csv', content: csv(populationPoints(500, 21)) }, area: { name: 'area.geojson', content: polygonFile([TOWN]) }, ...extra },
      { crs: 'planar', ...(field === undefined ? {} : { baselineField: field }) },
    );

  beforeAll(async () => {
    redis = await startRedis();
    local = new SweepPool({ threads: 2 });
  }, 60_000);

  afterAll(async () => {
    await local?.destroy();
    await redis?.stop();
  });

  it('polygons and controls: the same files as the local pool', async () => {
    const datasets = [
      town({ baseline: { name: 'blocks.geojson', content: blocksGeoJson() } }, 'residents'),
      town({ controls: { name: 'controls.csv', content: csv(populationPoints(700, 22)) } }),
    ];
    const worker = await startWorker(redis.url, 1);
    const runner = queueRunner(redis.url, 'baseline');
    try {
      for (const dataset of datasets) {
        const expected = keptFiles(await local.runSweep(dataset, plan));
        const result = await runner.runSweep(dataset, plan);
        expect(result.summary.expectedFrom).toBe(dataset.baseline!.engine.kind === 'polygons' ? 'baseline' : 'controls');
        const files = keptFiles(result);
        expect(files.csv).toBe(expected.csv);
        expect(files.summary).toBe(expected.summary);
      }
    } finally {
      await runner.destroy();
      await worker.stop();
    }
  }, 180_000);
});
