import { execFile } from 'node:child_process';
import { readFileSync, existsSync } from 'node:fs';
import { join } from 'node:path';
import { promisify } from 'node:util';
import { describe, it, expect } from 'vitest';
import { parse } from 'csv-parse/sync';
import type { SweepSummary } from '../../shared/contracts.js';
import { run as inProcess } from '../cli/run-cli.js';
import { scenarioFiles } from './sweep-fixtures.js';

const run = promisify(execFile);

const scenario = () => scenarioFiles('gridshake-sweep-', 'incidents.csv', 1500, 5);

describe('gridshake sweep (compiled command)', () => {
  it('writes placements.csv, summary.json and report.html for a polygon with a no-data zone', async () => {
    const files = scenario();
    const out = join(files.folder, 'out');
    const { stdout, stderr } = await run(process.execPath, [
      'bin/gridshake.js', 'sweep', '--points', files.points, '--area', files.area, '--no-data', files.reservoir,
      '--crs', 'planar', '--cells', '80,140', '--placements', '40', '--sims', '19', '--seed', '4', '--out', out, '--threads', '2',
    ]);
    // stdout: one conclusion per size, then the overall conclusion
    expect(stdout).toMatch(/^80 m cells: clustered in 100 % of 40 placements; Monte Carlo p = 0\.05 on the median chi2\/df/m);
    expect(stdout).toMatch(/^140 m cells: clustered/m);
    expect(stdout).toContain('The overall Monte Carlo test across all 2 cell sizes and both tails finds a departure from CSR at alpha 0.05 (p = 0.05, R = 19): clustering');
    expect(stderr).toMatch(/\[#+\] 100 % 80\/80 placements/);

    const csvText = readFileSync(join(out, 'placements.csv'), 'utf8');
    // LF line ends; a first comment line names the run; column names carry their units
    expect(csvText).not.toContain('\r');
    expect(csvText.split('\n')[0]).toMatch(/^# gridshake placements: dataset ".*", cell sides 80, 140 m, 40 placements per side \(halton, rotation on\), .*seed 4; coordinates planar/);
    const rows = parse(csvText, { columns: true, comment: '#' }) as Record<string, string>[];
    expect(rows).toHaveLength(80);
    expect(rows[0]).toMatchObject({ size_index: '0', cell_side_m: '80', placement: '0', offset_u_cells: '0', offset_v_cells: '0', angle_deg: '0', verdict: 'clustered' });
    // six significant digits: chi2 / df agrees with chi2_per_df to the rounding
    expect(Number(rows[0].chi2) / Number(rows[0].df)).toBeCloseTo(Number(rows[0].chi2_per_df), 3);

    const summary = JSON.parse(readFileSync(join(out, 'summary.json'), 'utf8')) as SweepSummary;
    expect(summary.plan).toMatchObject({ cells: [80, 140], placements: 40, sims: 19, seed: 4, rotation: true, design: 'halton' });
    expect(summary.dataset.n).toBe(1500);
    expect(summary.dataset.nInside + summary.dataset.nOutside).toBe(1500);
    expect(summary.sizes.map((size) => size.monteCarlo?.pMedianClustered)).toEqual([0.05, 0.05]);
    expect(summary.versions.gridshake).toMatch(/^\d+\.\d+\.\d+/);
    expect(summary.timings.seconds).toBeGreaterThan(0);
    expect(readFileSync(join(out, 'report.html'), 'utf8')).toMatch(/^<!doctype html>/i);
  });
});

describe('gridshake sweep (flags)', () => {
  it('says which flags are wrong in command-line words', async () => {
    const files = scenario();
    const out = join(files.folder, 'never');
    const both = await inProcess(['sweep', '--points', files.points, '--crs', 'planar', '--cells', '50', '--per-cell', '5', '--out', out]);
    expect(both.code).toBe(1);
    expect(both.stderr).toContain('give exactly one of --cells (cell sides in metres) or --per-cell (expected points per cell)');
    const placements = await inProcess(['sweep', '--points', files.points, '--crs', 'planar', '--cells', '50', '--placements', '70000', '--out', out]);
    expect(placements.code).toBe(1);
    expect(placements.stderr).toContain('--placements must be an integer from 1 to 65536, got 70000');
    const large = await inProcess(['sweep', '--points', files.points, '--area', files.area, '--crs', 'planar', '--cells', '5000', '--out', out]);
    expect(large.code).toBe(1);
    expect(large.stderr).toMatch(/--cells value 1 gives cells of 5000 m, which leave fewer than 2 cells/);
    const missing = await inProcess(['sweep', '--points', files.points, '--cells', '50']);
    expect(missing.code).toBe(2);
    expect(existsSync(out)).toBe(false);
  });
});
