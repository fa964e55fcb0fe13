/**
 * Engine errors cross the worker boundary as codes, not words (workers/engine-error.ts). Runs a real piscina pool on
 * test/fixtures/workers/throw-engine-error.cjs, which throws the built engine's EngineError (npm run build first).
 */
import { join } from 'node:path';
import { Piscina } from 'piscina';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { GridshakeError } from '../../server/errors.js';
import { toErrorBody } from '../../server/routes/error-handler.js';
import { fromWorkerError } from '../../server/sweeps/sweep-errors.js';
import { ENGINE_ERROR_CODES, EngineError, engineErrorOf } from '../../workers/engine-error.js';

const limits = { bodyLimit: 1 << 20, fileLimit: 1 << 20 };
let pool: Piscina;

beforeAll(() => {
  pool = new Piscina({ filename: join(__dirname, '..', 'fixtures', 'workers', 'throw-engine-error.cjs'), maxThreads: 1 });
});

afterAll(async () => {
  await pool.destroy();
});

async function failureThroughPool(code: string, detail: string): Promise<unknown> {
  return pool.run({ code, detail }).then(
    () => expect.fail('the task should have thrown'),
    (error: unknown) => error,
  );
}

describe('engine errors across the worker boundary', () => {
  it('lose their own code property in the structured clone, keeping the code in the message', async () => {
    const failure = await failureThroughPool('TOO_FEW_KEPT_CELLS', 'cells of 900 m keep 1 cell(s)');
    expect(failure).toBeInstanceOf(Error);
    expect(failure).not.toBeInstanceOf(EngineError);
    // Node's structured clone keeps message and stack, not the error's own properties: code must not ride on them
    expect((failure as { code?: unknown }).code).toBeUndefined();
    expect(engineErrorOf(failure)).toEqual({ code: 'TOO_FEW_KEPT_CELLS', detail: 'cells of 900 m keep 1 cell(s)' });
  });

  it('keep the 400 GS_ERR_PARAMETER whatever the words say', async () => {
    for (const detail of [
      'cells of 600 m keep 1 cell(s) with coverage >= 1; at least 2 are needed: use smaller cells or a lower minCoverage',
      'only one quadrat remains after the coverage filter',
      'zwei Zellen werden mindestens gebraucht',
    ]) {
      const error = fromWorkerError(await failureThroughPool('TOO_FEW_KEPT_CELLS', detail));
      expect(error).toBeInstanceOf(GridshakeError);
      expect(toErrorBody(error, limits)).toEqual({ statusCode: 400, code: 'GS_ERR_PARAMETER', message: detail });
    }
  });

  it('map every engine code to a coded 4xx error', () => {
    for (const code of ENGINE_ERROR_CODES) {
      const error = fromWorkerError(new Error(new EngineError(code, 'words').message));
      expect(error).toBeInstanceOf(GridshakeError);
      expect((error as GridshakeError).statusCode).toBeGreaterThanOrEqual(400);
      expect((error as GridshakeError).statusCode).toBeLessThan(500);
    }
  });

  it('are not recognised by words alone: an uncoded message stays an ordinary failure', async () => {
    const plain = new RangeError('at least 2 are needed: use smaller cells or a lower minCoverage');
    expect(engineErrorOf(plain)).toBeNull();
    expect(fromWorkerError(plain)).toBe(plain);
    // an unknown code in the prefix is not trusted either
    expect(engineErrorOf(new Error('[engine:NOT_A_CODE] words'))).toBeNull();
  });
});
