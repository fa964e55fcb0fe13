/**
 * The engine's refusals that are the caller's mistake (not a crash), as typed codes that survive the worker boundary.
 *
 * A worker thread's error reaches the main thread by structured clone, which keeps an Error's message (and name
 * only for the built-in error types) but drops its own properties such as `code` (Node's v8 serializer; checked
 * through the real pool in test/sweeps/engine-errors.test.ts); the Redis queue passes only the message text. So the
 * code travels at the front of the message, "[engine:CODE] words", and engineErrorOf reads it back from any Error
 * or text: the words may change freely, the code decides how the caller reports it.
 */

/** The engine's error codes. */
export const ENGINE_ERROR_CODES = ['TOO_FEW_KEPT_CELLS'] as const;

/** TOO_FEW_KEPT_CELLS: a placement keeps fewer than 2 cells, so no dispersion statistic exists (df = m - 1 < 1). */
export type EngineErrorCode = (typeof ENGINE_ERROR_CODES)[number];

const WIRE_PATTERN = /^\[engine:([A-Z_]+)\] /;

function isEngineErrorCode(code: string): code is EngineErrorCode {
  return (ENGINE_ERROR_CODES as readonly string[]).includes(code);
}

/** A coded refusal of the engine; a RangeError, since each is a value out of the range the engine can evaluate. */
export class EngineError extends RangeError {
  readonly code: EngineErrorCode;
  /** the words without the code */
  readonly detail: string;

  constructor(code: EngineErrorCode, detail: string) {
    super(`[engine:${code}] ${detail}`);
    this.name = 'EngineError';
    this.code = code;
    this.detail = detail;
  }
}

/** The code and words of an engine error, read from its message (after any structured clone), or null. */
export function engineErrorOf(error: unknown): { code: EngineErrorCode; detail: string } | null {
  const message = error instanceof Error ? error.message : typeof error === 'string' ? error : '';
  const match = WIRE_PATTERN.exec(message);
  if (match === null || !isEngineErrorCode(match[1]!)) return null;
  return { code: match[1], detail: message.slice(match[0].length) };
}
