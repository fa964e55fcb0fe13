/**
 * Calibration of the Monte Carlo test against a population-at-risk baseline (issue 15): the size of the
 * placement-robust Monte Carlo test (Besag & Diggle 1977, Applied Statistics 26:327-333:
 * p = (1 + #{simulated >= observed}) / (R + 1)) must stay within alpha +/- 1.5 percentage points when the data follow
 * the baseline.
 *
 * An invented 1000 m x 800 m study area with a rectangular no-data zone, cut into 4 x 2 baseline blocks of very
 * different residents (one block partly over the zone), loaded through server/inputs (areal weighting inside the
 * valid region). Observed patterns are drawn here, independently of the engine: each point in block k with
 * probability ∝ residents, uniform in the block's valid part (rejection of the zone). The engine's simulated patterns
 * come from its own null sampler (workers/baseline), and the production kernels run as in a sweep (evaluateChunk,
 * placementRobustTest) with 8 Halton placements with rotation, 100 m squares, R = 19.
 * Controls: cases and controls both drawn here from the same residents; the engine's null is random labelling
 * (Diggle 2003/2014). With R = 19, P(p <= 0.05) = 1/20 exactly under the null (exchangeability), less with ties.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { loadDataset } from '../../server/inputs/index.js';
import { placementRobustTest } from '../../server/summary/placement-robust-test.js';
import type { Baseline } from '../../workers/baseline/baseline.js';
import { createLabellingSampler, createPolygonSampler, type PatternSampler } from '../../workers/baseline/baseline-sampler.js';
import { createBaselineWeigher } from '../../workers/baseline/baseline-weights.js';
import { createCellCounter } from '../../workers/placement/index.js';
import { createRandom, deriveSeed, haltonPlacements } from '../../workers/random/index.js';
import { evaluateChunk } from '../../workers/sweep/evaluate-chunk.js';
import { decodeStatistics, STATISTICS_FIELDS } from '../../workers/sweep/statistics-codec.js';
import { simulatedFlagOffset, simulatedValueOffset } from '../../workers/sweep/sweep-task.js';
import type { Origin, Region } from '../../workers/types.js';
import { seededRandom } from '../fixtures/seeded-random.js';

const PATTERNS = 2000;
const SIMS = 19;
const ALPHA = 0.05;
/** issue 15: the Monte Carlo size within alpha +/- 1.5 percentage points */
const TOLERANCE = 0.015;

const ZONE = [600, 200, 800, 500];
const RESIDENTS = [50, 400, 20, 900, 300, 10, 600, 120];
const BLOCKS = RESIDENTS.map((_, k) => [(k % 4) * 250, Math.floor(k / 4) * 400, (k % 4) * 250 + 250, Math.floor(k / 4) * 400 + 400]);
const ring = ([x0, y0, x1, y1]: number[]) => [[x0, y0], [x1, y0], [x1, y1], [x0, y1], [x0, y0]];
const collection = (rings: number[][][], properties: Record<string, unknown>[] = []) =>
  JSON.stringify({ type: 'FeatureCollection', features: rings.map((r, k) => ({ type: 'Feature', properties: properties[k] ?? {}, geometry: { type: 'Polygon', coordinates: [r] } })) });

function inZone(x: number, y: number): boolean {
  return x > ZONE[0]! && x < ZONE[2]! && y > ZONE[1]! && y < ZONE[3]!;
}

/** n points from the residents, drawn in this test (not by the engine). */
function populationPoints(n: number, random: () => number): Float64Array {
  const total = RESIDENTS.reduce((a, b) => a + b, 0);
  const xy = new Float64Array(2 * n);
  for (let p = 0; p < n; p++) {
    let target = random() * total;
    let k = 0;
    while (k < RESIDENTS.length - 1 && target >= RESIDENTS[k]!) target -= RESIDENTS[k++]!;
    const [x0, y0, x1, y1] = BLOCKS[k]!;
    let x: number;
    let y: number;
    do {
      x = x0! + (x1! - x0!) * random();
      y = y0! + (y1! - y0!) * random();
    } while (inZone(x, y));
    xy[2 * p] = x;
    xy[2 * p + 1] = y;
  }
  return xy;
}

