import { describe, expect, it } from 'vitest';
import { formatPValue, pPhrase } from '../../shared/p-value.js';
import { run, tempFolder } from './run-cli.js';

describe('formatPValue (shared/p-value.ts)', () => {
  it('never prints 0: below 1e-300 it prints the bound', () => {
    expect(formatPValue(0)).toBe('< 1e-300');
    expect(formatPValue(5e-324)).toBe('< 1e-300');
    expect(formatPValue(1e-301)).toBe('< 1e-300');
    expect(pPhrase(0)).toBe('p < 1e-300');
    expect(formatPValue(3.653e-202)).toBe('3.65e-202');
    expect(formatPValue(0.06859370174426165)).toBe('0.06859');
    expect(formatPValue(0.05)).toBe('0.05');
    expect(formatPValue(1)).toBe('1');
    expect(formatPValue(Number.NaN)).toBe('n/a');
  });
});

/** A 10 x 10 grid of 10 m cells over a 100 m square; `perCell` points spread inside each listed cell. */
function pointsCsv(cells: Array<[number, number, number]>): string {
  const lines = ['id,x,y'];
  let id = 0;
  for (const [i, j, count] of cells) {
    for (let k = 0; k < count; k++) lines.push(`r${++id},${i * 10 + 1 + (k % 8)},${j * 10 + 1 + Math.floor(k / 8) % 8 + 0.5}`);
  }
  return `${lines.join('\n')}\n`;
}

const LOG_SF = -98584.72734904490833;

const AREA = JSON.stringify({ type: 'FeatureCollection', features: [{ type: 'Feature', properties: {}, geometry: { type: 'Polygon', coordinates: [[[0, 0], [100, 0], [100, 100], [0, 100], [0, 0]]] } }] });

describe('gridshake count with a p-value below the smallest double', () => {
  // 2000 points in one of 100 cells: chi2 = (2000 - 20)^2/20 + 99 * 20 = 198000 on 99 df. P(chi2_99 >= 198000)
  // underflows (scipy.stats.chi2.logsf(198000, 99) gives -inf): log p from mpmath (mp.dps = 40),
  // mpmath.log(mpmath.gammainc(99/2, 198000/2, mpmath.inf, regularized=True)) = -98584.72734904490833
  it('says p < 1e-300 in text and keeps the number plus its log (log space) in JSON', async () => {
    const file = tempFolder();
    const points = file('clump.csv', pointsCsv([[4, 4, 2000]]));
    const area = file('square.geojson', AREA);
    const base = ['count', '--points', points, '--area', area, '--crs', 'planar', '--cell', '10'];
    const text = await run(base);
    expect(text.code).toBe(0);
    expect(text.stdout).toContain('(p < 1e-300, two-sided test at alpha = 0.05)');
    expect(text.stdout).not.toMatch(/p = 0[^.]/);
    const json = await run([...base, '--json']);
    const result = JSON.parse(json.stdout) as Record<string, number>;
    expect(result.pClustered).toBe(0);
    expect(result.chi2).toBeCloseTo(198000, 6);
    expect(Math.abs(result.logPClustered! / LOG_SF - 1)).toBeLessThan(1e-10);
    expect(result.logPRegular).toBe(0);
  });

  // 50 points in 25 cells of the 100 cells, 2 each: 0.5 expected points per cell, below both rules of thumb
  it('puts the warning that makes the p-value unreliable before the verdict', async () => {
    const file = tempFolder();
    const cells: Array<[number, number, number]> = [];
    for (let i = 0; i < 5; i++) for (let j = 0; j < 5; j++) cells.push([2 * i, 2 * j, 2]);
    const text = await run(['count', '--points', file('sparse.csv', pointsCsv(cells)), '--area', file('square.geojson', AREA), '--crs', 'planar', '--cell', '10']);
    expect(text.code).toBe(0);
    const caveat = text.stdout.indexOf('Read first: 0.50 expected points per whole cell');
    expect(caveat).toBeGreaterThan(0);
    expect(caveat).toBeLessThan(text.stdout.indexOf('The counts'));
  });
});

describe('gridshake sweep with too few simulations', () => {
  it('exits 2 with the least R that can reject at alpha', async () => {
    const file = tempFolder();
    const result = await run(['sweep', '--points', file('p.csv', pointsCsv([[1, 1, 30], [5, 5, 30]])), '--area', file('a.geojson', AREA),
      '--crs', 'planar', '--cells', '10', '--sims', '9', '--out', file('unused', '') + '-out']);
    expect(result.code).toBe(2);
    expect(result.stderr).toContain('--sims 9 is too few for a test at alpha 0.05');
    expect(result.stderr).toContain('use sims of at least 19');
  });
});
