import { dirname, join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { run } from '../cli/run-cli.js';
import { featuresGeoJson, OBSERVED, pointsCsv, polygonFile, rect, STUDY, write } from './baseline-fixtures.js';

/**
 * `count --baseline/--controls` on hand-checkable layouts (issue 15): the expected counts E_c = N·w_c/Σw are worked
 * out by hand in each comment, chi2 = Σ (O − E)²/E, df = m − 1, and chi2 and both tails are checked against scipy
 * 1.17 (the command beside each value). Cells are 100 m squares at angle 0, offset 0 (cells (i, j), CELLS order).
 */
async function countJson(args: string[]) {
  const result = await run(['count', '--crs', 'planar', '--cell', '100', '--json', ...args]);
  expect(result.stderr).toBe('');
  expect(result.code).toBe(0);
  return JSON.parse(result.stdout);
}

describe('count against baseline polygons', () => {
  it('polygons aligned with the cells: w = 25 on the left four cells, 75 on the right four', async () => {
    const file = write();
    const args = [
      '--points', file('points.csv', pointsCsv(OBSERVED)),
      '--area', file('area.geojson', polygonFile([STUDY])),
      '--baseline', file('pop.geojson', featuresGeoJson([rect(0, 0, 200, 200), rect(200, 0, 400, 200)], [{ residents: 100 }, { residents: 300 }])),
      '--baseline-field', 'residents',
    ];
    const json = await countJson(args);
    expect(json.expectedFrom).toBe('baseline');
    expect(json.baselineTotal).toBeCloseTo(400, 9);
    expect(json.zeroBaselineCells).toBe(0);
    expect(json.pointsInZeroBaselineCells).toBe(0);
    expect(json.cells).toBe(8);
    expect(json.points).toBe(50);
    // E = 50·25/400 = 3.125 (left), 9.375 (right); by hand chi2 = 3.12
    // python3 -c "from scipy.stats import chi2; print(chi2.sf(3.12,7), chi2.cdf(3.12,7))"
    expect(json.chi2).toBeCloseTo(3.12, 10);
    expect(json.df).toBe(7);
    expect(json.pClustered).toBeCloseTo(0.873683710742684, 12);
    expect(json.pRegular).toBeCloseTo(0.12631628925731594, 12);
    expect(json.verdict).toBe('csr');
    // the same counts against area are clustered: E = 6.25 everywhere, chi2 = 20.08
    // python3 -c "from scipy.stats import chi2; print(chi2.sf(20.08,7))"  -> 0.005399452341702564
    const area = await countJson(args.slice(0, 4));
    expect(area.expectedFrom).toBe('area');
    expect(area.baselineTotal).toBeCloseTo(80000, 6);
    expect(area.zeroBaselineCells).toBe(0);
    expect(area.pointsInZeroBaselineCells).toBe(0);
    expect(area.chi2).toBeCloseTo(20.08, 10);
    expect(area.pClustered).toBeCloseTo(0.005399452341702564, 12);
    expect(area.verdict).toBe('clustered');
    // VMR keeps its equal-area definition in baseline mode
    expect(json.vmr).toBeCloseTo(area.vmr, 12);
  });

  it('one polygon split by the grid: 60 over x in [0,150], 250 over [150,400]', async () => {
    const file = write();
    const json = await countJson([
      '--points', file('points.csv', pointsCsv(OBSERVED)),
      '--area', file('area.geojson', polygonFile([STUDY])),
      '--baseline', file('pop.geojson', featuresGeoJson([rect(0, 0, 150, 200), rect(150, 0, 400, 200)], [{ n: 60 }, { n: 250 }])),
      '--baseline-field', 'n',
    ]);
    // w(0,j) = 60·10000/30000 = 20; w(1,j) = 60·5000/30000 + 250·5000/50000 = 35; w(2,j) = w(3,j) = 250·10000/50000 = 50
    expect(json.baselineTotal).toBeCloseTo(310, 9);
    // python3 -c "import numpy as n; from scipy.stats import chi2; O=n.array([2,3,10,12,1,4,8,10.]); w=n.array([20,35,50,50,20,35,50,50.]);
    //   E=O.sum()*w/w.sum(); c=((O-E)**2/E).sum(); print(c, chi2.sf(c,7), chi2.cdf(c,7))"
    expect(json.chi2).toBeCloseTo(6.570571428571429, 10);
    expect(json.pClustered).toBeCloseTo(0.47491616302016904, 12);
    expect(json.pRegular).toBeCloseTo(0.525083836979831, 12);
  });

  it('a polygon partly over a no-data zone spreads its count over its valid part only; a polygon outside V is reported', async () => {
    const file = write();
    const result = await run([
      'count', '--crs', 'planar', '--cell', '100', '--json',
      '--points', file('points.csv', pointsCsv([0, 3, 10, 12, 1, 4, 8, 10])),
      '--area', file('area.geojson', polygonFile([STUDY])),
      '--no-data', file('zone.geojson', polygonFile([rect(0, 0, 100, 100)])),
      '--baseline', file('pop.geojson', featuresGeoJson(
        [rect(0, 0, 200, 200), rect(200, 0, 400, 200), rect(1000, 0, 1100, 100)],
        [{ pop: 90 }, { pop: 80 }, { pop: 5 }],
      )),
      '--baseline-field', 'pop',
    ]);
    expect(result.code).toBe(0);
    const json = JSON.parse(result.stdout);
    // cell (0,0) is the zone (coverage 0, not kept); polygon 1's valid part is 30000 m²: w = 90·10000/30000 = 30 on
    // (1,0), (0,1), (1,1); polygon 2: 80/4 = 20 on each right cell; polygon 3 lies outside V (reported, ignored)
    expect(json.cells).toBe(7);
    expect(json.baselineTotal).toBeCloseTo(170, 9);
    // python3 -c "import numpy as n; from scipy.stats import chi2; O=n.array([3,10,12,1,4,8,10.]); w=n.array([30,20,20,30,30,20,20.]);
    //   E=O.sum()*w/w.sum(); c=((O-E)**2/E).sum(); print(c, chi2.sf(c,6))"
    expect(json.chi2).toBeCloseTo(27.319444444444443, 9);
    expect(json.df).toBe(6);
    expect(json.pClustered).toBeCloseTo(0.0001261524410040526, 14);
    expect(json.baseline).toMatchObject({ kind: 'polygons', field: 'pop', features: 3, outsideFeatures: [3], totalInside: 170, total: 175 });
    const outside = json.warnings.find((w: { code: string }) => w.code === 'baseline-outside');
    expect(outside.ids).toEqual(['3']);
  });

  it('cells with no population at risk are left out and their points reported; the uncovered share is warned about', async () => {
    const file = write();
    const popPath = file('pop.geojson', featuresGeoJson([rect(0, 0, 200, 200)], [{ residents: 100 }]));
    const args = [
      'count', '--crs', 'planar', '--cell', '100',
      '--points', file('points.csv', pointsCsv(OBSERVED)),
      '--area', file('area.geojson', polygonFile([STUDY])),
      '--baseline', popPath,
      '--baseline-field', 'residents',
    ];
    const json = JSON.parse((await run([...args, '--json'])).stdout);
    expect(json.cells).toBe(4);
    expect(json.zeroBaselineCells).toBe(4);
    expect(json.pointsInZeroBaselineCells).toBe(40);
    expect(json.points).toBe(10);
    expect(json.baselineTotal).toBeCloseTo(100, 9);
    // E = 2.5 each; chi2 = (0.25 + 0.25 + 2.25 + 2.25)/2.5 = 2
    // python3 -c "from scipy.stats import chi2; print(chi2.sf(2,3))"  -> 0.5724067044708798
    expect(json.chi2).toBeCloseTo(2, 12);
    expect(json.pClustered).toBeCloseTo(0.5724067044708798, 12);
    const gap = json.warnings.find((w: { code: string }) => w.code === 'baseline-gap');
    expect(gap.message).toContain('50.0 %');
    const text = (await run(args)).stdout;
    expect(text).toContain('40 points lie in cells with no population at risk');
    expect(text).toContain(`do not depart from the population at risk (baseline: ${popPath}, field residents)`);
  });

  it('shares below 1e-9 of a cell along a shared edge add no weight (clipping noise)', async () => {
    const file = write();
    // the second polygon starts 1e-8 m left of x = 200: its share of cell (1, j) is 1e-10 of the cell's area
    const json = await countJson([
      '--points', file('points.csv', pointsCsv(OBSERVED)),
      '--area', file('area.geojson', polygonFile([STUDY])),
      '--baseline', file('pop.geojson', featuresGeoJson([rect(0, 0, 200 - 1e-8, 200), rect(200 - 1e-8, 0, 400, 200)], [{ n: 0 }, { n: 300 }])),
      '--baseline-field', 'n',
    ]);
    expect(json.cells).toBe(4);
    expect(json.zeroBaselineCells).toBe(4);
  });
});

describe('count against control points', () => {
  it('w_c is the number of controls in the cell; E = N·w/Σw', async () => {
    const file = write();
    const controls = [5, 5, 10, 10, 5, 5, 10, 10];
    const json = await countJson([
      '--points', file('points.csv', pointsCsv(OBSERVED)),
      '--area', file('area.geojson', polygonFile([STUDY])),
      '--controls', file('controls.csv', pointsCsv(controls)),
    ]);
    expect(json.expectedFrom).toBe('controls');
    expect(json.baselineTotal).toBe(60);
    // E = 50·5/60 = 4.1667 (left), 8.3333 (right)
    // python3 -c "import numpy as n; from scipy.stats import chi2; O=n.array([2,3,10,12,1,4,8,10.]); w=n.array([5,5,10,10,5,5,10,10.]);
    //   E=O.sum()*w/w.sum(); c=((O-E)**2/E).sum(); print(c, chi2.sf(c,7))"
    expect(json.chi2).toBeCloseTo(6.16, 10);
    expect(json.pClustered).toBeCloseTo(0.5211963208682182, 12);
    expect(json.baseline).toMatchObject({ kind: 'controls', totalInside: 60 });
    const text = (await run(['count', '--crs', 'planar', '--cell', '100', '--points', join(dirname(json.baseline.file), 'points.csv'),
      '--area', join(dirname(json.baseline.file), 'area.geojson'), '--controls', json.baseline.file])).stdout;
    // the verdict is the calibrated random-labelling Monte Carlo test's (test/stress/count-labelling-calibration.test.ts),
    // so the former "Read first" warning about the chi-square p is gone; the chi-square p is listed as not the test
    expect(text).not.toContain('Read first: the chi-square p');
    expect(text).toContain('The counts do not depart from the population at risk (controls: ');
    expect(text).toContain('Monte Carlo p from 999 random relabellings of the pooled cases and controls, seed 1, two-sided test at alpha = 0.05');
    expect(text).toContain("chi-square p (controls as exact)");
    // the observed statistic of the test is the chi-square's chi2/df (same cells, same weights)
    expect(json.monteCarlo).toMatchObject({ test: 'random labelling', sims: 999, seed: 1, statistic: 'chi2/df', verdict: 'csr' });
    expect(json.monteCarlo.observed).toBeCloseTo(6.16 / 7, 10);
    // p in steps of 1/1000, both tails count ties: pClustered + pRegular >= 1 + 1/1000
    for (const p of [json.monteCarlo.pClustered, json.monteCarlo.pRegular]) expect(Math.round(p * 1000)).toBeCloseTo(p * 1000, 9);
    expect(json.monteCarlo.pClustered + json.monteCarlo.pRegular).toBeGreaterThanOrEqual(1 + 1 / 1000 - 1e-12);
  });

  it('the Monte Carlo test is seeded and reproducible, and finds cases clustered among controls', async () => {
    const file = write();
    const area = file('area.geojson', polygonFile([STUDY]));
    const controls = file('controls.csv', pointsCsv([5, 5, 5, 5, 5, 5, 5, 5]));
    // 50 cases, 30 of them in one cell: far beyond the controls (5 in every cell)
    const cases = file('cases.csv', pointsCsv([2, 2, 30, 2, 2, 4, 4, 4]));
    const base = ['--points', cases, '--area', area, '--controls', controls];
    const first = await countJson([...base, '--sims', '199', '--seed', '5']);
    const again = await countJson([...base, '--sims', '199', '--seed', '5']);
    expect(again.monteCarlo).toEqual(first.monteCarlo);
    expect(first.monteCarlo).toMatchObject({ sims: 199, seed: 5, verdict: 'clustered' });
    // no random labelling is as extreme: p = 1/(R + 1)
    expect(first.monteCarlo.pClustered).toBeCloseTo(1 / 200, 12);
    const text = (await run(['count', '--crs', 'planar', '--cell', '100', ...base, '--sims', '199', '--seed', '5'])).stdout;
    expect(text).toContain('The counts show clustering beyond the population at risk (controls: ');
    expect(text).toContain('p = 0.005, Monte Carlo p from 199 random relabellings');
  });

  it('refuses --sims too few to reject at alpha, and --sims or --seed without controls', async () => {
    const file = write();
    const base = ['count', '--crs', 'planar', '--cell', '100', '--points', file('points.csv', pointsCsv(OBSERVED)), '--area', file('area.geojson', polygonFile([STUDY]))];
    const few = await run([...base, '--controls', file('controls.csv', pointsCsv([5, 5, 10, 10, 5, 5, 10, 10])), '--sims', '9']);
    expect(few.code).not.toBe(0);
    expect(few.stderr.trim().split('\n')).toHaveLength(1);
    expect(few.stderr).toMatch(/--sims 9: count --controls needs 19 to 9999 random labellings at alpha 0\.05/);
    const area = await run([...base, '--sims', '99']);
    expect(area.code).not.toBe(0);
    expect(area.stderr).toMatch(/--sims applies only with --controls/);
  });
});

describe('described cells against a baseline (grid exports, report map)', () => {
  it('left-out zero-weight cells and E_c = N·w_c/Σw in the kept ones', async () => {
    const { loadDataset } = await import('../../server/inputs/index.js');
    const { describeCells, createCellCounter } = await import('../../workers/placement/index.js');
    const { createBaselineWeigher } = await import('../../workers/baseline/baseline-weights.js');
    const { insideCoordinates } = await import('../../server/inputs/index.js');
    const dataset = loadDataset(
      {
        points: { name: 'points.csv', content: pointsCsv(OBSERVED) },
        area: { name: 'area.geojson', content: polygonFile([STUDY]) },
        baseline: { name: 'pop.geojson', content: featuresGeoJson([rect(0, 0, 150, 200), rect(150, 0, 300, 200)], [{ n: 60 }, { n: 90 }]) },
      },
      { crs: 'planar', baselineField: 'n' },
    );
    const cells = describeCells({
      counter: createCellCounter(insideCoordinates(dataset), dataset.origin),
      region: dataset.region,
      origin: dataset.origin,
      cellSize: 100,
      placement: { u: 0, v: 0, angle: 0 },
      minCoverage: 0.5,
      baseline: createBaselineWeigher(dataset.baseline!.engine, dataset.origin),
    });
    // w: (0,j) 60·10000/30000 = 20, (1,j) 60·5000/30000 + 90·5000/30000 = 25, (2,j) 90·10000/30000 = 30, (3,j) 0 -> left out;
    // N = 2+3+10+1+4+8 = 28, Σw = 150
    const byCell = new Map(cells.map((cell) => [`${cell.i},${cell.j}`, cell]));
    expect(byCell.get('3,0')!.kept).toBe(false);
    expect(byCell.get('3,0')!.expected).toBeNull();
    expect(byCell.get('0,0')!.expected).toBeCloseTo((28 * 20) / 150, 9);
    expect(byCell.get('1,1')!.expected).toBeCloseTo((28 * 25) / 150, 9);
    expect(byCell.get('2,1')!.expected).toBeCloseTo((28 * 30) / 150, 9);
  });
});
