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
 * errors; any other keeps its message.
 */
export function fromWorkerError(error: unknown): Error {
  const message = error instanceof Error ? error.message : String(error);
  if (message.startsWith(PARAMETER_ERROR_PREFIX)) return parameterError(message.slice(PARAMETER_ERROR_PREFIX.length));
  return error instanceof Error ? error : new Error(message);
}
