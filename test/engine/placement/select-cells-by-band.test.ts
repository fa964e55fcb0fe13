import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { placementCoverage, ringsInCellUnits } from '../../../workers/geometry/coverage.js';
import { selectCells } from '../../../workers/placement/select-cells.js';
import { createBandBuffers, keptCellBound, selectCellsByBand } from '../../../workers/placement/select-cells-by-band.js';
import { regionFromRings, starRing } from '../geometry/region-fixtures.js';

const fractions = (count: number) => fc.array(fc.double({ min: 0, max: 0.999, noNaN: true }), { minLength: count, maxLength: count });

// The reference is the engine's own whole-grid path (signed-area coverage, checked against Sutherland & Hodgman
// clipping in test/engine/geometry); the banded path must reproduce it bit for bit, whatever the band height.
describe('selectCellsByBand (the kept cells one band of grid rows at a time)', () => {
  it('keeps exactly the cells, coverages and order of selectCells on the whole grid, for bands of 1 row up to the whole grid', () => {
    fc.assert(
      fc.property(
        fractions(40),
        fractions(14),
        fc.double({ min: 40, max: 300, noNaN: true }),
        fc.double({ min: 0, max: 0.999999, noNaN: true }),
        fc.double({ min: 0, max: 0.999999, noNaN: true }),
        fc.double({ min: 0, max: 89.99, noNaN: true }),
        fc.constantFrom(1, 0.75, 0.5, 0.1, 0),
        fc.constantFrom(1, 7, 64, 1000, 1 << 18),
        (shell, hole, cellSize, u, v, angle, minCoverage, bandCells) => {
          const region = regionFromRings([starRing(2000, 2000, 900, 1900, shell), starRing(2000, 2000, 150, 600, hole, true)]);
          const origin = { x: 0, y: 0 };
          const placement = { u, v, angle };
          const whole = placementCoverage(region, origin, cellSize, placement);
          const expected = selectCells(whole, minCoverage);
          const buffers = createBandBuffers();
          const banded = selectCellsByBand(region, origin, cellSize, placement, minCoverage, buffers, bandCells);
          expect(banded.grid).toEqual({ i0: whole.i0, j0: whole.j0, nx: whole.nx, ny: whole.ny });
          expect(Array.from(banded.kept.index)).toEqual(Array.from(expected.index));
          // Object.is equality of every float64 (toEqual on arrays of numbers)
          expect(Array.from(banded.kept.coverage)).toEqual(Array.from(expected.coverage));
          // the bound holds for the cells with any coverage
          const positive = whole.coverage.reduce((sum, c) => sum + (c > 0 ? 1 : 0), 0);
          expect(keptCellBound(ringsInCellUnits(region, origin, cellSize, placement))).toBeGreaterThanOrEqual(positive);
        },
      ),
      { numRuns: 150 },
    );
  });

  it('reuses its buffers from placement to placement and still gives fresh results', () => {
    const region = regionFromRings([starRing(0, 0, 3000, 5000, Array.from({ length: 50 }, (_, k) => (k * 0.43) % 1))]);
    const origin = { x: -6000, y: -6000 };
    const buffers = createBandBuffers();
    for (const [cellSize, angle] of [[50, 0], [35, 30], [80, 45], [35, 10]] as const) {
      const placement = { u: 0.3, v: 0.8, angle };
      const banded = selectCellsByBand(region, origin, cellSize, placement, 0.5, buffers, 5000);
      const expected = selectCells(placementCoverage(region, origin, cellSize, placement), 0.5);
      expect(Array.from(banded.kept.index)).toEqual(Array.from(expected.index));
      expect(Array.from(banded.kept.coverage)).toEqual(Array.from(expected.coverage));
      expect(buffers.band.length).toBeLessThanOrEqual(5000);
    }
  });

  it('refuses a minCoverage outside [0, 1] as selectCells does', () => {
    const region = regionFromRings([starRing(0, 0, 300, 500, [0.1, 0.5, 0.3, 0.2, 0.9, 0.4, 0.6, 0.7])]);
    expect(() => selectCellsByBand(region, { x: 0, y: 0 }, 50, { u: 0, v: 0, angle: 0 }, 1.5, createBandBuffers())).toThrow(/minCoverage/);
  });
});
