/**
 * Target 5: the same sweep costs no more when the server runs it than when the command line's engine does.
 * The server path: the dataset is uploaded once (POST /api/datasets), then the same plan is started twice
 * (POST /api/sweeps) and each run is timed from the request to status `done`. The CLI path: the same dataset,
 * loaded once, swept twice by a SweepPool in this process with the stability surfaces, as `gridshake sweep` runs it
 * (server/cli/sweep-command.ts) and as every server sweep does (without them the two paths would not do the same
 * work: the surfaces were most of a sweep's time before they were made sparse). The ratio compares the best run of each.
 * Target: ratio <= 1.0 (the server's per-sweep work is no more than the CLI's: the points are not re-sorted and
 * re-shared for each sweep). Polling every 10 ms adds at most about 10 ms to a server run of several seconds.
 */
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { buildApp } from '../../server/app.js';
import { normalizePlan } from '../../server/sweeps/plan.js';
import { SweepPool } from '../../server/sweeps/sweep-pool.js';
import { clusteredDataset } from './bench-data.js';
import { writeBenchInputs } from './bench-inputs.js';
import { printTable } from './bench-table.js';
import { ratioFigure, type TargetFigure } from './targets.js';

const N = 2e5;
const PLAN = { perCell: [5], placements: 64, sims: 19, seed: 3 };
const RUNS = 3;

function multipart(parts: { name: string; value: string; filename?: string }[]): { body: Buffer; contentType: string } {
  const boundary = `gridshake-bench-${Date.now()}`;
  const chunks = parts.map((part) => {
    const disposition = `form-data; name="${part.name}"${part.filename === undefined ? '' : `; filename="${part.filename}"`}`;
    return `--${boundary}\r\nContent-Disposition: ${disposition}\r\n\r\n${part.value}\r\n`;
  });
  return { body: Buffer.from(`${chunks.join('')}--${boundary}--\r\n`), contentType: `multipart/form-data; boundary=${boundary}` };
}

export async function runServerBench(): Promise<TargetFigure> {
  const folder = mkdtempSync(join(tmpdir(), 'gridshake-bench-server-'));
  const app = await buildApp({ dataDir: join(folder, 'data'), threads: 2, logger: false });
  try {
    const files = writeBenchInputs(folder, clusteredDataset(N, 17).xy);
    const upload = multipart([
      { name: 'points', value: files.csv, filename: 'points.csv' },
      { name: 'area', value: readFileSync(files.area, 'utf8'), filename: 'area.geojson' },
      { name: 'noData', value: readFileSync(files.noData, 'utf8'), filename: 'reservoir.geojson' },
      { name: 'crs', value: 'planar' },
    ]);
    const created = await app.inject({ method: 'POST', url: '/api/datasets', payload: upload.body, headers: { 'content-type': upload.contentType } });
    if (created.statusCode !== 201) throw new Error(`upload refused: ${created.body}`);
    const datasetId = created.json().id as string;

    const serverSeconds: number[] = [];
    for (let run = 0; run < RUNS; run++) {
      const start = process.hrtime.bigint();
      const started = await app.inject({ method: 'POST', url: '/api/sweeps', payload: { datasetId, plan: PLAN } });
      if (started.statusCode !== 202) throw new Error(`sweep refused: ${started.body}`);
      const id = started.json().id as string;
      for (;;) {
        const status = (await app.inject({ method: 'GET', url: `/api/sweeps/${id}` })).json().status as string;
        if (status === 'done') break;
        if (status !== 'queued' && status !== 'running') throw new Error(`server sweep ended ${status}`);
        await new Promise((resolve) => setTimeout(resolve, 10));
      }
      serverSeconds.push(Number(process.hrtime.bigint() - start) / 1e9);
    }

    const dataset = app.gridshake.datasets.load(datasetId);
    const pool = new SweepPool({ threads: 2 });
    const cliSeconds: number[] = [];
    try {
      for (let run = 0; run < RUNS; run++) {
        const start = process.hrtime.bigint();
        await pool.runSweep(dataset, normalizePlan(PLAN), { stability: true });
        cliSeconds.push(Number(process.hrtime.bigint() - start) / 1e9);
      }
    } finally {
      await pool.destroy();
    }
    const figure = ratioFigure(Math.min(...serverSeconds), Math.min(...cliSeconds), 1);
    printTable(
      `T5. The same sweep from the server and from the CLI's engine (${N.toExponential(0)} points, per-cell 5, ${PLAN.placements} placements, ${PLAN.sims} sims, 2 threads, ${RUNS} runs each)`,
      ['path', 'first run s', 'best run s', 'ratio server/CLI', 'target', 'status'],
      [
        ['server (upload once, sweep again)', serverSeconds[0], figure.ours, figure.ratio, '<= 1.0', figure.status],
        ['CLI engine (dataset loaded once)', cliSeconds[0], figure.reference, 1, '', ''],
      ],
    );
    return figure;
  } finally {
    await app.close();
    rmSync(folder, { recursive: true, force: true });
  }
}
