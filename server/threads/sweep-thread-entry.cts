/**
 * The file the local sweep pool's piscina loads for each worker thread: it lowers the thread's priority by
 * SWEEP_THREAD_NICE (thread-priority.cts), so that the server's request thread is scheduled first when both want the
 * CPU, then hands every task to the engine's entry (workers/pool-entry.cts). On an otherwise idle machine nothing
 * changes: the sweep threads take every core the request thread leaves.
 */
import { lowerThreadPriority } from './thread-priority.cjs';

/** Nice increment of a sweep thread: the request thread then gets about three times its share (weights 1024 : 335). */
const SWEEP_THREAD_NICE = 5;

lowerThreadPriority(SWEEP_THREAD_NICE);

import poolEntry = require('../../workers/pool-entry.cjs');

export = poolEntry;
