/**
 * The stability raster's valid pixels (workers/stability/stability-raster.ts validPixels, one scan per row) against
 * the even-odd crossing rule applied to each pixel centre on its own (W. R. Franklin's PNPOLY test, "pnpoly", 1970s,
 * as restated by E. Haines (1994), "Point in polygon strategies", Graphics Gems IV; from memory): the pixel list must
 * be exactly the centres that rule calls inside, including centres on edges and vertices, where the half-open rule
 * decides.
 */
import { describe, expect, it } from 'vitest';
import { stabilityRaster, validPixels } from '../../workers/stability/stability-raster.js';
import type { Region } from '../../workers/types.js';
import { regionFromRings } from '../engine/geometry/region-fixtures.js';

/** PNPOLY over every ring (even-odd), with the bounding-box test first, for the centre of each pixel. */
function pnpolyPixels(region: Region, raster: ReturnType<typeof stabilityRaster>): number[] {
  const { minX, minY, maxX, maxY } = region.bbox;
  const out: number[] = [];
  for (let row = 0; row < raster.height; row++) {
    const y = raster.y0 - (row + 0.5) * raster.side;
    for (let col = 0; col < raster.width; col++) {
      const x = raster.x0 + (col + 0.5) * raster.side;
      if (!(x >= minX && x <= maxX && y >= minY && y <= maxY)) continue;
      let inside = false;
      for (const ring of region.rings) {
        const n = ring.length / 2;
        for (let i = 0, j = n - 1; i < n; j = i++) {
          const xi = ring[2 * i]!;
          const yi = ring[2 * i + 1]!;
          const xj = ring[2 * j]!;
          const yj = ring[2 * j + 1]!;
          if (yi > y !== yj > y && x < xi + ((y - yi) * (xj - xi)) / (yj - yi)) inside = !inside;
        }
      }
      if (inside) out.push(row * raster.width + col);
    }
  }
  return out;
}

describe('validPixels', () => {
  it('an invented star with a square hole: exactly the centres PNPOLY calls inside, vertices and edges on pixel centres included', () => {
    // 8 m cells give 1 m pixels with centres at k + 0.5: vertices at .5 coordinates sit on pixel centres
    const star: [number, number][] = Array.from({ length: 24 }, (_, k) => {
      const r = k % 2 === 0 ? 40 : 17;
      const a = (2 * Math.PI * k) / 24;
      return [Math.round(50 + r * Math.cos(a)) + 0.5, Math.round(50 + r * Math.sin(a)) + 0.5];
    });
    const hole: [number, number][] = [
      [45.5, 45.5],
      [45.5, 55.5],
      [55.5, 55.5],
      [55.5, 45.5],
    ];
    const region = regionFromRings([star, hole]);
    for (const cellSize of [8, 13, 40]) {
      const raster = stabilityRaster(region, cellSize);
      const expected = pnpolyPixels(region, raster);
      expect(expected.length).toBeGreaterThan(10);
      expect(Array.from(validPixels(region, raster))).toEqual(expected);
    }
  });

  it('a thin diagonal strip and two separate squares (several crossings per row)', () => {
    const region = regionFromRings([
      [
        [0, 0],
        [10, 0],
        [10, 10],
        [0, 10],
      ],
      [
        [20, 0],
        [30, 0],
        [30, 10],
        [20, 10],
      ],
      [
        [0, 20],
        [1, 20],
        [31, 50],
        [30, 50],
      ],
    ]);
    const raster = stabilityRaster(region, 2);
    expect(Array.from(validPixels(region, raster))).toEqual(pnpolyPixels(region, raster));
  });
});
