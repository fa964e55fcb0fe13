import { describe, expect, it } from 'vitest';
import { polygonGeoJson, run, seededRandom, tempFolder } from './run-cli.js';

/**
 * R. D. Clarke (1946), "An application of the Poisson distribution", Journal of the Institute of Actuaries 72:481:
 * 576 squares of 1/4 km^2 (500 m sides) in 144 km^2 of south London, 537 hits, squares with 0..4 hits:
 * 229, 211, 93, 35, 7, and one square with "5 and over" that held 7 (537 - 530). Expected values are those of
 * shared/reference-values.md (scipy/numpy). We build a planar point set whose 500 m squares give exactly that table
 * (points placed at random, with a fixed seed, well inside squares chosen at random) and run `count` end to end.
 */
const ORIGIN = { x: 431000, y: 5127000 };
const SIDE = 500;
const FREQUENCIES: [hits: number, squares: number][] = [[0, 229], [1, 211], [2, 93], [3, 35], [4, 7], [7, 1]];

function clarkeFixture(): { points: string; area: string } {
  const random = seededRandom(1946);
  const hits: number[] = FREQUENCIES.flatMap(([count, squares]) => new Array<number>(squares).fill(count));
  for (let k = hits.length - 1; k > 0; k -= 1) {
    const other = Math.floor(random() * (k + 1));
    [hits[k], hits[other]] = [hits[other], hits[k]];
  }
  const rows = ['record,x,y'];
  let record = 0;
  hits.forEach((count, square) => {
    const i = square % 24;
    const j = Math.floor(square / 24);
    for (let h = 0; h < count; h += 1) {
      record += 1;
      const x = ORIGIN.x + (i + 0.05 + 0.9 * random()) * SIDE;
      const y = ORIGIN.y + (j + 0.05 + 0.9 * random()) * SIDE;
      rows.push(`H${record},${x.toFixed(3)},${y.toFixed(3)}`);
    }
  });
  const { x, y } = ORIGIN;
  const e = 24 * SIDE;
  const area = polygonGeoJson([[[x, y], [x + e, y], [x + e, y + e], [x, y + e], [x, y]]]);
  return { points: rows.join('\n') + '\n', area };
}

describe('gridshake count reproduces Clarke (1946) end to end', () => {
  const write = tempFolder();
  const fixture = clarkeFixture();
  const pointsPath = write('hits.csv', fixture.points);
  const areaPath = write('area.geojson', fixture.area);

  it('prints the published dispersion statistics as JSON', async () => {
    const result = await run(['count', '--points', pointsPath, '--area', areaPath, '--crs', 'planar', '--cell', '500', '--json']);
    expect(result.stderr).toBe('');
    expect(result.code).toBe(0);
    const out = JSON.parse(result.stdout);
    expect(out.cells).toBe(576);
    expect(out.points).toBe(537);
    expect(out.pointsOutside).toBe(0);
    // mean = 537/576; sample variance and VMR: numpy (reference-values.md)
    expect(out.mean).toBeCloseTo(0.932292, 6);
    expect(out.variance).toBeCloseTo(0.97106, 6);
    expect(out.vmr).toBeCloseTo(1.041584, 6);
    // X^2 = 598.9106 on 575 df; scipy.stats.chi2.sf(598.9106, 575) = 0.237263
    expect(out.chi2).toBeCloseTo(598.9106, 4);
    expect(out.df).toBe(575);
    expect(out.pClustered).toBeCloseTo(0.237263, 6);
    expect(out.pRegular).toBeCloseTo(1 - 0.237263, 6);
    expect(out.verdict).toBe('csr');
    // Poisson frequency fit merged to expected >= 5 (classes 0,1,2,3,>=4; df 3): X^2 = 1.017589, p = 0.796996 (scipy)
    expect(out.poissonFit.df).toBe(3);
    expect(out.poissonFit.chi2).toBeCloseTo(1.017589, 6);
    expect(out.poissonFit.p).toBeCloseTo(0.796996, 6);
    expect(out.poissonFit.classes.map((c: { observed: number }) => c.observed)).toEqual([229, 211, 93, 35, 8]);
    // Clarke's own Poisson expectations 226.74, 211.39, 98.54, 30.62 (his table; 1e-2 as printed)
    expect(out.poissonFit.classes.slice(0, 4).map((c: { expected: number }) => Number(c.expected.toFixed(2)))).toEqual([226.74, 211.39, 98.54, 30.62]);
    // Morisita 1.044609, standardized Morisita 0.174941, Lloyd 0.973875 / 1.044604, Green 7.758e-05, NB k 22.4197
    expect(out.morisita).toBeCloseTo(1.044609, 6);
    expect(out.morisitaStandardized).toBeCloseTo(0.174941, 6);
    expect(out.meanCrowding).toBeCloseTo(0.973875, 6);
    expect(out.patchiness).toBeCloseTo(1.044604, 6);
    expect(out.green).toBeCloseTo(7.758e-5, 8);
    expect(out.negativeBinomialK).toBeCloseTo(22.4197, 4);
    expect(out.expectedPerCell).toBeCloseTo(537 / 576, 9);
    expect(out.meetsRuleOf1_6).toBe(false);
    expect(out).toMatchObject({ cellSize: 500, placement: { u: 0, v: 0, angle: 0 }, alpha: 0.05 });
    expect(out.warnings).toEqual([]);
  });

  it('says the same in plain words, with the rule-of-thumb check and the caution', async () => {
    const result = await run(['count', '--points', pointsPath, '--area', areaPath, '--crs', 'planar', '--cell', '500']);
    expect(result.code).toBe(0);
    expect(result.stdout).toContain('The counts do not depart from complete spatial randomness');
    expect(result.stdout).toContain('p for clustering = 0.2373');
    expect(result.stdout).toMatch(/variance\/mean \(VMR\)\s+1\.041584/);
    expect(result.stdout).toMatch(/0\.93 expected points per whole cell is below both rules/);
    expect(result.stdout).toContain('significance is not cause');
  });
});
