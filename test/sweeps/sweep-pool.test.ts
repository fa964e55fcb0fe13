import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, it, expect } from 'vitest';
import { booleanPointInPolygon, point, polygon } from '@turf/turf';
import type { Dataset, SweepProgress } from '../../shared/contracts.js';
import { GridshakeError } from '../../server/errors.js';
import { normalizePlan } from '../../server/sweeps/plan.js';
import { insideCoordinates } from '../../server/inputs/index.js';
import { isShareableAsIs } from '../../server/sweeps/shared-dataset.js';
import { POOL_TASK_FILE, SweepPool } from '../../server/sweeps/sweep-pool.js';
import { mortonSort } from '../../workers/placement/index.js';
import { AREA_RING, RESERVOIR_RING, fixtureDataset } from './sweep-fixtures.js';

// The pool runs dist/workers/pool-task.js: build first (npm test does; or npx tsc -p tsconfig.json).

let single: SweepPool;
let double: SweepPool;
let clustered: Dataset;
let uniform: Dataset;

beforeAll(() => {
  single = new SweepPool({ threads: 1 });
  double = new SweepPool({ threads: 2 });
  clustered = fixtureDataset(2000, true);
  uniform = fixtureDataset(3000, false);
});

afterAll(async () => {
  await Promise.all([single.destroy(), double.destroy()]);
});

describe('SweepPool.runSweep', () => {
  it('gives identical rows and summaries on 1 and 2 threads for the same seed and plan', async () => {
    // 3000 points, 19 sims: 64 placements per chunk, so 3 chunks per size; chunks finish in any order on 2 threads
    const plan = normalizePlan({ cells: [70, 110], placements: 150, sims: 19, seed: 11 });
    const [a, b] = await Promise.all([single.runSweep(uniform, plan), double.runSweep(uniform, plan)]);
    expect(a.rows).toHaveLength(300);
    expect(b.rows).toEqual(a.rows);
    expect(b.summary.sizes).toEqual(a.summary.sizes);
    expect(b.summary.conclusion).toBe(a.summary.conclusion);
    expect(a.summary.sizes[0].monteCarlo?.simulatedMedians).toHaveLength(19);
    // another seed draws other CSR patterns
    const other = await double.runSweep(uniform, { ...plan, seed: 12 });
    expect(other.rows).toEqual(a.rows);
    expect(other.summary.sizes[0].monteCarlo?.simulatedMedians).not.toEqual(a.summary.sizes[0].monteCarlo?.simulatedMedians);
  });

  it('shares coordinates that are already shared and Morton-sorted as they are, with the same results', async () => {
    const sorted = mortonSort(insideCoordinates(uniform));
    const xy = new Float64Array(new SharedArrayBuffer(sorted.byteLength));
    xy.set(sorted);
    const inside = Uint32Array.from({ length: xy.length / 2 }, (_, k) => k);
    const asIs: Dataset = { ...uniform, xy, inside, ids: Array.from({ length: inside.length }, (_, k) => `s${k}`), outsideIds: [] };
    expect(isShareableAsIs(asIs)).toBe(true);
    expect(isShareableAsIs(uniform)).toBe(false);
    const plan = normalizePlan({ cells: [90], placements: 40, sims: 5, alpha: 0.2 });
    const [copied, shared] = await Promise.all([double.runSweep(uniform, plan), double.runSweep(asIs, plan)]);
    expect(shared.rows).toEqual(copied.rows);
    expect(shared.summary.sizes[0].monteCarlo).toEqual(copied.summary.sizes[0].monteCarlo);
  });

  it('counts the reference placement like a brute-force count with turf point-in-polygon (whole cells only)', async () => {
    const cellSize = 100;
    const { rows } = await double.runSweep(uniform, normalizePlan({ cells: [cellSize], placements: 4, sims: 0, minCoverage: 1 }));
    const reference = rows.find((row) => row.placementIndex === 0);
    // Oracle: the study area is convex, so a cell lies in it when its 4 corners do (turf, boundary included);
    // it is whole when it also does not overlap the reservoir's interior. Points: those turf puts in the valid region.
    const area = polygon([AREA_RING]);
    const reservoir = polygon([RESERVOIR_RING]);
    const [ox, oy] = [499900, 4000000];
    const counts = new Map<string, number>();
    for (let i = 0; i < 16; i++) {
      for (let j = 0; j < 12; j++) {
        const x0 = ox + i * cellSize;
        const y0 = oy + j * cellSize;
        const corners = [[x0, y0], [x0 + cellSize, y0], [x0, y0 + cellSize], [x0 + cellSize, y0 + cellSize]];
        const inArea = corners.every((corner) => booleanPointInPolygon(point(corner), area));
        const overlapsReservoir = x0 < 500800 && x0 + cellSize > 500500 && y0 < 4000550 && y0 + cellSize > 4000300;
        if (inArea && !overlapsReservoir) counts.set(`${i},${j}`, 0);
      }
    }
    for (let k = 0; k < uniform.xy.length / 2; k++) {
      const [x, y] = [uniform.xy[2 * k], uniform.xy[2 * k + 1]];
      if (!booleanPointInPolygon(point([x, y]), area) || booleanPointInPolygon(point([x, y]), reservoir, { ignoreBoundary: true })) continue;
      const key = `${Math.floor((x - ox) / cellSize)},${Math.floor((y - oy) / cellSize)}`;
      if (counts.has(key)) counts.set(key, (counts.get(key) as number) + 1);
    }
    const values = [...counts.values()];
    const total = values.reduce((sum, value) => sum + value, 0);
    const mean = total / values.length;
    const variance = values.reduce((sum, value) => sum + (value - mean) ** 2, 0) / (values.length - 1);
    expect(reference?.cells).toBe(values.length);
    expect(reference?.points).toBe(total);
    expect(reference?.vmr).toBeCloseTo(variance / mean, 10);
    // whole cells: chi2 = (m - 1) vmr
    expect(reference?.chi2).toBeCloseTo((values.length - 1) * (variance / mean), 8);
  });

  it('gives a clearly clustered pattern the smallest Monte Carlo p-value, 1/(R+1)', async () => {
    const { summary } = await double.runSweep(clustered, normalizePlan({ cells: [60, 120], placements: 32, sims: 19, seed: 3 }));
    for (const size of summary.sizes) {
      expect(size.monteCarlo?.pMedianClustered).toBe(1 / 20);
      expect(size.monteCarlo?.pMaxClustered).toBe(1 / 20);
      expect(size.monteCarlo?.pMedianRegular).toBe(1);
      expect(size.mostCommon).toBe('clustered');
      expect(size.monteCarlo?.observedMedian).toBeGreaterThan(size.monteCarlo?.envelope.hi as number);
    }
  });

  it('reports progress after each chunk, ending at the total', async () => {
    const progress: SweepProgress[] = [];
    await single.runSweep(uniform, normalizePlan({ cells: [80, 120], placements: 200, sims: 19 }), {
      onProgress: (p) => progress.push(p),
    });
    // 64 placements per chunk: 4 chunks per size, 8 in all
    expect(progress).toHaveLength(8);
    expect(progress.map((p) => p.done)).toEqual([...progress.map((p) => p.done)].sort((x, y) => x - y));
    expect(progress.at(-1)).toMatchObject({ done: 400, total: 400, remainingSeconds: 0 });
  });

  it('refuses a plan over the budget before any work, saying how to shrink it', async () => {
    const small = new SweepPool({ threads: 1, budget: 1e6 });
    try {
      await expect(small.runSweep(uniform, normalizePlan({ cells: [100], placements: 512, sims: 0 }))).rejects.toMatchObject({
        code: 'GS_ERR_BUDGET',
        message: expect.stringContaining('fewer placements, fewer sims or fewer cell sizes'),
      });
    } finally {
      await small.destroy();
    }
  });

  it('counts the stability surface in the budget when the sweep computes it', async () => {
    // the counts alone fit (3000 x 8 x 1 x 1 = 24000 point-placements); the surface's pixels x placements do not
    const plan = normalizePlan({ cells: [100], placements: 8, sims: 0 });
    const small = new SweepPool({ threads: 1, budget: 1e5 });
    try {
      await expect(small.runSweep(uniform, plan, { stability: true })).rejects.toMatchObject({
        code: 'GS_ERR_BUDGET',
        message: expect.stringContaining('for the stability surface'),
      });
      const { summary } = await small.runSweep(uniform, plan);
      expect(summary.sizes).toHaveLength(1);
    } finally {
      await small.destroy();
    }
  });

  it('reports a placement that keeps fewer than 2 cells as a parameter error', async () => {
    const failure = await double.runSweep(uniform, normalizePlan({ cells: [600], placements: 8, sims: 0, minCoverage: 1 })).catch((e) => e);
    expect(failure).toBeInstanceOf(GridshakeError);
    expect((failure as GridshakeError).code).toBe('GS_ERR_PARAMETER');
    expect((failure as GridshakeError).message).toMatch(/cells of 600 m .* at least 2 are needed: use smaller cells or a lower minCoverage/);
  });
});

