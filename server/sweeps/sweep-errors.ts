/** How a failed or cancelled sweep is reported to callers of SweepPool.runSweep. */
import { parameterError } from '../errors.js';
import { PARAMETER_ERROR_PREFIX } from '../../workers/sweep/evaluate-chunk.js';

/** The error a cancelled sweep rejects with: name 'AbortError', like the DOM and piscina abort errors. */
export function sweepCancelledError(): Error {
  const error = new Error('the sweep was cancelled');
  error.name = 'AbortError';
  return error;
}

/** True for the error of a cancelled sweep (ours or piscina's). */
export function isAbortError(error: unknown): boolean {
  return error instanceof Error && error.name === 'AbortError';
}

/**
 * A worker's error as the sweep's error: messages the engine marks as bad parameters become GS_ERR_PARAMETER
 * errors; a worker thread that died (its exit, or the heap limit) is said in words with what to try; any other
 * error keeps its message.
 */
export function fromWorkerError(error: unknown): Error {
  const message = error instanceof Error ? error.message : String(error);
  if (message.startsWith(PARAMETER_ERROR_PREFIX)) return parameterError(message.slice(PARAMETER_ERROR_PREFIX.length));
  const code = error instanceof Error ? (error as NodeJS.ErrnoException).code : undefined;
  if (code === 'ERR_WORKER_OUT_OF_MEMORY' || /memory limit|out of memory/i.test(message)) {
    return new Error(`a worker thread ran out of memory (${message}); use larger cells, fewer simulations or fewer points`);
  }
  if (/^worker exited with code/i.test(message)) {
    return new Error(`a worker thread stopped unexpectedly (${message}); the sweep was abandoned, other sweeps are unaffected`);
  }
  return error instanceof Error ? error : new Error(message);
}
