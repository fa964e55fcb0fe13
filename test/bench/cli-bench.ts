/**
 * Target 2: the analyst's default plan end to end through `gridshake sweep` (read the CSV, sweep, simulations,
 * summary, the three output files) on 1e5 clustered points: 3 cell sizes (2, 5 and 10 expected points per cell)
 * x 256 placements x (1 + 99 simulations). Its wall time is compared with the C loop's time for the plan's nominal
 * point-placements, n x sizes x placements x (1 + sims), at the same cell sides. Target: ratio <= 1.0.
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { DEFAULT_PLAN } from '../../shared/plan-rules.js';
import { PACKAGE_ROOT } from '../../server/services/project-paths.js';
import { haltonPlacements } from '../../workers/random/index.js';
import { BENCH_ORIGIN, cellSideForExpected, clusteredDataset } from './bench-data.js';
import { writeBenchInputs } from './bench-inputs.js';
import { printTable } from './bench-table.js';
import type { CReference } from './c-reference.js';
import { ratioFigure, type TargetFigure } from './targets.js';

const N = 1e5;
const PER_CELL = [2, 5, 10];

export function runCliBench(reference: CReference | null): TargetFigure {
  const folder = mkdtempSync(join(tmpdir(), 'gridshake-bench-cli-'));
  try {
    const dataset = clusteredDataset(N, 13);
    const files = writeBenchInputs(folder, dataset.xy);
    const args = [join(PACKAGE_ROOT, 'bin', 'gridshake.js'), 'sweep', '--points', files.points, '--area', files.area, '--no-data', files.noData, '--crs', 'planar', '--per-cell', PER_CELL.join(','), '--out', join(folder, 'out')];
    const start = process.hrtime.bigint();
    execFileSync(process.execPath, args, { stdio: 'ignore' });
    const seconds = Number(process.hrtime.bigint() - start) / 1e9;
    const nominal = N * PER_CELL.length * DEFAULT_PLAN.placements * (1 + DEFAULT_PLAN.sims);
    const sample = haltonPlacements(16, true);
    const cNs = reference === null ? Number.NaN : PER_CELL.reduce((sum, k) => sum + reference.nsPerPointPlacement(dataset.xy, BENCH_ORIGIN, cellSideForExpected(k, N), sample), 0) / PER_CELL.length;
    const figure = ratioFigure(seconds, (cNs * nominal) / 1e9, 1);
    printTable(
      `T2. Default plan end to end (gridshake sweep, 1e5 clustered points, per-cell ${PER_CELL.join(',')}, ${DEFAULT_PLAN.placements} placements, ${DEFAULT_PLAN.sims} sims): ${nominal.toExponential(2)} nominal point-placements`,
      ['gridshake s', 'C loop s (nominal work)', 'C ns/point-placement', 'ratio', 'target', 'status'],
      [[seconds, figure.reference, cNs, figure.ratio, '<= 1.0', figure.status]],
    );
    return figure;
  } finally {
    rmSync(folder, { recursive: true, force: true });
  }
}
