import { describe, it, expect } from 'vitest';
import { fitTransform, ringsBox, unionBox } from '../../client/src/map/map-transform.js';

describe('fitTransform(box, width, height, padding)', () => {
  it('fits a 2000 x 1000 m box into 420 x 420 px with 10 px padding, centred, north up', () => {
    const transform = fitTransform({ minX: 1000, minY: 5000, maxX: 3000, maxY: 6000 }, 420, 420, 10);
    // scale = min(400 / 2000, 400 / 1000) = 0.2 px/m; the 200 px high drawing is centred: 100 px spare above and below
    expect(transform.scale).toBe(0.2);
    expect(transform.toPixel(1000, 5000)).toEqual([10, 310]);
    expect(transform.toPixel(3000, 6000)).toEqual([410, 110]);
    expect(transform.toPixel(2000, 5500)).toEqual([210, 210]);
  });

  it('widens a degenerate box to 1 m', () => {
    const transform = fitTransform({ minX: 5, minY: 5, maxX: 5, maxY: 5 }, 100, 100, 0);
    expect(transform.scale).toBe(100);
  });
});

describe('ringsBox and unionBox', () => {
  it('bound rings and combine boxes', () => {
    expect(ringsBox([[[0, 1], [4, -2], [3, 5]]])).toEqual({ minX: 0, minY: -2, maxX: 4, maxY: 5 });
    expect(ringsBox([])).toBeNull();
    expect(unionBox({ minX: 0, minY: 0, maxX: 1, maxY: 1 }, { minX: -1, minY: 0.5, maxX: 0.5, maxY: 3 })).toEqual({ minX: -1, minY: 0, maxX: 1, maxY: 3 });
    expect(unionBox(null, null)).toBeNull();
  });
});
