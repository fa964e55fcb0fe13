/**
 * Lower the scheduling priority of the calling thread (Linux): the server's own worker threads (upload parser,
 * sweep pool) then give way to the thread that answers requests, so that reads and event streams stay prompt while a
 * large upload is parsed or a sweep computes on a busy machine. Linux keeps a nice value per thread:
 * setpriority(PRIO_PROCESS, tid, nice) with the thread's id from /proc/thread-self (man 2 setpriority, "bugs": the
 * nice value is a per-thread attribute). A thread only ever lowers its own priority (no privilege needed); elsewhere,
 * or when /proc is missing, nothing changes and the work runs at the process's priority.
 * CommonJS on purpose: the pool entry files (themselves CommonJS, see workers/pool-entry.cts) require it.
 */
import { readlinkSync } from 'node:fs';
import { getPriority, setPriority } from 'node:os';

/** Raise the calling thread's nice value by `increment` (at most to 19); returns the new value or null. */
export function lowerThreadPriority(increment: number): number | null {
  if (process.platform !== 'linux') return null;
  try {
    // "<pid>/task/<tid>"
    const tid = Number(readlinkSync('/proc/thread-self').split('/').pop());
    if (!Number.isInteger(tid) || tid <= 0) return null;
    const nice = Math.min(19, getPriority(tid) + increment);
    setPriority(tid, nice);
    return nice;
  } catch {
    return null;
  }
}
