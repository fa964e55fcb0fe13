/**
 * The bound on worker threads (`gridshake serve --threads N`, AppOptions.threads): at least 1, at most
 * MAX_THREADS_PER_CORE per core. Each thread holds its own heap; 100,000 threads took 2.9 GB and a load of 36
 * without computing any faster than one per core.
 */
import { availableParallelism } from 'node:os';
import { parameterError } from '../errors.js';
import { MAX_THREADS_PER_CORE } from '../limits.js';

export function maxThreadCount(cores = availableParallelism()): number {
  return MAX_THREADS_PER_CORE * Math.max(1, cores);
}

/** Throws GS_ERR_PARAMETER (one line) unless `threads` is a whole number from 1 to maxThreadCount(). */
export function checkThreadCount(threads: number, cores = availableParallelism()): number {
  const most = maxThreadCount(cores);
  if (!Number.isInteger(threads) || threads < 1 || threads > most) {
    throw parameterError(
      `--threads must be a whole number from 1 to ${most} (${MAX_THREADS_PER_CORE} per core on this computer's ${cores} cores), got ${threads}`,
    );
  }
  return threads;
}
