import * as turf from '@turf/turf';
import jStat from 'jstat';
import { describe, expect, it } from 'vitest';
import { regionFromRings } from '../engine/geometry/region-fixtures.js';
import { oracleAreaInside, oracleHex, oracleNearest } from '../engine/lattice/hex-oracle.js';
import { polygonGeoJson, run, seededRandom, tempFolder } from './run-cli.js';

/**
 * `count --shape hex` with a no-data zone, a rotated and offset lattice and partial cells, against a brute-force
 * computation in this test: hexagons from the issue 16 contract clipped one by one (Sutherland & Hodgman 1974) against
 * the study area and the zone, points located with turf.booleanPointInPolygon and assigned to the nearest centre, and
 * the dispersion statistics by their textbook formulas (design.md), p from jStat's chi-square cdf.
 */
const STUDY: number[][] = [[300000, 700000], [309000, 700500], [311000, 706000], [305500, 710500], [299000, 707000], [300000, 700000]];
const ZONE: number[][] = [[303000, 703000], [306000, 702500], [306500, 705000], [303500, 705500], [303000, 703000]];
const CELL = 900;
const ANGLE = 41.5;
const OFFSET = { u: 0.35, v: 0.7 };
const MIN_COVERAGE = 0.4;

function fixturePoints(): number[][] {
  const random = seededRandom(20261216);
  const points: number[][] = [];
  for (let k = 0; k < 700; k += 1) {
    const clustered = k % 3 === 0;
    const x = clustered ? 307000 + 1500 * random() : 298500 + 13000 * random();
    const y = clustered ? 706000 + 1500 * random() : 699500 + 11500 * random();
    points.push([Number(x.toFixed(2)), Number(y.toFixed(2))]);
  }
  return points;
}

function bruteForce(points: number[][]) {
  const origin = { x: Math.min(...STUDY.map((p) => p[0]!)), y: Math.min(...STUDY.map((p) => p[1]!)) };
  const placement = { ...OFFSET, angle: ANGLE };
  const study = regionFromRings([STUDY.slice(0, -1) as [number, number][]]);
  const zone = regionFromRings([ZONE.slice(0, -1) as [number, number][]]);
  const inside = points.filter((p) => turf.booleanPointInPolygon(p, turf.polygon([STUDY])) && !turf.booleanPointInPolygon(p, turf.polygon([ZONE])));
  const counts = new Map<string, number>();
  for (const [x, y] of inside) {
    const cell = oracleNearest(origin, CELL, placement, x!, y!, [-30, 30, -30, 30]);
    if (cell === null) throw new Error('a fixture point lies on a hexagon side');
    counts.set(cell.join(','), (counts.get(cell.join(',')) ?? 0) + 1);
  }
  const kept: { count: number; coverage: number }[] = [];
  let partial = 0;
  for (let j = -30; j <= 30; j++) {
    for (let i = -30; i <= 30; i++) {
      const polygon = oracleHex(origin, CELL, placement, i, j).polygon;
      const coverage = (oracleAreaInside(study, polygon) - oracleAreaInside(zone, polygon)) / (CELL * CELL);
      if (coverage > 1e-12 && coverage >= MIN_COVERAGE - 1e-9) {
        kept.push({ count: counts.get(`${i},${j}`) ?? 0, coverage });
        if (coverage < 1 - 1e-9) partial += 1;
      }
    }
  }
  const m = kept.length;
  const n = kept.reduce((s, c) => s + c.count, 0);
  const mean = n / m;
  const variance = kept.reduce((s, c) => s + (c.count - mean) ** 2, 0) / (m - 1);
  const totalCoverage = kept.reduce((s, c) => s + c.coverage, 0);
  const chi2 = kept.reduce((s, c) => s + (c.count - (n * c.coverage) / totalCoverage) ** 2 / ((n * c.coverage) / totalCoverage), 0);
  return { m, n, mean, variance, chi2, partial, inside: inside.length };
}

describe('gridshake count --shape hex', () => {
  const write = tempFolder();
  const points = fixturePoints();
  const pointsPath = write('sites.csv', 'x,y\n' + points.map((p) => p.join(',')).join('\n') + '\n');
  const areaPath = write('area.geojson', polygonGeoJson([STUDY]));
  const zonePath = write('zone.geojson', polygonGeoJson([ZONE]));
  const base = ['count', '--points', pointsPath, '--area', areaPath, '--no-data', zonePath, '--crs', 'planar', '--cell', String(CELL)];

  it('matches the brute-force computation with clipped hexagons and nearest centres', async () => {
    const expected = bruteForce(points);
    const result = await run([...base, '--shape', 'hex', '--angle', String(ANGLE), '--offset', `${OFFSET.u},${OFFSET.v}`,
      '--min-coverage', String(MIN_COVERAGE), '--json']);
    expect(result.stderr).toBe('');
    const out = JSON.parse(result.stdout);
    expect(out.shape).toBe('hex');
    expect(expected.partial).toBeGreaterThan(10);
    expect(out.cells).toBe(expected.m);
    expect(out.points).toBe(expected.n);
    expect(out.pointsInLeftOutCells).toBe(expected.inside - expected.n);
    expect(out.variance).toBeCloseTo(expected.variance, 9);
    expect(out.chi2 / expected.chi2).toBeCloseTo(1, 9);
    expect(out.df).toBe(expected.m - 1);
    expect(out.pClustered).toBeCloseTo(1 - jStat.chisquare.cdf(expected.chi2, expected.m - 1), 9);
    expect(out.placement).toEqual({ u: OFFSET.u, v: OFFSET.v, angle: ANGLE });
  });

  it('reports shape "square" by default, and hexagons in words', async () => {
    const square = JSON.parse((await run([...base, '--json'])).stdout);
    expect(square.shape).toBe('square');
    const words = await run([...base, '--shape', 'hex']);
    expect(words.code).toBe(0);
    expect(words.stdout).toMatch(/Grid: hexagonal cells of 900 m x 900 m area, angle 0°/);
  });

  it('refuses angles outside [0, 60) for hexagons and unknown shapes, in one line', async () => {
    const turned = await run([...base, '--shape', 'hex', '--angle', '60']);
    expect(turned.code).toBe(1);
    expect(turned.stderr).toMatch(/--angle must be an angle in degrees in \[0, 60\), got '60'/);
    expect(turned.stderr.trim().split('\n')).toHaveLength(1);
    expect((await run([...base, '--angle', '60', '--json'])).code).toBe(0);
    const shape = await run([...base, '--shape', 'triangle']);
    expect(shape.code).toBe(1);
    expect(shape.stderr).toMatch(/--shape must be one of square, hex, got 'triangle'/);
  });
});
