import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Dataset } from '../../shared/contracts.js';
import { loadDataset } from '../../server/inputs/index.js';
import { normalizePlan } from '../../server/sweeps/plan.js';
import { SweepPool } from '../../server/sweeps/sweep-pool.js';
import { placementCoverage } from '../../workers/geometry/coverage.js';
import { rectangleUnionArea, type Rectangle } from './rectangle-union.js';

// Properties the engine's own tests (test/engine/**) check on synthetic regions, checked here end to end: on valid
// regions built by server/inputs (turf overlay of overlapping no-data zones) and through the piscina pool.
// Needs dist/ (npm test builds; or npx tsc -p tsconfig.json).
const SEED = 7031;

const rectangleRing = (r: Rectangle): number[][] => [[r.x0, r.y0], [r.x1, r.y0], [r.x1, r.y1], [r.x0, r.y1], [r.x0, r.y0]];
const geojson = (rings: number[][][]): string =>
  JSON.stringify({ type: 'FeatureCollection', features: rings.map((ring) => ({ type: 'Feature', properties: {}, geometry: { type: 'Polygon', coordinates: [ring] } })) });

/** A study rectangle with 0..4 axis-aligned no-data rectangles that may overlap each other and stick out. */
const scenario = fc.record({
  width: fc.integer({ min: 200, max: 3000 }),
  height: fc.integer({ min: 200, max: 3000 }),
  x0: fc.integer({ min: -50_000, max: 50_000 }),
  y0: fc.integer({ min: -50_000, max: 50_000 }),
  zones: fc.array(fc.tuple(fc.double({ min: -0.2, max: 0.9, noNaN: true }), fc.double({ min: -0.2, max: 0.9, noNaN: true }), fc.double({ min: 0.05, max: 0.4, noNaN: true }), fc.double({ min: 0.05, max: 0.4, noNaN: true })), { maxLength: 4 }),
  points: fc.array(fc.tuple(fc.double({ min: 0, max: 1, noNaN: true, maxExcluded: true }), fc.double({ min: 0, max: 1, noNaN: true, maxExcluded: true })), { minLength: 30, maxLength: 120 }),
});

type Scenario = typeof scenario extends fc.Arbitrary<infer T> ? T : never;

function build(s: Scenario): { dataset: Dataset; area: Rectangle; zones: Rectangle[] } {
  const area: Rectangle = { x0: s.x0, y0: s.y0, x1: s.x0 + s.width, y1: s.y0 + s.height };
  const zones = s.zones.map(([u, v, w, h]) => ({
    x0: s.x0 + u * s.width,
    y0: s.y0 + v * s.height,
    x1: s.x0 + (u + w) * s.width,
    y1: s.y0 + (v + h) * s.height,
  }));
  const rows = s.points.map(([u, v]) => `${s.x0 + u * s.width},${s.y0 + v * s.height}`);
  const dataset = loadDataset(
    {
      points: { name: 'pts.csv', content: `x,y\n${rows.join('\n')}\n` },
      area: { name: 'area.geojson', content: geojson([rectangleRing(area)]) },
      noData: zones.length > 0 ? [{ name: 'zones.geojson', content: geojson(zones.map(rectangleRing)) }] : [],
    },
    { crs: 'planar' },
  );
  return { dataset, area, zones };
}

/** Valid area by exact rectangle arithmetic: area(A) - area(A intersect union of zones). */
function oracleValidArea(area: Rectangle, zones: Rectangle[]): number {
  const clipped = zones
    .map((z) => ({ x0: Math.max(z.x0, area.x0), y0: Math.max(z.y0, area.y0), x1: Math.min(z.x1, area.x1), y1: Math.min(z.y1, area.y1) }))
    .filter((z) => z.x1 > z.x0 && z.y1 > z.y0);
  return (area.x1 - area.x0) * (area.y1 - area.y0) - rectangleUnionArea(clipped);
}

