/**
 * Calibration of the Monte Carlo test with hexagonal cells on CSR data (issue 16): the size of the placement-robust
 * Monte Carlo test (Besag & Diggle 1977, Applied Statistics 26:327-333: p = (1 + #{simulated >= observed}) / (R + 1))
 * must stay within alpha +/- 1.5 percentage points. An invented study area of 1000 m x 800 m with a rectangular
 * no-data zone, 200 points, hexagons of area 180 m x 180 m (partial cells kept from coverage 0.5, so expected counts
 * follow coverage), 12 Halton placements with rotation over the 60 degree period.
 *
 * Runs the production per-task kernel (workers/sweep evaluateChunk with shape 'hex') and summary
 * (placementRobustTest) without the pool, on 2000 independent CSR patterns, each with its own R = 19 simulated
 * patterns (exact test: P(p <= 0.05) = 1/20 under CSR, less with ties).
 */
import { beforeAll, describe, it, expect } from 'vitest';
import { placementRobustTest } from '../../server/summary/placement-robust-test.js';
import { latticeOf } from '../../workers/lattice/registry.js';
import { createCellCounter } from '../../workers/placement/index.js';
import { createCsrSampler, createRandom, deriveSeed, haltonPlacements } from '../../workers/random/index.js';
import { evaluateChunk } from '../../workers/sweep/evaluate-chunk.js';
import { decodeStatistics, STATISTICS_FIELDS } from '../../workers/sweep/statistics-codec.js';
import { simulatedFlagOffset, simulatedValueOffset } from '../../workers/sweep/sweep-task.js';
import type { Region } from '../../workers/types.js';

const PATTERNS = 2000;
const SIMS = 19;
const POINTS = 200;
const ALPHA = 0.05;
/** issue 16: the Monte Carlo size within alpha +/- 1.5 percentage points */
const TOLERANCE = 0.015;

// shell counter-clockwise, no-data zone clockwise (design.md: the valid region's rings)
const REGION: Region = {
  rings: [Float64Array.from([0, 0, 1000, 0, 1000, 800, 0, 800]), Float64Array.from([600, 200, 600, 500, 800, 500, 800, 200])],
  area: 1000 * 800 - 200 * 300,
  bbox: { minX: 0, minY: 0, maxX: 1000, maxY: 800 },
};
const ORIGIN = { x: 0, y: 0 };

describe('Monte Carlo test with hexagonal cells on CSR data (size within alpha +/- 1.5 points)', () => {
  const sampler = createCsrSampler(REGION);
  const design = haltonPlacements(12, true, latticeOf('hex').anglePeriod);
  const placements = Float64Array.from(design.flatMap((p) => [p.u, p.v, p.angle]));
  const count = design.length;
  let stream = 0;
  const csrCounter = () => createCellCounter(sampler.sample(POINTS, createRandom(deriveSeed(1616, stream++))), ORIGIN);
  let medianRate = Number.NaN;
  let maxRate = Number.NaN;

  beforeAll(() => {
    let medianRejects = 0;
    let maxRejects = 0;
    for (let pattern = 0; pattern < PATTERNS; pattern++) {
      const result = evaluateChunk(
        {
          region: REGION,
          origin: ORIGIN,
          observed: csrCounter(),
          simulated: Array.from({ length: SIMS }, csrCounter),
          cellSize: 180,
          shape: 'hex',
          minCoverage: 0.5,
          alpha: ALPHA,
        },
        placements,
      );
      const observed = new Float64Array(count);
      const observedSignificant = new Uint8Array(count);
      const simulated = new Float64Array(SIMS * count);
      const simulatedSignificant = new Uint8Array(SIMS * count);
      for (let j = 0; j < count; j++) {
        const stats = decodeStatistics(result, j * STATISTICS_FIELDS);
        observed[j] = stats.chi2PerDf;
        observedSignificant[j] = stats.verdict === 'csr' ? 0 : 1;
        for (let r = 0; r < SIMS; r++) {
          simulated[r * count + j] = result[simulatedValueOffset(count, SIMS, j, r)]!;
          simulatedSignificant[r * count + j] = result[simulatedFlagOffset(count, SIMS, j, r)]!;
        }
      }
      const test = placementRobustTest({ observed, observedSignificant, simulated, simulatedSignificant, sims: SIMS });
      if (test.pMedianClustered <= ALPHA) medianRejects += 1;
      if (test.pMaxClustered <= ALPHA) maxRejects += 1;
    }
    medianRate = medianRejects / PATTERNS;
    maxRate = maxRejects / PATTERNS;
    console.log(`hexagon CSR calibration over ${PATTERNS} patterns: Monte Carlo median ${medianRate}, max ${maxRate}`);
  });

  it('the Monte Carlo test of the median of chi2/df over placements', () => {
    expect(Math.abs(medianRate - ALPHA)).toBeLessThan(TOLERANCE);
  });

  it('the Monte Carlo test of the maximum of chi2/df over placements', () => {
    expect(Math.abs(maxRate - ALPHA)).toBeLessThan(TOLERANCE);
  });
});
