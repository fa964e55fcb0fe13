import { describe, it, expect } from 'vitest';
import { sizeNumbers } from '../../shared/charts/size-numbers.js';
import { makeMonteCarlo, makeRow, makeSize } from './summary-fixture.js';

describe('sizeNumbers(size)', () => {
  it('states the numbers behind a size conclusion in plain sentences', () => {
    const size = makeSize({
      cellSize: 212.6,
      expectedPerCell: 2.04,
      placements: 64,
      reference: makeRow({ vmr: 2.345, verdict: 'clustered' }),
      referenceRank: 0.97,
      referenceInTail: true,
      monteCarlo: makeMonteCarlo({ sims: 99, pMedianClustered: 0.01, pMedianRegular: 1, pMaxClustered: 0.0004 }),
    });
    expect(sizeNumbers(size)).toEqual([
      'Cell side 213 m, about 2.04 expected points per whole cell, 64 placements.',
      'Chi-square / df: median 1.6, 5-95 % of placements 1 to 2.3.',
      'Verdicts: 75 % clustered, 25 % no departure from CSR, 0 % regular; agreement 75 %.',
      'Reference grid: VMR 2.35, verdict clustered, 97 % of placements have a lower VMR (in the tail: the default grid is not typical).',
      'Monte Carlo (99 CSR patterns): p = 0.01 for clustering and 1 for regularity on the median; p = 0.0004 on the maximum.',
    ]);
  });

  it('leaves out the Monte Carlo sentence without simulations', () => {
    expect(sizeNumbers(makeSize({}))).toHaveLength(4);
  });
});
