/**
 * Helpers of the queue tests: `gridshake worker` processes (the built CLI, as a user runs it), the queue runner,
 * and the comparison of two sweep results as the files a user keeps (placements.csv, summary.json without its
 * timings and versions).
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { join } from 'node:path';
import type { PlacementRow, SweepSummary } from '../../shared/contracts.js';
import { QueueExecutor } from '../../server/queue/queue-executor.js';
import { parseQueueUrl } from '../../server/queue/queue-url.js';
import { PACKAGE_ROOT } from '../../server/services/project-paths.js';
import { placementsToCsv } from '../../server/sweeps/placements-csv.js';
import { ExecutorSweepRunner } from '../../server/sweeps/sweep-runner.js';
import { stopProcess } from '../bench/redis-server.js';

export const CLI = join(PACKAGE_ROOT, 'bin', 'gridshake.js');

export interface WorkerProcess {
  child: ChildProcess;
  output(): string;
  stop(signal?: NodeJS.Signals): Promise<void>;
}

/** Starts `gridshake worker --queue URL --threads N` and waits until it says it is connected. */
export async function startWorker(url: string, threads = 1, env: Record<string, string> = {}): Promise<WorkerProcess> {
  const child = spawn(process.execPath, [CLI, 'worker', '--queue', url, '--threads', String(threads)], {
    env: { ...process.env, ...env },
    stdio: ['ignore', 'ignore', 'pipe'],
  });
  let text = '';
  child.stderr?.on('data', (data: Buffer) => {
    text += data.toString('utf8');
  });
  await new Promise<void>((resolve, reject) => {
    const timer = setTimeout(() => reject(new Error(`worker did not connect within 20 s: ${text}`)), 20_000);
    const check = (): void => {
      if (/connected to /.test(text)) {
        clearTimeout(timer);
        resolve();
      }
    };
    child.stderr?.on('data', check);
    child.once('exit', (code) => {
      clearTimeout(timer);
      reject(new Error(`worker exited with code ${code}: ${text}`));
    });
  });
  return { child, output: () => text, stop: (signal = 'SIGTERM') => stopProcess(child, signal) };
}

/** A queue runner on `url`; `env` stands in for the environment (e.g. GRIDSHAKE_QUEUE_CA). */
export function queueRunner(url: string, prefix: string, options: { lostAfterMs?: number; notices?: string[]; env?: Record<string, string> } = {}): ExecutorSweepRunner {
  const executor = new QueueExecutor({
    connection: parseQueueUrl(url, options.env ?? {}),
    prefix,
    lostAfterMs: options.lostAfterMs,
    onNotice: (message) => options.notices?.push(message),
  });
  return new ExecutorSweepRunner(executor);
}

/** What a user keeps of a sweep, minus the fields allowed to differ (summary.json timings and versions). */
export function keptFiles(result: { rows: PlacementRow[]; summary: SweepSummary }): { csv: string; summary: string } {
  const { timings: _timings, versions: _versions, ...numbers } = result.summary;
  return { csv: placementsToCsv(result.rows), summary: JSON.stringify(numbers) };
}
