import { describe, it, expect } from 'vitest';
import jStat from 'jstat';
import { placementCoverage } from '../../../workers/geometry/coverage.js';
import { cellOfPoint, createGridFrame } from '../../../workers/geometry/grid-frame.js';
import { pointInRegion } from '../../../workers/geometry/point-in-region.js';
import { createCsrSampler } from '../../../workers/random/csr-sampler.js';
import { createRandom } from '../../../workers/random/seeded-random.js';
import type { Region } from '../../../workers/types.js';
import { regionFromRings, starRing } from '../geometry/region-fixtures.js';

// An invented study area: an L-shaped shell with a pond-like hole (no-data zone) and a separate island shell.
const lShape = regionFromRings([
  [[0, 0], [1000, 0], [1000, 400], [400, 400], [400, 1000], [0, 1000]],
  [[100, 100], [100, 300], [300, 300], [300, 100]],
  [[1200, 600], [1600, 600], [1500, 950]],
]);
const star = regionFromRings([
  starRing(0, 0, 200, 500, Array.from({ length: 3000 }, (_, k) => ((k * 0.618034) % 1) * 0.99)),
  starRing(0, 0, 20, 120, Array.from({ length: 60 }, (_, k) => ((k * 0.414214) % 1) * 0.99), true),
]);

/** Chi-square of sampled counts per cell of a rotated test grid against the cells' area shares. */
function areaShareChiSquare(region: Region, xy: Float64Array, cellSize: number, angle: number) {
  const origin = { x: region.bbox.minX, y: region.bbox.minY };
  const placement = { u: 0.3, v: 0.6, angle };
  const grid = placementCoverage(region, origin, cellSize, placement);
  const frame = createGridFrame(origin, cellSize, placement);
  const observed = new Float64Array(grid.nx * grid.ny);
  const n = xy.length / 2;
  for (let p = 0; p < n; p++) {
    const [i, j] = cellOfPoint(frame, xy[2 * p]!, xy[2 * p + 1]!);
    observed[(j - grid.j0) * grid.nx + (i - grid.i0)]!++;
  }
  let chi2 = 0;
  let cells = 0;
  let pointsInEmptyCells = 0;
  grid.coverage.forEach((coverage, k) => {
    const expected = (n * coverage * cellSize * cellSize) / region.area;
    if (coverage > 0) {
      chi2 += (observed[k]! - expected) ** 2 / expected;
      cells++;
    } else pointsInEmptyCells += observed[k]!;
  });
  return { chi2, df: cells - 1, pointsInEmptyCells };
}

describe('createCsrSampler: exactly uniform points in the valid region', () => {
  it('puts every point inside the region (exact point-in-region), never in the hole', () => {
    for (const region of [lShape, star]) {
      const xy = createCsrSampler(region).sample(20000, createRandom(11));
      for (let p = 0; p < 20000; p++) expect(pointInRegion(region, xy[2 * p]!, xy[2 * p + 1]!)).toBe(true);
    }
  });

  it('counts in sub-areas match their area shares: chi-square below the 0.1 % critical value (seeds fixed)', () => {
    // Under uniformity the counts are multinomial with cell probabilities a_c / A, so the Pearson statistic is
    // approximately chi-square with (cells - 1) df (Pearson 1900); critical value from jstat.chisquare.inv.
    for (const [region, cellSize, angle] of [
      [lShape, 150, 0],
      [lShape, 110, 33],
      [star, 90, 12],
    ] as const) {
      const xy = createCsrSampler(region).sample(60000, createRandom(2024));
      const { chi2, df, pointsInEmptyCells } = areaShareChiSquare(region, xy, cellSize, angle);
      expect(pointsInEmptyCells).toBe(0);
      expect(df).toBeGreaterThan(20);
      expect(chi2).toBeLessThan(jStat.chisquare.inv(0.999, df));
    }
  });

  it('the share of points on the island equals its share of the area (binomial, 4 standard errors)', () => {
    const n = 50000;
    const xy = createCsrSampler(lShape).sample(n, createRandom(5));
    let island = 0;
    for (let p = 0; p < n; p++) if (xy[2 * p]! > 1100) island++;
    const share = (0.5 * 400 * 350) / lShape.area;
    expect(Math.abs(island / n - share)).toBeLessThan(4 * Math.sqrt((share * (1 - share)) / n));
  });

  it('is deterministic given the seed, and different seeds give different patterns', () => {
    const sampler = createCsrSampler(star);
    const a = sampler.sample(1000, createRandom(42));
    const b = createCsrSampler(star).sample(1000, createRandom(42));
    const c = sampler.sample(1000, createRandom(43));
    expect(Array.from(b)).toEqual(Array.from(a));
    expect(Array.from(c)).not.toEqual(Array.from(a));
  });

  it('draws mostly accepted candidates and rejects an empty region', () => {
    expect(createCsrSampler(lShape).acceptance).toBeGreaterThan(0.8);
    expect(createCsrSampler(star).acceptance).toBeGreaterThan(0.4); // a very jagged 1500-vertex boundary
    expect(createCsrSampler(lShape).sample(0, createRandom(1))).toHaveLength(0);
    const empty = regionFromRings([[[0, 0], [1, 0], [2, 0]]]);
    expect(() => createCsrSampler(empty)).toThrow(/valid region is empty/);
  });
});
