import * as turf from '@turf/turf';
import jStat from 'jstat';
import { describe, expect, it } from 'vitest';
import { oracleCellArea } from '../engine/geometry/clip-oracle.js';
import { polygonGeoJson, run, seededRandom, tempFolder } from './run-cli.js';

/**
 * `count` with a no-data zone, a rotated and offset grid and partial cells, against a brute-force computation in
 * this test: every cell's coverage by Sutherland-Hodgman clipping (test/engine/geometry/clip-oracle.ts) of the study
 * area and the zone separately, points located with turf.booleanPointInPolygon, cell indices by the grid contract
 * (shared/design.md) and the statistics by their textbook formulas (design.md "Statistics of one placement";
 * Morisita 1959), p-values from jStat's chi-square cdf.
 */
const STUDY: number[][] = [[200000, 600000], [209000, 600500], [211000, 606000], [205500, 610500], [199000, 607000], [200000, 600000]];
const ZONE: number[][] = [[203000, 603000], [206000, 602500], [206500, 605000], [203500, 605500], [203000, 603000]];
const CELL = 900;
const ANGLE = 27.5;
const OFFSET = { u: 0.35, v: 0.7 };
const MIN_COVERAGE = 0.4;

function fixturePoints(): number[][] {
  const random = seededRandom(20240611);
  const points: number[][] = [];
  for (let k = 0; k < 700; k += 1) {
    // a cluster to the north-east and a uniform background, both over the area's bbox and a little beyond
    const clustered = k % 3 === 0;
    const x = clustered ? 207000 + 1500 * random() : 198500 + 13000 * random();
    const y = clustered ? 606000 + 1500 * random() : 599500 + 11500 * random();
    points.push([Number(x.toFixed(2)), Number(y.toFixed(2))]);
  }
  return points;
}

function bruteForce(points: number[][]) {
  const origin = { x: Math.min(...STUDY.map((p) => p[0])), y: Math.min(...STUDY.map((p) => p[1])) };
  const t = (ANGLE * Math.PI) / 180;
  const toCell = ([x, y]: number[]): [number, number] => {
    const dx = x - origin.x;
    const dy = y - origin.y;
    return [(dx * Math.cos(t) + dy * Math.sin(t)) / CELL - OFFSET.u, (-dx * Math.sin(t) + dy * Math.cos(t)) / CELL - OFFSET.v];
  };
  const flat = (ring: number[][]): number[] => ring.slice(0, -1).flatMap(toCell);
  const studyCells = flat(STUDY);
  const zoneCells = flat(ZONE);
  const study = turf.polygon([STUDY]);
  const zone = turf.polygon([ZONE]);
  const inside = points.filter((p) => turf.booleanPointInPolygon(p, study) && !turf.booleanPointInPolygon(p, zone));
  const counts = new Map<string, number>();
  for (const p of inside) {
    const [X, Y] = toCell(p);
    const key = `${Math.floor(X)},${Math.floor(Y)}`;
    counts.set(key, (counts.get(key) ?? 0) + 1);
  }
  const xs = studyCells.filter((_, k) => k % 2 === 0);
  const ys = studyCells.filter((_, k) => k % 2 === 1);
  const kept: { count: number; coverage: number }[] = [];
  let partial = 0;
  for (let i = Math.floor(Math.min(...xs)); i <= Math.floor(Math.max(...xs)); i += 1) {
    for (let j = Math.floor(Math.min(...ys)); j <= Math.floor(Math.max(...ys)); j += 1) {
      const coverage = Math.abs(oracleCellArea([studyCells], i, j)) - Math.abs(oracleCellArea([zoneCells], i, j));
      if (coverage > 0 && coverage >= MIN_COVERAGE - 1e-9) {
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
  const chi2 = kept.reduce((s, c) => {
    const expected = (n * c.coverage) / totalCoverage;
    return s + (c.count - expected) ** 2 / expected;
  }, 0);
  const morisita = (m * kept.reduce((s, c) => s + c.count * (c.count - 1), 0)) / (n * (n - 1));
  return { m, n, mean, variance, chi2, morisita, partial, outside: points.length - inside.length, inside: inside.length };
}

describe('gridshake count with a no-data zone, rotation, offset and partial cells', () => {
  const write = tempFolder();
  const points = fixturePoints();
  const pointsPath = write('sites.csv', 'x,y\n' + points.map((p) => p.join(',')).join('\n') + '\n');
  const areaPath = write('area.geojson', polygonGeoJson([STUDY]));
  const zonePath = write('zone.geojson', polygonGeoJson([ZONE]));

  it('matches the brute-force computation', async () => {
    const expected = bruteForce(points);
    const argv = ['count', '--points', pointsPath, '--area', areaPath, '--no-data', zonePath, '--crs', 'planar',
      '--cell', String(CELL), '--angle', String(ANGLE), '--offset', `${OFFSET.u},${OFFSET.v}`, '--min-coverage', String(MIN_COVERAGE), '--json'];
    const result = await run(argv);
    expect(result.stderr).toBe('');
    const out = JSON.parse(result.stdout);
    expect(expected.partial).toBeGreaterThan(10);
    expect(expected.outside).toBeGreaterThan(50);
    expect(out.cells).toBe(expected.m);
    expect(out.points).toBe(expected.n);
    expect(out.pointsOutside).toBe(expected.outside);
    expect(out.pointsInLeftOutCells).toBe(expected.inside - expected.n);
    expect(out.mean).toBeCloseTo(expected.mean, 10);
    expect(out.variance).toBeCloseTo(expected.variance, 9);
    expect(out.vmr).toBeCloseTo(expected.variance / expected.mean, 9);
    expect(out.chi2 / expected.chi2).toBeCloseTo(1, 9);
    expect(out.df).toBe(expected.m - 1);
    expect(out.pClustered).toBeCloseTo(1 - jStat.chisquare.cdf(expected.chi2, expected.m - 1), 9);
    expect(out.morisita).toBeCloseTo(expected.morisita, 9);
    expect(out.verdict).toBe('clustered');
    expect(out.placement).toEqual({ u: OFFSET.u, v: OFFSET.v, angle: ANGLE });
    const outside = out.warnings.find((w: { code: string }) => w.code === 'points-outside');
    expect(outside.message).toMatch(new RegExp(`^${expected.outside} of 700 point`));
  });

  it('prints the clustered verdict and the outside-points warning in words', async () => {
    const result = await run(['count', '--points', pointsPath, '--area', areaPath, '--no-data', zonePath, '--crs', 'planar', '--cell', '900', '--angle', '27.5']);
    expect(result.code).toBe(0);
    expect(result.stdout).toMatch(/The counts are more clustered than complete spatial randomness would give \(p (= [0-9.e-]+|< 1e-300), two-sided test at alpha = 0\.05\)/);
    expect(result.stdout).toMatch(/Warnings:\n {2}- \d+ of 700 point\(s\) lie outside the valid region/);
  });
});
