/**
 * Densified longitude/latitude rings: a large cell far from the centre of a local Lambert azimuthal equal-area
 * projection (proj4 +proj=laea, Snyder 1987 "Map projections: a working manual", USGS PP 1395, ch. 24) bends in
 * longitude/latitude; its four corners alone stray far more than 1 cm from the square, the densified ring does not.
 */
import { describe, it, expect } from 'vitest';
import proj4 from 'proj4';
import { distanceToSegment, lonLatRing, signedArea2 } from '../../server/grid-export/lonlat-ring.js';

const LAEA = '+proj=laea +lat_0=60 +lon_0=10 +x_0=0 +y_0=0 +datum=WGS84 +units=m +no_defs';
const converter = proj4('+proj=longlat +datum=WGS84 +no_defs', LAEA);
const toLonLat = (x: number, y: number) => converter.inverse([x, y]) as [number, number];
const fromLonLat = (lon: number, lat: number) => converter.forward([lon, lat]) as [number, number];

/** The square of side s with lower-left (x0, y0), counter-clockwise, closed. */
const square = (x0: number, y0: number, s: number): [number, number][] => [
  [x0, y0], [x0 + s, y0], [x0 + s, y0 + s], [x0, y0 + s], [x0, y0],
];

/** Largest distance (m) from the planar square of points sampled 16 times along each lon/lat segment. */
function worst(ring: [number, number][], planar: [number, number][]): number {
  let result = 0;
  for (let k = 0; k + 1 < ring.length; k++) {
    for (let step = 0; step <= 16; step++) {
      const t = step / 16;
      const [x, y] = fromLonLat(ring[k]![0] + t * (ring[k + 1]![0] - ring[k]![0]), ring[k]![1] + t * (ring[k + 1]![1] - ring[k]![1]));
      let best = Infinity;
      for (let q = 0; q + 1 < planar.length; q++) best = Math.min(best, distanceToSegment(x, y, ...planar[q]!, ...planar[q + 1]!));
      result = Math.max(result, best);
    }
  }
  return result;
}

describe('lonLatRing', () => {
  const cell = square(300_000, 200_000, 20_000);

  it('corners alone would stray more than 1 cm; the densified ring stays within 1 cm', () => {
    const cornersOnly = lonLatRing(cell, toLonLat, fromLonLat, Infinity);
    expect(cornersOnly.length).toBe(5);
    expect(worst(cornersOnly, cell)).toBeGreaterThan(0.01);
    const densified = lonLatRing(cell, toLonLat, fromLonLat);
    expect(densified.length).toBeGreaterThan(5);
    expect(worst(densified, cell)).toBeLessThan(0.01);
  });

  it('is closed and counter-clockwise (RFC 7946 3.1.6), also when the planar ring was clockwise', () => {
    const densified = lonLatRing(cell, toLonLat, fromLonLat);
    expect(densified[0]).toEqual(densified[densified.length - 1]);
    expect(signedArea2(densified)).toBeGreaterThan(0);
    const clockwise = lonLatRing([...cell].reverse(), toLonLat, fromLonLat);
    expect(signedArea2(clockwise)).toBeGreaterThan(0);
  });

  it('a small cell near the centre needs no extra vertices', () => {
    expect(lonLatRing(square(100, 100, 50), toLonLat, fromLonLat).length).toBe(5);
  });
});
