/** How worker failures are worded for the analyst (the stress suite provokes the real ones: test/stress/worker-faults). */
import { describe, expect, it } from 'vitest';
import { GridshakeError } from '../../server/errors.js';
import { fromWorkerError } from '../../server/sweeps/sweep-errors.js';
import { EngineError } from '../../workers/engine-error.js';

describe('fromWorkerError', () => {
  it('turns an engine parameter message into GS_ERR_PARAMETER', () => {
    // as it arrives from a worker thread: a plain Error with the engine error's message (structured clone)
    const error = fromWorkerError(new Error(new EngineError('TOO_FEW_KEPT_CELLS', 'cells of 5 m keep 1 cell(s)').message));
    expect(error).toBeInstanceOf(GridshakeError);
    expect((error as GridshakeError).code).toBe('GS_ERR_PARAMETER');
    expect(error.message).toBe('cells of 5 m keep 1 cell(s)');
  });

  it('says in words that a worker ran out of memory, keeping the runtime message (Node ERR_WORKER_OUT_OF_MEMORY)', () => {
    const raw = Object.assign(new Error('Worker terminated due to reaching memory limit: JS heap out of memory'), { code: 'ERR_WORKER_OUT_OF_MEMORY' });
    expect(fromWorkerError(raw).message).toBe(
      'a worker thread ran out of memory (Worker terminated due to reaching memory limit: JS heap out of memory); ' +
        'use larger cells, fewer simulations or fewer points',
    );
  });

  it('says that a worker stopped, keeping its exit code (piscina "worker exited with code")', () => {
    expect(fromWorkerError(new Error('worker exited with code: 3')).message).toBe(
      'a worker thread stopped unexpectedly (worker exited with code: 3); the sweep was abandoned, other sweeps are unaffected',
    );
  });

  it('keeps any other error as it is', () => {
    const other = new Error('coverage grid too large');
    expect(fromWorkerError(other)).toBe(other);
  });
});
