/**
 * Names in Redis. BullMQ keeps its queue under `gridshake:tasks:*` (one queue that every worker serves, whatever
 * server sent the task); gridshake keeps a server's own keys under `gridshake:<prefix>:*`, the prefix naming the
 * server or its data folder, so that several servers share one Redis without mixing datasets or results.
 */
import { createHash } from 'node:crypto';
import { resolve } from 'node:path';

/** BullMQ's key prefix and queue name. */
export const BULL_PREFIX = 'gridshake';
export const TASK_QUEUE = 'tasks';

/** A short prefix for a data folder (a hash of its absolute path), or `cli` for command-line sweeps. */
export function prefixForDataDir(dataDir: string): string {
  if (dataDir === ':memory:') return `memory-${process.pid}-${Date.now().toString(36)}`;
  return `data-${createHash('sha256').update(resolve(dataDir)).digest('hex').slice(0, 12)}`;
}

/** Where a dataset's packed content lives (queue-dataset.ts), by content hash. */
export function datasetKey(prefix: string, hash: string): string {
  return `${BULL_PREFIX}:${prefix}:dataset:${hash}`;
}

/** Where a task's result waits for the server, until read once (or its expiry). */
export function resultKey(prefix: string, jobId: string): string {
  return `${BULL_PREFIX}:${prefix}:result:${jobId}`;
}
