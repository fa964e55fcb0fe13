import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { parse } from 'csv-parse/sync';
import type { PlacementRow, SweepSummary } from '../../shared/contracts.js';
import { run as cli } from '../cli/run-cli.js';
import { scenarioFiles } from './sweep-fixtures.js';

// `gridshake sweep --shape` (issue 16): the hexagon rows of a sweep are what `gridshake count --shape hex` says at
// the same placement, and square,hex puts both shapes of one placement design side by side in every output.

const scenario = () => scenarioFiles('gridshake-hexsweep-', 'sightings.csv', 1200, 8);

describe('gridshake sweep --shape', () => {
  it('runs square,hex on one design: shape column, per-size shape, hexagon rows equal to count --shape hex', async () => {
    const files = scenario();
    const out = join(files.folder, 'out');
    const input = ['--points', files.points, '--area', files.area, '--no-data', files.reservoir, '--crs', 'planar'];
    const sweep = await cli(['sweep', ...input, '--cells', '90,150', '--placements', '12', '--sims', '19', '--seed', '3', '--shape', 'square,hex', '--out', out, '--threads', '2']);
    expect(sweep.code, sweep.stderr).toBe(0);
    expect(sweep.stdout).toMatch(/^90 m cells: /m);
    expect(sweep.stdout).toMatch(/^90 m hexagonal cells: /m);
    expect(sweep.stdout).toMatch(/^150 m hexagonal cells: /m);
    // the overall test runs across every (shape, size) entry on the same simulated patterns; one sentence on the shape
    expect(sweep.stdout).toMatch(/The overall Monte Carlo test across all 2 cell sizes, both cell shapes and both tails finds/);
    expect(sweep.stdout).toMatch(/The conclusion (does not depend|depends) on the cell shape/);

    const csvText = readFileSync(join(out, 'placements.csv'), 'utf8');
    expect(csvText.split('\n')[0]).toMatch(/cell sides 90, 150 m, square and hex cells, 12 placements per side/);
    const rows = parse(csvText, { columns: true, comment: '#' }) as Record<string, string>[];
    expect(rows).toHaveLength(48);
    expect(Object.keys(rows[0]).slice(0, 4)).toEqual(['size_index', 'cell_side_m', 'shape', 'placement']);
    expect(rows.filter((row) => row.shape === 'square')).toHaveLength(24);
    expect(rows.filter((row) => row.shape === 'hex')).toHaveLength(24);
    // the same placement design: equal offsets, the hexagons' angles at 60/90 of the squares'
    const square = rows.filter((row) => row.shape === 'square' && row.cell_side_m === '90');
    const hex = rows.filter((row) => row.shape === 'hex' && row.cell_side_m === '90');
    expect(hex.map((row) => [row.offset_u_cells, row.offset_v_cells])).toEqual(square.map((row) => [row.offset_u_cells, row.offset_v_cells]));
    hex.forEach((row, k) => expect(Number(row.angle_deg)).toBeCloseTo((Number(square[k].angle_deg) * 60) / 90, 3));
    expect(hex.every((row) => Number(row.angle_deg) < 60)).toBe(true);

    const summary = JSON.parse(readFileSync(join(out, 'summary.json'), 'utf8')) as SweepSummary;
    expect(summary.plan.shape).toEqual(['square', 'hex']);
    expect(summary.sizes.map((size) => [size.sizeIndex, size.cellSize, size.shape])).toEqual([
      [0, 90, 'square'],
      [1, 150, 'square'],
      [2, 90, 'hex'],
      [3, 150, 'hex'],
    ]);

    // full-precision hexagon rows of summary.json (reference, lowest and highest vmr) against count --shape hex --json
    const hexRows: PlacementRow[] = summary.sizes.filter((size) => size.shape === 'hex').flatMap((size) => [size.reference, size.lowestVmr, size.highestVmr]);
    for (const row of hexRows) {
      expect(row.shape).toBe('hex');
      const count = await cli([
        'count', ...input, '--cell', String(row.cellSize), '--shape', 'hex', '--angle', String(row.angle), '--offset', `${row.u},${row.v}`, '--json',
      ]);
      expect(count.code, count.stderr).toBe(0);
      const result = JSON.parse(count.stdout) as Record<string, unknown>;
      expect(result.shape).toBe('hex');
      expect([result.cells, result.points, result.chi2, result.df, result.vmr, result.pClustered, result.pRegular, result.verdict]).toEqual([
        row.cells, row.points, row.chi2, row.df, row.vmr, row.pClustered, row.pRegular, row.verdict,
      ]);
    }
  });

  it('refuses an unknown shape in command-line words and writes nothing', async () => {
    const files = scenario();
    const result = await cli(['sweep', '--points', files.points, '--crs', 'planar', '--cells', '90', '--shape', 'square,circle', '--out', join(files.folder, 'never')]);
    expect(result.code).toBe(1);
    expect(result.stderr).toContain("--shape must be one of square, hex, got 'circle'");
  });
});

describe('report.html of a sweep with both shapes', () => {
  it('lists each (side, shape) entry side by side and says what was varied for each shape', async () => {
    const files = scenario();
    const out = join(files.folder, 'out');
    const sweep = await cli(['sweep', '--points', files.points, '--area', files.area, '--crs', 'planar', '--cells', '120', '--placements', '6', '--sims', '0', '--shape', 'square,hex', '--out', out, '--threads', '1']);
    expect(sweep.code, sweep.stderr).toBe(0);
    const html = readFileSync(join(out, 'report.html'), 'utf8').replace(/<script[\s\S]*?<\/script>/g, '');
    expect(html).toContain('<h2>Cell side 120 m</h2>');
    expect(html).toContain('<h2>Cell side 120 m, hexagonal cells</h2>');
    expect(html).toContain('120 m hexagons');
    expect(html).toContain('0 to 90 degrees for squares, 0 to 60 for hexagons');
    expect(html).toMatch(/The conclusion (does not depend|depends) on the cell shape/);
  });

  it('draws the reference grid of a hexagon-only sweep as hexagons on the report map', async () => {
    const files = scenario();
    const out = join(files.folder, 'out');
    const sweep = await cli(['sweep', '--points', files.points, '--area', files.area, '--crs', 'planar', '--cells', '150', '--placements', '4', '--sims', '0', '--shape', 'hex', '--out', out, '--threads', '1']);
    expect(sweep.code, sweep.stderr).toBe(0);
    const html = readFileSync(join(out, 'report.html'), 'utf8').replace(/<script[\s\S]*?<\/script>/g, '');
    expect(html).toMatch(/reference grid of 150 m hexagonal cells \(angle 0, offset 0,0\)/);
  });
});
