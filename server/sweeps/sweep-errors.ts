/** How a failed or cancelled sweep is reported to callers of SweepPool.runSweep. */
import { engineErrorOf, type EngineErrorCode } from '../../workers/engine-error.js';
import { parameterError, type GridshakeError } from '../errors.js';

/** How each engine error code is reported: every code of workers/engine-error.ts has its coded error here. */
const ENGINE_ERRORS: Record<EngineErrorCode, (message: string) => GridshakeError> = {
  TOO_FEW_KEPT_CELLS: parameterError,
};

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
 * A worker's error as the sweep's error: the engine's coded errors (workers/engine-error.ts, read by code, never by
 * their words) become the coded errors of ENGINE_ERRORS, e.g. GS_ERR_PARAMETER (400); a worker thread that died (its exit, or the heap limit) is said in words with what to try; any other
 * error keeps its message.
 */
export function fromWorkerError(error: unknown): Error {
  const message = error instanceof Error ? error.message : String(error);
  const engine = engineErrorOf(error);
  if (engine !== null) return ENGINE_ERRORS[engine.code](engine.detail);
  const code = error instanceof Error ? (error as NodeJS.ErrnoException).code : undefined;
  if (code === 'ERR_WORKER_OUT_OF_MEMORY' || /memory limit|out of memory/i.test(message)) {
    return new Error(`a worker thread ran out of memory (${message}); use larger cells, fewer simulations or fewer points`);
  }
  if (/^worker exited with code/i.test(message)) {
    return new Error(`a worker thread stopped unexpectedly (${message}); the sweep was abandoned, other sweeps are unaffected`);
  }
  return error instanceof Error ? error : new Error(message);
}