const hasValidRegion = (s: Scenario): boolean => {
  try {
    build(s);
    return true;
  } catch {
    return false;
  }
};

describe('engine properties on regions built by the inputs', () => {
  it('coverage is in [0, 1] and coverage x s^2 sums to the valid area (exact rectangle union as oracle)', () => {
    let cases = 0;
    fc.assert(
      fc.property(
        scenario.filter(hasValidRegion),
        fc.double({ min: 0, max: 0.999, noNaN: true }),
        fc.double({ min: 0, max: 0.999, noNaN: true }),
        fc.double({ min: 0, max: 89.99, noNaN: true }),
        fc.integer({ min: 3, max: 40 }),
        (s, u, v, angle, across) => {
          const { dataset, area, zones } = build(s);
          const expected = oracleValidArea(area, zones);
          expect(dataset.region.area).toBeCloseTo(expected, 6);
          const cellSize = Math.max(s.width, s.height) / across;
          const grid = placementCoverage(dataset.region, dataset.origin, cellSize, { u, v, angle });
          let sum = 0;
          for (const c of grid.coverage) {
            expect(c).toBeGreaterThanOrEqual(0);
            expect(c).toBeLessThanOrEqual(1 + 1e-12);
            sum += c;
          }
          expect(Math.abs(sum * cellSize * cellSize - expected)).toBeLessThan(1e-9 * expected + 1e-6);
          cases += 1;
        },
      ),
      { seed: SEED, numRuns: 150 },
    );
    console.log(`engine properties (coverage sums on input-built regions): ${cases} cases, 0 failures`);
  });
});

describe('engine properties through the sweep pool', () => {
  let pool: SweepPool;
  beforeAll(() => {
    pool = new SweepPool({ threads: 2 });
  });
  afterAll(async () => {
    await pool.destroy();
  });

  it('counts: with the smallest minCoverage every inside point is counted in every placement; Monte Carlo p in [1/(R+1), 1]', async () => {
    const samples = fc.sample(fc.tuple(scenario.filter(hasValidRegion), fc.integer({ min: 1, max: 19 }), fc.integer({ min: 1, max: 1e6 })), { seed: SEED, numRuns: 12 });
    let sweeps = 0;
    let pValues = 0;
    for (const [s, sims, seed] of samples) {
      const { dataset } = build(s);
      const side = Math.sqrt(dataset.region.area / 12);
      // alpha 0.5 lets every R from 1 up run (1/(R+1) <= alpha, shared/monte-carlo-rule.ts)
      const plan = normalizePlan({ cells: [side, side / 2], placements: 6, sims, seed, minCoverage: 1e-9, alpha: 0.5 });
      const { rows, summary } = await pool.runSweep(dataset, plan);
      expect(rows).toHaveLength(12);
      for (const row of rows) expect(row.points).toBe(dataset.inside.length);
      for (const size of summary.sizes) {
        const mc = size.monteCarlo;
        expect(mc?.sims).toBe(sims);
        for (const p of [mc!.pMedianClustered, mc!.pMedianRegular, mc!.pMaxClustered, mc!.pMinRegular]) {
          expect(p).toBeGreaterThanOrEqual(1 / (sims + 1) - 1e-12);
          expect(p).toBeLessThanOrEqual(1);
          // (1 + count) / (R + 1): a whole number of steps of 1/(R+1) (Besag & Diggle 1977, Applied Statistics 26:327-333)
          expect(Math.abs(p * (sims + 1) - Math.round(p * (sims + 1)))).toBeLessThan(1e-9);
          pValues += 1;
        }
        // the median and maximum tests look at the same simulated patterns from opposite tails
        expect(mc!.pMedianClustered + mc!.pMedianRegular).toBeGreaterThanOrEqual(1 + 1 / (sims + 1) - 1e-9);
      }
      sweeps += 1;
    }
    console.log(`engine properties (through the pool): ${sweeps} sweeps, ${pValues} Monte Carlo p-values in [1/(R+1), 1], 0 failures`);
  });
});
