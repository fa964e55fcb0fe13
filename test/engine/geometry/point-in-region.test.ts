import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { booleanPointInPolygon, multiPolygon, point } from '@turf/turf';
import { createRegionLocator, partitionByRegion, pointInRegion } from '../../../workers/geometry/point-in-region.js';
import type { Region } from '../../../workers/types.js';
import { regionFromRings, starRing } from './region-fixtures.js';

/** The region as a GeoJSON MultiPolygon: each shell followed by its holes, rings closed (RFC 7946). */
function toTurf(region: Region, shellsWithHoles: number[][]) {
  const close = (ring: Float64Array) => {
    const points: [number, number][] = [];
    for (let k = 0; k < ring.length; k += 2) points.push([ring[k]!, ring[k + 1]!]);
    points.push(points[0]!);
    return points;
  };
  return multiPolygon(shellsWithHoles.map((group) => group.map((index) => close(region.rings[index]!))));
}

const fractions = (count: number) => fc.array(fc.double({ min: 0, max: 0.999, noNaN: true }), { minLength: count, maxLength: count });

describe('pointInRegion and the band-indexed locator', () => {
  it('agree with @turf/boolean-point-in-polygon (point-in-polygon-hao) on a star with a hole and a second shell', () => {
    fc.assert(
      fc.property(fractions(40), fractions(20), fractions(12), fractions(400), (shell, hole, second, samples) => {
        const region = regionFromRings([
          starRing(0, 0, 6, 10, shell),
          starRing(0, 0, 1, 5, hole, true),
          starRing(25, 3, 3, 8, second),
        ]);
        const turfRegion = toTurf(region, [[0, 1], [2]]);
        const locator = createRegionLocator(region);
        const { minX, minY, maxX, maxY } = region.bbox;
        for (let k = 0; k < samples.length; k += 2) {
          const x = minX - 1 + (maxX - minX + 2) * samples[k]!;
          const y = minY - 1 + (maxY - minY + 2) * samples[k + 1]!;
          const expected = booleanPointInPolygon(point([x, y]), turfRegion);
          expect(pointInRegion(region, x, y)).toBe(expected);
          expect(locator.contains(x, y)).toBe(expected);
        }
      }),
      { numRuns: 50, seed: 20261201 },
    );
  });

  it('partitionByRegion splits indices in input order and matches pointInRegion on a ring of 5000 vertices', () => {
    const vertexFractions = Array.from({ length: 10000 }, (_, k) => ((k * 0.6180339887498949) % 1) * 0.999);
    const region = regionFromRings([starRing(500, 500, 300, 480, vertexFractions), starRing(500, 500, 50, 200, vertexFractions.slice(0, 400), true)]);
    const pointCount = 20000;
    const xy = new Float64Array(2 * pointCount);
    for (let p = 0; p < pointCount; p++) {
      xy[2 * p] = ((p * 0.7548776662466927) % 1) * 1000;
      xy[2 * p + 1] = ((p * 0.5698402909980532) % 1) * 1000;
    }
    const { inside, outside } = partitionByRegion(xy, region);
    expect(inside.length + outside.length).toBe(pointCount);
    for (let k = 1; k < inside.length; k++) expect(inside[k]!).toBeGreaterThan(inside[k - 1]!);
    for (const p of inside) expect(pointInRegion(region, xy[2 * p]!, xy[2 * p + 1]!)).toBe(true);
    for (const p of outside) expect(pointInRegion(region, xy[2 * p]!, xy[2 * p + 1]!)).toBe(false);
    // Share inside close to the area share of the 1000 x 1000 square (a low-discrepancy point set).
    expect(Math.abs(inside.length / pointCount - region.area / 1e6)).toBeLessThan(0.01);
  });

  it('a point in a hole or outside every shell is outside; NaN coordinates are outside', () => {
    const region = regionFromRings([
      [[0, 0], [10, 0], [10, 10], [0, 10]],
      [[4, 4], [4, 6], [6, 6], [6, 4]],
    ]);
    expect(pointInRegion(region, 5, 5)).toBe(false);
    expect(pointInRegion(region, 1, 1)).toBe(true);
    expect(pointInRegion(region, 11, 1)).toBe(false);
    expect(createRegionLocator(region).contains(Number.NaN, 1)).toBe(false);
    expect(pointInRegion(region, 1, Number.NaN)).toBe(false);
  });
});
