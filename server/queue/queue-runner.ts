/**
 * The sweep runner on the Redis queue executor, as `serve --queue` and `sweep --queue` build it (loaded on demand,
 * so that the local pool never loads BullMQ). Keys are prefixed per data folder (serve) or `cli` (sweep).
 */
import { ExecutorSweepRunner } from '../sweeps/sweep-runner.js';
import { QueueExecutor } from './queue-executor.js';
import { prefixForDataDir } from './queue-keys.js';
import type { QueueConnection } from './queue-url.js';

export function queueSweepRunner(connection: QueueConnection, dataDir: string | null, budget?: number, onNotice?: (message: string) => void): ExecutorSweepRunner {
  const prefix = dataDir === null ? 'cli' : prefixForDataDir(dataDir);
  return new ExecutorSweepRunner(new QueueExecutor({ connection, prefix, onNotice }), budget);
}
