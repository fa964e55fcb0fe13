/**
 * Issue 9 item 4: the overall conclusion is one test at level alpha. On CSR data sets (points uniform in the
 * valid region of an invented district with a reservoir as no-data zone), the share of sweeps whose overall
 * sentence claims a departure must stay within alpha (binomial error allowed), while the old rule ("any size,
 * either tail, at alpha") is shown for comparison. Bounded: DATASETS sweeps of 2 sizes x 8 placements x (1 + 19)
 * patterns, about a minute on 2 cores.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { normalizePlan } from '../../server/sweeps/plan.js';
import { SweepPool } from '../../server/sweeps/sweep-pool.js';
import { fixtureDataset } from '../sweeps/sweep-fixtures.js';

const DATASETS = Number(process.env.GS_CALIBRATION_DATASETS ?? 400);
const ALPHA = 0.05;

let pool: SweepPool;
beforeAll(() => {
  pool = new SweepPool({ threads: 2 });
});
afterAll(async () => {
  await pool.destroy();
});

describe('overall conclusion on CSR data (calibration)', () => {
  it(`claims a departure in at most alpha of ${DATASETS} CSR data sets (2 cell sizes, R = 19)`, async () => {
    let overallClaims = 0;
    let anySizeClaims = 0;
    for (let k = 0; k < DATASETS; k++) {
      const dataset = fixtureDataset(160, false, 1000 + k);
      const plan = normalizePlan({ cells: [110, 180], placements: 8, sims: 19, alpha: ALPHA, seed: 5000 + k });
      const { summary } = await pool.runSweep(dataset, plan);
      expect(summary.overallTest).toBeTruthy();
      if (summary.overallTest!.rejects) overallClaims += 1;
      if (/finds a departure/.test(summary.conclusion)) expect(summary.overallTest!.rejects).toBe(true);
      // the old sentence: "finds clustering/regularity at k of K sizes" whenever any size and either tail reached alpha
      if (summary.sizes.some((size) => size.monteCarlo!.pMedianClustered <= ALPHA || size.monteCarlo!.pMedianRegular <= ALPHA)) anySizeClaims += 1;
    }
    const rate = overallClaims / DATASETS;
    const oldRate = anySizeClaims / DATASETS;
    console.log(`overall test: ${overallClaims}/${DATASETS} = ${(100 * rate).toFixed(1)} % claims; any size, either tail: ${anySizeClaims}/${DATASETS} = ${(100 * oldRate).toFixed(1)} %`);
    // one-sided binomial bound: alpha + 2.33 sd (1 % chance of a false alarm for a correct test)
    expect(rate).toBeLessThanOrEqual(ALPHA + 2.33 * Math.sqrt((ALPHA * (1 - ALPHA)) / DATASETS));
  });
});
