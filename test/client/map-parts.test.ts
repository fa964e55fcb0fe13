import { describe, it, expect } from 'vitest';
import type { GridCollection } from '../../client/src/api/api-client.js';
import { packCells } from '../../client/src/map/cell-index.js';
import { fillConvex, packColour } from '../../client/src/map/cell-raster.js';
import { pearsonResidual } from '../../client/src/map/cell-readout.js';
import { scaleBar } from '../../client/src/map/scale-bar.js';

/** Pixels of `target` equal to `colour`. */
function countColour(pixels: Uint32Array, colour: number): number {
  let count = 0;
  for (const value of pixels) if (value === colour) count += 1;
  return count;
}

function polygon(points: [number, number][]): { xs: Float64Array; ys: Float64Array; count: number } {
  return { xs: Float64Array.from(points.map(([x]) => x)), ys: Float64Array.from(points.map(([, y]) => y)), count: points.length };
}

describe('the map scale bar', () => {
  it('takes the longest 1-2-5 length that fits (the usual series of round scale lengths; common practice)', () => {
    const bar = scaleBar(1.7, 160)!;
    expect(bar.metres).toBe(200);
    expect(bar.pixels).toBeCloseTo(200 / 1.7, 10);
    expect(bar.label).toBe('200 m');
    expect(scaleBar(50, 160)!.label).toBe('5 km');
    expect(scaleBar(0.01, 150)!.label).toBe('1 m');
    expect(scaleBar(Number.NaN, 150)).toBeNull();
    expect(scaleBar(0, 150)).toBeNull();
  });
});

describe('the grid raster', () => {
  const width = 120;
  const height = 100;

  it('fills exactly the pixels whose centres lie in an axis-aligned cell, and abutting cells neither overlap nor leave gaps', () => {
    const pixels = new Uint32Array(width * height);
    const red = packColour(255, 0, 0, 1);
    const blue = packColour(0, 0, 255, 1);
    const left = polygon([[10.2, 10.7], [30.2, 10.7], [30.2, 20.7], [10.2, 20.7]]);
    const right = polygon([[30.2, 10.7], [50.2, 10.7], [50.2, 20.7], [30.2, 20.7]]);
    fillConvex({ pixels, width, height }, left.xs, left.ys, left.count, red, 0);
    fillConvex({ pixels, width, height }, right.xs, right.ys, right.count, blue, 0);
    // pixel centres x + 0.5 in [10.2, 30.2): x = 10..29, y + 0.5 in [10.7, 20.7): y = 11..20
    expect(countColour(pixels, red)).toBe(200);
    expect(countColour(pixels, blue)).toBe(200);
    expect(pixels[11 * width + 10]).toBe(red);
    expect(pixels[11 * width + 30]).toBe(blue);
    expect(pixels[10 * width + 10]).toBe(0);
  });

  it('covers a turned square and a hexagon with as many pixels as their area, within their perimeter (lattice-point counting bound)', () => {
    const turn = Math.PI / 6;
    const square = polygon([[-1, -1], [1, -1], [1, 1], [-1, 1]].map(([x, y]) => [60 + 20 * (x * Math.cos(turn) - y * Math.sin(turn)), 50 + 20 * (x * Math.sin(turn) + y * Math.cos(turn))] as [number, number]));
    const pixels = new Uint32Array(width * height);
    fillConvex({ pixels, width, height }, square.xs, square.ys, square.count, 1, 0);
    expect(Math.abs(countColour(pixels, 1) - 1600)).toBeLessThan(160);
    // a pointy-top hexagon of circumradius 25: area 3·sqrt(3)/2·25², perimeter 150
    const hexagon = polygon(Array.from({ length: 6 }, (_, k) => [60 + 25 * Math.cos(((90 + 60 * k) * Math.PI) / 180), 50 + 25 * Math.sin(((90 + 60 * k) * Math.PI) / 180)] as [number, number]));
    const hexPixels = new Uint32Array(width * height);
    fillConvex({ pixels: hexPixels, width, height }, hexagon.xs, hexagon.ys, hexagon.count, 1, 0);
    expect(Math.abs(countColour(hexPixels, 1) - (3 * Math.sqrt(3) / 2) * 625)).toBeLessThan(150);
  });

  it('marks one pixel for a cell smaller than a pixel, and hatches a left-out cell on diagonal lines only', () => {
    const pixels = new Uint32Array(width * height);
    const tiny = polygon([[40.1, 40.1], [40.4, 40.1], [40.4, 40.4], [40.1, 40.4]]);
    fillConvex({ pixels, width, height }, tiny.xs, tiny.ys, tiny.count, 7, 0);
    expect(countColour(pixels, 7)).toBe(1);
    expect(pixels[40 * width + 40]).toBe(7);
    const box = polygon([[0, 0], [60, 0], [60, 60], [0, 60]]);
    const hatched = new Uint32Array(width * height);
    fillConvex({ pixels: hatched, width, height }, box.xs, box.ys, box.count, 9, 6);
    const share = countColour(hatched, 9) / 3600;
    expect(share).toBeGreaterThan(0.2);
    expect(share).toBeLessThan(0.5);
  });
});