function loadTown(): { region: Region; origin: Origin; baseline: Baseline } {
  const dataset = loadDataset(
    {
      points: { name: 'points.csv', content: 'id,x,y\n1,100,100\n2,900,700\n' },
      area: { name: 'area.geojson', content: collection([ring([0, 0, 1000, 800])]) },
      noData: [{ name: 'zone.geojson', content: collection([ring(ZONE)]) }],
      baseline: { name: 'blocks.geojson', content: collection(BLOCKS.map(ring), RESIDENTS.map((residents) => ({ residents }))) },
    },
    { crs: 'planar', baselineField: 'residents' },
  );
  return { region: dataset.region, origin: dataset.origin, baseline: dataset.baseline!.engine };
}

/** The share of patterns whose Monte Carlo p (median and maximum of chi2/df over placements) is <= alpha. */
function rejectionRates(
  draw: (pattern: number) => { cases: Float64Array; baseline: Baseline; sampler: PatternSampler },
  region: Region,
  origin: Origin,
): { median: number; max: number } {
  const design = haltonPlacements(8, true, 90);
  const placements = Float64Array.from(design.flatMap((p) => [p.u, p.v, p.angle]));
  const count = design.length;
  let medianRejects = 0;
  let maxRejects = 0;
  for (let pattern = 0; pattern < PATTERNS; pattern++) {
    const { cases, baseline, sampler } = draw(pattern);
    const n = cases.length / 2;
    const simulated = Array.from({ length: SIMS }, (_, r) =>
      createCellCounter(sampler.sample(n, createRandom(deriveSeed(1500 + pattern, r))), origin),
    );
    const result = evaluateChunk(
      {
        region,
        origin,
        observed: createCellCounter(cases, origin),
        simulated,
        cellSize: 100,
        minCoverage: 0.5,
        alpha: ALPHA,
        baseline: createBaselineWeigher(baseline, origin),
      },
      placements,
    );
    const observed = new Float64Array(count);
    const observedSignificant = new Uint8Array(count);
    const simulatedValues = new Float64Array(SIMS * count);
    const simulatedSignificant = new Uint8Array(SIMS * count);
    for (let j = 0; j < count; j++) {
      const stats = decodeStatistics(result, j * STATISTICS_FIELDS);
      observed[j] = stats.chi2PerDf;
      observedSignificant[j] = stats.verdict === 'csr' ? 0 : 1;
      for (let r = 0; r < SIMS; r++) {
        simulatedValues[r * count + j] = result[simulatedValueOffset(count, SIMS, j, r)]!;
        simulatedSignificant[r * count + j] = result[simulatedFlagOffset(count, SIMS, j, r)]!;
      }
    }
    const test = placementRobustTest({ observed, observedSignificant, simulated: simulatedValues, simulatedSignificant, sims: SIMS });
    if (test.pMedianClustered <= ALPHA) medianRejects += 1;
    if (test.pMaxClustered <= ALPHA) maxRejects += 1;
  }
  return { median: medianRejects / PATTERNS, max: maxRejects / PATTERNS };
}

describe('Monte Carlo test against a baseline when the data follow it (size within alpha +/- 1.5 points)', () => {
  let polygons = { median: Number.NaN, max: Number.NaN };
  let controls = { median: Number.NaN, max: Number.NaN };

  beforeAll(() => {
    const town = loadTown();
    const polygonSampler = createPolygonSampler(town.baseline as Extract<Baseline, { kind: 'polygons' }>);
    const random = seededRandom(150415);
    polygons = rejectionRates(() => ({ cases: populationPoints(150, random), baseline: town.baseline, sampler: polygonSampler }), town.region, town.origin);
    const labels = seededRandom(150416);
    controls = rejectionRates(
      () => {
        const cases = populationPoints(80, labels);
        const controlPoints = populationPoints(160, labels);
        return { cases, baseline: { kind: 'controls', controls: controlPoints }, sampler: createLabellingSampler(cases, controlPoints) };
      },
      town.region,
      town.origin,
    );
    console.log(`baseline calibration over ${PATTERNS} patterns each: polygons median ${polygons.median}, max ${polygons.max}; controls median ${controls.median}, max ${controls.max}`);
  }, 600_000);

  it('polygons: median and maximum of chi2/df', () => {
    expect(Math.abs(polygons.median - ALPHA)).toBeLessThan(TOLERANCE);
    expect(Math.abs(polygons.max - ALPHA)).toBeLessThan(TOLERANCE);
  });

  it('controls under random labelling: median and maximum of chi2/df', () => {
    expect(Math.abs(controls.median - ALPHA)).toBeLessThan(TOLERANCE);
    expect(Math.abs(controls.max - ALPHA)).toBeLessThan(TOLERANCE);
  });
});
