import { describe, it, expect } from 'vitest';
import { selectCells } from '../../../workers/placement/select-cells.js';

const grid = { i0: -1, j0: 2, nx: 3, ny: 2, coverage: Float64Array.from([0, 0.25, 1, 0.5 - 5e-10, 0.5 - 2e-9, 1 - 1e-12]) };

describe('selectCells (design.md: coverage >= minCoverage - 1e-9 and > 0)', () => {
  it('keeps whole cells only at minCoverage 1, within the 1e-9 tolerance', () => {
    const kept = selectCells(grid, 1);
    expect(Array.from(kept.index)).toEqual([2, 5]);
    expect(Array.from(kept.coverage)).toEqual([1, 1 - 1e-12]);
  });

  it('applies the tolerance at 0.5 and never keeps empty cells, even at minCoverage 0', () => {
    expect(Array.from(selectCells(grid, 0.5).index)).toEqual([2, 3, 5]);
    expect(Array.from(selectCells(grid, 0).index)).toEqual([1, 2, 3, 4, 5]);
  });

  it('rejects a minCoverage outside [0, 1]', () => {
    expect(() => selectCells(grid, 1.5)).toThrow(/minCoverage must be a number in \[0, 1\]/);
    expect(() => selectCells(grid, Number.NaN)).toThrow(RangeError);
  });
});