describe('picking the cell under the pointer', () => {
  it('finds the hexagon whose centre is nearest, as the hexagon contract assigns points (issue 16: nearest centre)', () => {
    // issue 16's lattice at angle 0, offset (u, v): centre of (i, j) at x = (i + u)·sqrt(3)·a + (j + v)·sqrt(3)·a/2, y = (j + v)·1.5·a
    const s = 10;
    const a = s * Math.sqrt(2 / (3 * Math.sqrt(3)));
    const u = 0.3;
    const v = 0.6;
    const centres: [number, number, number, number][] = [];
    const features: GridCollection['features'] = [];
    for (let j = -2; j <= 8; j += 1) {
      for (let i = -6; i <= 8; i += 1) {
        const cx = (i + u) * Math.sqrt(3) * a + ((j + v) * Math.sqrt(3) * a) / 2;
        const cy = (j + v) * 1.5 * a;
        centres.push([cx, cy, i, j]);
        const ring = Array.from({ length: 7 }, (_, k) => [cx + a * Math.cos(((90 + 60 * (k % 6)) * Math.PI) / 180), cy + a * Math.sin(((90 + 60 * (k % 6)) * Math.PI) / 180)]);
        features.push({ type: 'Feature', properties: { i, j, count: 0, coverage: 1, expected: 1, kept: true }, geometry: { type: 'Polygon', coordinates: [ring] } });
      }
    }
    const packed = packCells({ type: 'FeatureCollection', features });
    let state = 7;
    const random = () => {
      state = (state * 48271) % 2147483647;
      return state / 2147483647;
    };
    for (let trial = 0; trial < 2000; trial += 1) {
      const x = 10 + random() * 60;
      const y = 5 + random() * 60;
      let best = 0;
      for (let k = 1; k < centres.length; k += 1) {
        if (Math.hypot(centres[k][0] - x, centres[k][1] - y) < Math.hypot(centres[best][0] - x, centres[best][1] - y)) best = k;
      }
      const picked = packed.pick(x, y);
      expect(picked).toBeGreaterThanOrEqual(0);
      expect([features[picked].properties.i, features[picked].properties.j]).toEqual([centres[best][2], centres[best][3]]);
    }
    expect(packed.pick(1e6, 1e6)).toBe(-1);
  });

  it('gives the Pearson residual (O - E) / sqrt(E) (Agresti 2002, Categorical Data Analysis, 3.3.1)', () => {
    expect(pearsonResidual(9, 4)).toBe(2.5);
    expect(pearsonResidual(1, 4)).toBe(-1.5);
    expect(Number.isNaN(pearsonResidual(3, 0))).toBe(true);
  });
});