describe('SweepPool cancellation and failures', () => {
  it('stops within a second of the abort signal and stays usable', async () => {
    const large = fixtureDataset(200000, false, 21);
    const controller = new AbortController();
    let abortedAt = 0;
    const run = double.runSweep(large, normalizePlan({ cells: [25], placements: 16384, sims: 0 }), {
      signal: controller.signal,
      onProgress: () => {
        if (abortedAt === 0) {
          abortedAt = Date.now();
          controller.abort();
        }
      },
    });
    const failure = await run.catch((error: unknown) => error);
    const stoppedAfter = Date.now() - abortedAt;
    expect(abortedAt).toBeGreaterThan(0);
    expect((failure as Error).name).toBe('AbortError');
    expect((failure as Error).message).toBe('the sweep was cancelled');
    expect(stoppedAfter).toBeLessThan(1000);
    const after = await double.runSweep(uniform, normalizePlan({ cells: [100], placements: 8, sims: 3, alpha: 0.25 }));
    expect(after.rows).toHaveLength(8);
  });

  it('fails the sweep with the worker error message and keeps the pool usable', async () => {
    const folder = mkdtempSync(join(tmpdir(), 'gridshake-pool-'));
    // CommonJS, like the real entry: piscina require()s its task file
    const filename = join(folder, 'failing-task.cjs');
    writeFileSync(
      filename,
      `const poolTask = require(${JSON.stringify(POOL_TASK_FILE)});\n` +
        "module.exports = function failingTask(task) {\n" +
        "  if (task.kind === 'chunk' && task.cellSize === 13) throw new Error('engine failure at 13 m cells');\n" +
        '  return poolTask(task);\n}\n',
    );
    const pool = new SweepPool({ threads: 2, filename });
    try {
      await expect(pool.runSweep(uniform, normalizePlan({ cells: [90, 13], placements: 16, sims: 2, alpha: 0.5 }))).rejects.toThrow(
        'engine failure at 13 m cells',
      );
      const after = await pool.runSweep(uniform, normalizePlan({ cells: [90], placements: 16, sims: 2, alpha: 0.5 }));
      expect(after.summary.sizes).toHaveLength(1);
      expect(after.rows).toHaveLength(16);
    } finally {
      await pool.destroy();
    }
  });
});
