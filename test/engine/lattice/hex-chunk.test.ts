import { describe, it, expect } from 'vitest';
import { createCellCounter } from '../../../workers/placement/cell-counter.js';
import { describeCells } from '../../../workers/placement/describe-cells.js';
import { evaluatePlacement, keptCounts } from '../../../workers/placement/evaluate-placement.js';
import { oracleHex } from './hex-oracle.js';
import { haltonPlacements } from '../../../workers/random/halton.js';
import { latticePlacements } from '../../../workers/random/lattice.js';
import { dispersionChiSquare } from '../../../workers/stats/index.js';
import { evaluateChunk } from '../../../workers/sweep/evaluate-chunk.js';
import { decodeStatistics, STATISTICS_FIELDS } from '../../../workers/sweep/statistics-codec.js';
import { simulatedValueOffset } from '../../../workers/sweep/sweep-task.js';
import { latticeOf } from '../../../workers/lattice/registry.js';
import { regionFromRings, starRing } from '../geometry/region-fixtures.js';

function seededPoints(count: number, seed: number, cx: number, cy: number, half: number): Float64Array {
  let state = seed >>> 0;
  const xy = new Float64Array(2 * count);
  for (let k = 0; k < xy.length; k++) {
    state = (Math.imul(state, 1664525) + 1013904223) >>> 0;
    xy[k] = (k % 2 === 0 ? cx : cy) + (state / 2 ** 32 - 0.5) * 2 * half;
  }
  return xy;
}

describe('hexagons through the sweep kernel (evaluateChunk) and the placement designs', () => {
  it('a chunk of hexagon placements gives the rows and simulated chi2/df of placement-by-placement evaluation', () => {
    const fractions = Array.from({ length: 40 }, (_, k) => ((k * 0.6180339887) % 1) * 0.99);
    const region = regionFromRings([starRing(500, 500, 300, 450, fractions), starRing(520, 480, 40, 80, fractions.slice(0, 16), true)]);
    const origin = { x: region.bbox.minX, y: region.bbox.minY };
    const observed = createCellCounter(seededPoints(1500, 3, 500, 500, 330), origin);
    const simulated = [5, 6, 7].map((seed) => createCellCounter(seededPoints(1500, seed, 500, 500, 330), origin));
    const placements = haltonPlacements(6, true, latticeOf('hex').anglePeriod);
    const triples = Float64Array.from(placements.flatMap((p) => [p.u, p.v, p.angle]));
    const context = { region, origin, observed, simulated, cellSize: 70, shape: 'hex' as const, minCoverage: 0.5, alpha: 0.05 };
    const result = evaluateChunk(context, triples);
    placements.forEach((placement, j) => {
      const direct = evaluatePlacement({ ...context, counter: observed, placement });
      expect(direct.grid.shape).toBe('hex');
      expect(decodeStatistics(result, j * STATISTICS_FIELDS).chi2).toBe(direct.stats.chi2);
      expect(decodeStatistics(result, j * STATISTICS_FIELDS).cells).toBe(direct.stats.cells);
      simulated.forEach((counter, r) => {
        const counts = new Int32Array(direct.grid.nx * direct.grid.ny);
        counter.count(direct.grid, 70, placement, counts);
        const { chi2, df } = dispersionChiSquare(keptCounts(counts, direct.kept), direct.kept.coverage);
        expect(result[simulatedValueOffset(placements.length, simulated.length, j, r)]).toBe(chi2 / df);
      });
    });
    // cells described for drawing and export: 7-point counter-clockwise rings at the contract's corners, same counts
    const cells = describeCells({ ...context, counter: observed, placement: placements[3]! });
    const direct = evaluatePlacement({ ...context, counter: observed, placement: placements[3]! });
    expect(cells.filter((c) => c.kept).reduce((sum, c) => sum + c.count, 0)).toBe(direct.stats.points);
    for (const c of cells) {
      expect(c.corners).toHaveLength(7);
      expect(c.corners[6]).toEqual(c.corners[0]);
      const expected = oracleHex(origin, 70, placements[3]!, c.i, c.j).polygon;
      c.corners.slice(0, 6).forEach(([x, y], k) => {
        expect(x).toBeCloseTo(expected[k]![0], 9);
        expect(y).toBeCloseTo(expected[k]![1], 9);
      });
      let twiceArea = 0;
      for (let k = 0; k < 6; k++) twiceArea += c.corners[k]![0] * c.corners[k + 1]![1] - c.corners[k + 1]![0] * c.corners[k]![1];
      expect(twiceArea / 2 / (70 * 70)).toBeCloseTo(1, 9);
    }
    // hexagons and squares differ on the same placements
    const squares = evaluateChunk({ ...context, shape: 'square' }, triples);
    expect(decodeStatistics(squares, 0).cells).not.toBe(decodeStatistics(result, 0).cells);
  });

  it('designs spread angles over the lattice period: [0, 60) for hexagons, unchanged for squares', () => {
    for (const design of [haltonPlacements(50, true, 60), latticePlacements(48, true, 60)]) {
      expect(design[0]).toEqual({ u: 0, v: 0, angle: 0 });
      expect(Math.max(...design.map((p) => p.angle))).toBeLessThan(60);
      expect(Math.max(...design.map((p) => p.angle))).toBeGreaterThanOrEqual(40);
    }
    expect(haltonPlacements(50, true)).toEqual(haltonPlacements(50, true, 90));
    const squareAngles = haltonPlacements(50, true).map((p) => p.angle);
    const hexAngles = haltonPlacements(50, true, 60).map((p) => p.angle);
    hexAngles.forEach((angle, k) => expect(angle).toBeCloseTo((squareAngles[k]! * 60) / 90, 12));
  });
});
