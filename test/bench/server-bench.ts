/**
 * Target 5: the same sweep costs no more when the server runs it than when the command line does.
 * The server path: the dataset is uploaded once (POST /api/datasets), then the same plan is started five times
 * (POST /api/sweeps) and each run is timed from the request until its event stream ends with status `done` (the
 * sweep, then its rows and stability files stored), followed as the page follows it. The CLI path: the same dataset, loaded once (the command's reading and sorting of the CSV is left
 * out, which favours the CLI), swept five times by a SweepPool in this process with the stability surfaces, each run
 * followed by the files `gridshake sweep` writes (server/cli/sweep-outputs.ts, into a temporary folder), as the
 * command runs it (server/cli/sweep-command.ts). The ratio compares the best run of each; the table also shows the
 * CLI's sweep alone, without its files.
 * Target: ratio <= 1.0 (the server's per-sweep work is no more than the CLI's: the points are not re-sorted and
 * re-shared for each sweep). The two paths take turns (server, CLI; CLI, server; ...). An earlier version polled
 * GET /api/sweeps/:id every 10 ms: about 0.6 ms of the main thread each, some 5 % of a run on two cores, which no
 * client of the server spends (the page listens to the event stream).
 */
import { mkdirSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { buildApp } from '../../server/app.js';
import { writeOutputs } from '../../server/cli/output-folder.js';
import { sweepOutputFiles } from '../../server/cli/sweep-outputs.js';
import { normalizePlan } from '../../server/sweeps/plan.js';
import { SweepPool } from '../../server/sweeps/sweep-pool.js';
import { clusteredDataset } from './bench-data.js';
import { writeBenchInputs } from './bench-inputs.js';
import { printTable } from './bench-table.js';
import { ratioFigure, type TargetFigure } from './targets.js';

const N = 2e5;
const PLAN = { perCell: [5], placements: 64, sims: 19, seed: 3 };
const RUNS = 5;

function multipart(parts: { name: string; value: string; filename?: string }[]): { body: Buffer; contentType: string } {
  const boundary = `gridshake-bench-${Date.now()}`;
  const chunks = parts.map((part) => {
    const disposition = `form-data; name="${part.name}"${part.filename === undefined ? '' : `; filename="${part.filename}"`}`;
    return `--${boundary}\r\nContent-Disposition: ${disposition}\r\n\r\n${part.value}\r\n`;
  });
  return { body: Buffer.from(`${chunks.join('')}--${boundary}--\r\n`), contentType: `multipart/form-data; boundary=${boundary}` };
}

/**
 * One server sweep, timed from POST /api/sweeps until the sweep's event stream (GET /api/sweeps/:id/events, what the
 * page follows) ends with status `done`: the sweep, its rows and its stability files are stored by then.
 */
async function serverSweep(app: Awaited<ReturnType<typeof buildApp>>, datasetId: string): Promise<number> {
  const start = process.hrtime.bigint();
  const started = await app.inject({ method: 'POST', url: '/api/sweeps', payload: { datasetId, plan: PLAN } });
  if (started.statusCode !== 202) throw new Error(`sweep refused: ${started.body}`);
  const id = started.json().id as string;
  const events = await app.inject({ method: 'GET', url: `/api/sweeps/${id}/events` });
  const seconds = Number(process.hrtime.bigint() - start) / 1e9;
  const status = (await app.inject({ method: 'GET', url: `/api/sweeps/${id}` })).json().status as string;
  if (status !== 'done' || !events.body.includes('event: end')) throw new Error(`server sweep ended ${status}`);
  return seconds;
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

    const dataset = app.gridshake.datasets.load(datasetId);
    const pool = new SweepPool({ threads: 2 });
    const serverSeconds: number[] = [];
    const cliSeconds: number[] = [];
    const engineSeconds: number[] = [];
    const out = join(folder, 'cli-out');
    mkdirSync(out);
    try {
      const cliSweep = async (): Promise<void> => {
        const start = process.hrtime.bigint();
        const result = await pool.runSweep(dataset, normalizePlan(PLAN), { stability: true });
        engineSeconds.push(Number(process.hrtime.bigint() - start) / 1e9);
        writeOutputs(out, sweepOutputFiles(dataset, result));
        cliSeconds.push(Number(process.hrtime.bigint() - start) / 1e9);
      };
      // the two paths take turns, each going first in every other round, so that a machine that speeds up or slows
      // down meanwhile weighs on both alike (measured: the machine's speed drifted by a quarter within a minute)
      for (let run = 0; run < RUNS; run++) {
        if (run % 2 === 0) {
          serverSeconds.push(await serverSweep(app, datasetId));
          await cliSweep();
        } else {
          await cliSweep();
          serverSeconds.push(await serverSweep(app, datasetId));
        }
      }
    } finally {
      await pool.destroy();
    }
    const figure = ratioFigure(Math.min(...serverSeconds), Math.min(...cliSeconds), 1);
    const engineBest = Math.min(...engineSeconds);
    printTable(
      `T5. The same sweep from the server and from the CLI (${N.toExponential(0)} points, per-cell 5, ${PLAN.placements} placements, ${PLAN.sims} sims, 2 threads, ${RUNS} runs each)`,
      ['path', 'first run s', 'best run s', 'ratio server/CLI', 'target', 'status'],
      [
        ['server (upload once, sweep again)', serverSeconds[0], figure.ours, figure.ratio, '<= 1.0', figure.status],
        ['CLI (dataset loaded once; sweep and its files)', cliSeconds[0], figure.reference, 1, '', ''],
        ['  of which the sweep alone', engineSeconds[0], engineBest, figure.ours / engineBest, '', ''],
      ],
    );
    return figure;
  } finally {
    await app.close();
    rmSync(folder, { recursive: true, force: true });
  }
}
