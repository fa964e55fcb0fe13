import { describe, it, expect } from 'vitest';
import { createCellCounter } from '../../../workers/placement/cell-counter.js';
import { describeCells } from '../../../workers/placement/describe-cells.js';
import { regionFromRings } from '../geometry/region-fixtures.js';

describe('describeCells: one placement cell by cell, for grid.geojson', () => {
  // Invented 300 m x 200 m area with a 100 m x 100 m no-data zone in the middle column (a hole).
  const region = regionFromRings([
    [[0, 0], [300, 0], [300, 200], [0, 200]],
    [[100, 50], [100, 150], [200, 150], [200, 50]],
  ]);
  const xy = Float64Array.from([10, 10, 20, 20, 30, 150, 250, 10, 250, 190, 120, 20, 180, 180, 290, 120]);

  it('lists every cell with coverage > 0 with its count, kept flag and expected count (hand computation)', () => {
    const cells = describeCells({
      counter: createCellCounter(xy, { x: 0, y: 0 }),
      region,
      origin: { x: 0, y: 0 },
      cellSize: 100,
      placement: { u: 0, v: 0, angle: 0 },
      minCoverage: 1,
    });
    // 3 x 2 cells of 100 m; the two middle cells are half covered (the hole takes 50 x 100 of each)
    expect(cells.map((c) => [c.i, c.j, c.count, c.coverage, c.kept])).toEqual([
      [0, 0, 2, 1, true],
      [1, 0, 1, 0.5, false],
      [2, 0, 1, 1, true],
      [0, 1, 1, 1, true],
      [1, 1, 1, 0.5, false],
      [2, 1, 2, 1, true],
    ]);
    // N = 6 points in the 4 kept whole cells: expected 6 * 1 / 4 = 1.5 each; left-out cells have null
    expect(cells.map((c) => c.expected)).toEqual([1.5, null, 1.5, 1.5, null, 1.5]);
    expect(cells[1]!.corners).toEqual([[100, 0], [200, 0], [200, 100], [100, 100], [100, 0]]);
  });

  it('rotated cells: corners form a closed square of side s about the origin', () => {
    const cells = describeCells({
      counter: createCellCounter(xy, { x: 0, y: 0 }),
      region,
      origin: { x: 0, y: 0 },
      cellSize: 80,
      placement: { u: 0.5, v: 0.25, angle: 30 },
      minCoverage: 0.5,
    });
    const total = cells.reduce((sum, c) => sum + c.coverage * 80 * 80, 0);
    expect(total).toBeCloseTo(region.area, 6);
    for (const cell of cells) {
      expect(cell.corners[4]).toEqual(cell.corners[0]);
      const [a, b] = [cell.corners[0]!, cell.corners[1]!];
      expect(Math.hypot(b[0] - a[0], b[1] - a[1])).toBeCloseTo(80, 9);
      expect(Math.atan2(b[1] - a[1], b[0] - a[0])).toBeCloseTo(Math.PI / 6, 12);
    }
    const keptExpected = cells.filter((c) => c.kept).reduce((sum, c) => sum + c.expected!, 0);
    const keptCount = cells.filter((c) => c.kept).reduce((sum, c) => sum + c.count, 0);
    expect(keptExpected).toBeCloseTo(keptCount, 9);
  });
});
