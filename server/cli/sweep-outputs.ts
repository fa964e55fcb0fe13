/**
 * What `gridshake sweep` writes after a sweep, as (name, content) pairs: placements.csv, summary.json, report.html
 * and the stability surfaces' GeoTIFF and GeoJSON files. One function, so that the command and the benchmark that
 * compares a server sweep with a command-line sweep (test/bench/server-bench.ts) do the same work.
 */
import type { Dataset } from '../../shared/contracts.js';
import { renderReport } from '../report/render-report.js';
import { reportMap } from '../report/report-map.js';
import { stabilityFiles } from '../stability/stability-files.js';
import { placementsToCsv } from '../sweeps/placements-csv.js';
import type { SweepResult } from '../sweeps/sweep-pool.js';
import { SWEEP_OUTPUTS } from './output-folder.js';

export function sweepOutputFiles(dataset: Dataset, result: SweepResult): [name: string, content: string | Uint8Array][] {
  const { rows, summary, stability } = result;
  const [csvName, summaryName, reportName] = SWEEP_OUTPUTS;
  return [
    [csvName, placementsToCsv(rows, { summary })],
    [summaryName, `${JSON.stringify(summary, null, 2)}\n`],
    [reportName, renderReport(summary, rows, reportMap(dataset, summary))],
    ...stabilityFiles(stability, summary.stability ?? [], dataset.projection, dataset.name),
  ];
}
