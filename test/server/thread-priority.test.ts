/**
 * The server's worker threads run below the request thread's priority (server/threads/thread-priority.cts): a
 * thread that lowers its priority changes only its own nice value, never the process's (Linux keeps a nice value per
 * thread; man 2 setpriority). Runs the compiled entry in a real worker thread (npm run build first).
 */
import { readlinkSync } from 'node:fs';
import { getPriority } from 'node:os';
import { join } from 'node:path';
import { Worker } from 'node:worker_threads';
import { describe, expect, it } from 'vitest';
import { PACKAGE_ROOT } from '../../server/services/project-paths.js';

const PRIORITY_MODULE = join(PACKAGE_ROOT, 'dist', 'server', 'threads', 'thread-priority.cjs');

function threadNice(): number {
  return getPriority(Number(readlinkSync('/proc/thread-self').split('/').pop()));
}

describe.runIf(process.platform === 'linux')('lowerThreadPriority', () => {
  it('raises the nice value of the calling worker thread only', async () => {
    const before = threadNice();
    const script = `
      const { parentPort } = require('node:worker_threads');
      const { readlinkSync } = require('node:fs');
      const { getPriority } = require('node:os');
      const { lowerThreadPriority } = require(${JSON.stringify(PRIORITY_MODULE)});
      const tid = Number(readlinkSync('/proc/thread-self').split('/').pop());
      const start = getPriority(tid);
      const reported = lowerThreadPriority(5);
      parentPort.postMessage({ start, reported, after: getPriority(tid) });`;
    const result = await new Promise<{ start: number; reported: number; after: number }>((resolve, reject) => {
      const worker = new Worker(script, { eval: true });
      worker.once('message', resolve);
      worker.once('error', reject);
    });
    expect(result.reported).toBe(Math.min(19, result.start + 5));
    expect(result.after).toBe(result.reported);
    // the main thread keeps its value (getPriority(pid) reads the main thread's)
    expect(threadNice()).toBe(before);
    expect(getPriority(process.pid)).toBe(before);
  });
});
