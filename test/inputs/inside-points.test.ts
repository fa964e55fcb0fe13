import { describe, it, expect } from 'vitest';
import { insideCoordinates, insideCount, isEveryPointInside, withEveryPointInside } from '../../server/inputs/index.js';

// The definition checked: Dataset.inside lists the indices (into xy / 2) of the points inside the valid region, in
// storage order (shared/contracts.ts); a dataset whose points are all inside answers as the identity index would.
describe('datasets whose points are all inside the valid region (server/inputs/inside-points.ts)', () => {
  it('answers the count and the question without building the index, and builds the identity index when read', () => {
    const dataset = withEveryPointInside({ xy: new Float64Array([1, 2, 3, 4, 5, 6]) });
    expect(insideCount(dataset)).toBe(3);
    expect(isEveryPointInside(dataset)).toBe(true);
    expect(insideCoordinates(dataset)).toBe(dataset.xy);
    expect(Array.from(dataset.inside)).toEqual([0, 1, 2]);
    expect(dataset.inside).toBe(dataset.inside);
  });

  it('drops the mark when the index is replaced, and scans a plain index', () => {
    const dataset = withEveryPointInside({ xy: new Float64Array([1, 2, 3, 4, 5, 6]) });
    dataset.inside = new Uint32Array([0, 2]);
    expect(insideCount(dataset)).toBe(2);
    expect(isEveryPointInside(dataset)).toBe(false);
    expect(Array.from(insideCoordinates(dataset))).toEqual([1, 2, 5, 6]);
    expect(isEveryPointInside({ xy: new Float64Array(4), inside: new Uint32Array([0, 1]) })).toBe(true);
    expect(isEveryPointInside({ xy: new Float64Array(4), inside: new Uint32Array([1, 0]) })).toBe(false);
  });
});
