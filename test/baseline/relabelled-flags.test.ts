import { describe, expect, it } from 'vitest';
import { keepBaselineCells } from '../../workers/baseline/keep-baseline-cells.js';
import { poolCounts } from '../../workers/baseline/relabelled-chi-square.js';
import { keptIndexOfCoverage, RelabelledFlagInput } from '../../workers/baseline/relabelled-flags.js';

/**
 * The stability flags' input under random labelling (issue 15): the cells with at least one control of the labelling,
 * E_c ∝ its controls. Hand-checked on a 6-cell grid; applied to the observed labelling it is the observed kept cells
 * with the observed controls (keep-baseline-cells.ts), so observed and simulated flags are one function.
 */
describe('RelabelledFlagInput', () => {
  // grid cells 0..5; the coverage rule keeps 0, 1, 2, 4, 5; controls per grid cell and cases per grid cell
  const coverageKept = { index: Int32Array.from([0, 1, 2, 4, 5]), coverage: Float64Array.from([1, 1, 0.6, 1, 0.8]) };
  const controls = Float64Array.from([2, 0, 3, 9, 1, 4]);
  const cases = Int32Array.from([1, 2, 0, 5, 3, 1]);

  it('the observed labelling gives the kept cells (w_c > 0) with the observed controls as weights', () => {
    const observed = keepBaselineCells(coverageKept, controls, cases);
    expect([...observed.kept.index]).toEqual([0, 2, 4, 5]);
    const keptOf = keptIndexOfCoverage(coverageKept, observed.kept);
    expect([...keptOf]).toEqual([0, -1, 1, 2, 3]);
    const pool = poolCounts(cases, controls, coverageKept);
    expect([...pool]).toEqual([3, 2, 3, 4, 5]);
    const input = new RelabelledFlagInput();
    const m = input.fill(cases, pool, coverageKept, keptOf);
    expect(m).toBe(4);
    expect([...input.counts.subarray(0, m)]).toEqual([1, 0, 3, 1]);
    expect([...input.weights.subarray(0, m)]).toEqual([...observed.weights]);
    expect([...input.keptIndex.subarray(0, m)]).toEqual([0, 1, 2, 3]);
  });

  it('a labelling tests the cells where it has controls, mapped to the observed kept cells (−1: none)', () => {
    const pool = Float64Array.from([3, 2, 3, 4, 5]);
    // simulated cases: cell 0 takes all 3 of its pool (no control left), cell 1 one of 2, cell 2 none, cell 4 four of 4
    const simulated = Int32Array.from([3, 1, 0, 0, 4, 2]);
    const input = new RelabelledFlagInput();
    const m = input.fill(simulated, pool, coverageKept, Int32Array.from([0, -1, 1, 2, 3]));
    expect(m).toBe(3);
    expect([...input.counts.subarray(0, m)]).toEqual([1, 0, 2]);
    expect([...input.weights.subarray(0, m)]).toEqual([1, 3, 3]);
    expect([...input.keptIndex.subarray(0, m)]).toEqual([-1, 1, 3]);
  });
});
