import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { parse } from 'csv-parse/sync';
import { describe, expect, it } from 'vitest';
import type { SweepSummary } from '../../shared/contracts.js';
import { run } from '../cli/run-cli.js';
import { polygonFile, write } from './baseline-fixtures.js';
import { blocksGeoJson, csv, discPoints, populationPoints, TOWN } from './population-fixtures.js';

/**
 * Power of the sweep against a baseline (issue 15), with the Monte Carlo test at alpha 0.05 (R = 19, the smallest
 * R whose p can reach 0.05). Needs the compiled pool (npm run build).
 * - A pattern that only follows the population is clustered against area at every size, not against the baseline.
 * - The same pattern with one extra cluster is found against the baseline.
 */
async function sweep(points: number[][], extra: string[]) {
  const file = write();
  const out = join(file('points.csv', csv(points)), '..', `out-${extra.length}-${points.length}`);
  const result = await run([
    'sweep', '--crs', 'planar', '--points', join(out, '..', 'points.csv'), '--area', file('area.geojson', polygonFile([TOWN])),
    '--cells', '160,300', '--placements', '16', '--sims', '19', '--seed', '7', '--threads', '2', '--out', out,
    ...extra.map((arg) => (arg === 'BLOCKS' ? file('blocks.geojson', blocksGeoJson()) : arg)),
  ]);
  expect(result.code, result.stderr).toBe(0);
  const summary = JSON.parse(readFileSync(join(out, 'summary.json'), 'utf8')) as SweepSummary;
  const rows = parse(readFileSync(join(out, 'placements.csv'), 'utf8'), { columns: true, comment: '#' }) as Record<string, string>[];
  return { summary, rows, stdout: result.stdout, report: readFileSync(join(out, 'report.html'), 'utf8') };
}

const BASELINE = ['--baseline', 'BLOCKS', '--baseline-field', 'residents'];

/** The largest excess share of the stability surface over the sweep's cell sizes. */
const largestExcess = (summary: SweepSummary) => Math.max(...summary.stability!.map((size) => size.maxExcessShare));

describe('sweep against baseline polygons', () => {
  it('a pattern that follows the population: clustered against area at every size, not against the baseline', async () => {
    const points = populationPoints(800, 11);
    const area = await sweep(points, []);
    for (const size of area.summary.sizes) {
      expect(size.mostCommon).toBe('clustered');
      expect(size.monteCarlo!.pMedianClustered).toBeLessThanOrEqual(0.05);
    }
    expect(area.rows.every((row) => row.expected_from === 'area')).toBe(true);

    const against = await sweep(points, BASELINE);
    for (const size of against.summary.sizes) expect(size.monteCarlo!.pMedianClustered).toBeGreaterThan(0.05);
    expect(against.summary.expectedFrom).toBe('baseline');
    expect(against.summary.baseline).toMatchObject({ kind: 'polygons', field: 'residents', totalInside: 3645, total: 3645 });
    expect(against.summary.baseline!.file).toMatch(/blocks\.geojson$/);
    expect(against.summary.dataset.baseline?.field).toBe('residents');
    expect(against.rows.every((row) => row.expected_from === 'baseline')).toBe(true);
    // every kept cell has residents: the blocks cover the town
    expect(against.rows.every((row) => row.zero_baseline_cells === '0')).toBe(true);
    expect(against.summary.conclusion).toContain('the population at risk (baseline: ');
    expect(against.summary.conclusion).toContain('field residents)');
    // side by side: every size clustered against area, and the baseline's verdict beside it
    for (const size of against.summary.sizes) expect(size.areaOnly?.mostCommon).toBe('clustered');
    expect(against.rows.every((row) => row.expected_from === 'baseline' && Number(row.baseline_total) > 0)).toBe(true);
    expect(against.report).toContain('Against area and against the population at risk');
    expect(against.report).toContain('Goodchild and Lam 1980');
    expect(against.report).toContain('areal weighting');
    expect(area.report).not.toContain('Against area and against the population at risk');
    expect(area.summary.conclusion).toContain('clustering beyond complete spatial randomness');
    // the stability surface's cell flags follow the same expected counts: the dense blocks are excess cells against
    // area in almost every placement, but not against the baseline (E_c = N w_c / Σ w)
    expect(largestExcess(area.summary)).toBeGreaterThan(0.9);
    expect(largestExcess(against.summary)).toBeLessThan(0.5);
  }, 240_000);

  it('one extra cluster on top of the population is found against the baseline', async () => {
    const points = [...populationPoints(800, 11), ...discPoints(60, 250, 1250, 120, 5)];
    const against = await sweep(points, BASELINE);
    for (const size of against.summary.sizes) expect(size.monteCarlo!.pMedianClustered).toBeLessThanOrEqual(0.05);
    expect(against.summary.conclusion).toMatch(/finds clustering beyond the population at risk \(baseline: .*blocks\.geojson, field residents\) at alpha 0\.05/);
    // the extra cluster's cells are excess against the baseline in most placements
    expect(largestExcess(against.summary)).toBeGreaterThan(0.5);
  }, 240_000);
});

describe('stability flags against control points', () => {
  // controls drawn from the same population as the cases (twice as many); the flags use E_c = N w_c / Σ w with w the
  // controls in the cell, and each random labelling its own controls (workers/baseline/relabelled-flags.ts)
  const CONTROLS = (controls: number[][]) => ['--controls', `CONTROLS:${csv(controls)}`];
  async function sweepWithControls(points: number[][], controls: number[][]) {
    const file = write();
    const extra = CONTROLS(controls).map((arg) => (arg.startsWith('CONTROLS:') ? file('controls.csv', arg.slice('CONTROLS:'.length)) : arg));
    return sweep(points, extra);
  }

  it('a pattern that follows the population has no stable excess against the controls; an extra cluster does', async () => {
    const controls = populationPoints(1600, 12);
    const follows = await sweepWithControls(populationPoints(800, 11), controls);
    expect(follows.summary.expectedFrom).toBe('controls');
    // against area the dense blocks are excess in almost every placement (first test); against the controls not
    expect(largestExcess(follows.summary), `largest excess share ${largestExcess(follows.summary)}`).toBeLessThan(0.5);
    const cluster = await sweepWithControls([...populationPoints(800, 11), ...discPoints(60, 250, 1250, 120, 5)], controls);
    expect(largestExcess(cluster.summary), `largest excess share ${largestExcess(cluster.summary)}`).toBeGreaterThan(0.5);
  }, 240_000);
});
