/**
 * Coded errors of gridshake. Every error a user can cause carries a GS_ERR_ code and the HTTP status the registry
 * (shared/error-codes.ts) gives that code;
 * the HTTP layer sends `{ statusCode, code, message }`, the CLI prints the message and exits non-zero.
 * Messages say what is wrong and where (file, line, feature), with no trailing period.
 */
import { statusOf, type ErrorCode } from '../shared/error-codes.js';
import { referencedFields, renderMessage, type FieldName } from './messages/field-names.js';

/** Longest message kept whole; longer ones (e.g. echoing a 20 MB field) keep their start and end. */
export const MAX_ERROR_MESSAGE_LENGTH = 2000;

function shortenMessage(message: string): string {
  if (message.length <= MAX_ERROR_MESSAGE_LENGTH) return message;
  const omitted = message.length - 1800;
  return `${message.slice(0, 1400)} ... (${omitted} characters left out) ... ${message.slice(-400)}`;
}

export class GridshakeError extends Error {
  readonly code: ErrorCode;
  /** the code's status in shared/error-codes.ts */
  readonly statusCode: number;
  /** the message in the command line's words (flags such as --x), see server/messages/field-names.ts */
  readonly cliMessage: string;
  /** the inputs the message names, e.g. ['x'] */
  readonly fields: FieldName[];

  /** `message` may carry field references (fieldRef); `.message` names them as the page does. */
  constructor(code: ErrorCode, message: string) {
    super(shortenMessage(renderMessage(message, 'page')));
    this.name = 'GridshakeError';
    this.code = code;
    this.statusCode = statusOf(code);
    this.cliMessage = shortenMessage(renderMessage(message, 'cli'));
    this.fields = referencedFields(message);
  }
}

/** The factory of one code's errors: `message` in, a GridshakeError with that code out (its meaning: the registry). */
function codedError(code: ErrorCode): (message: string) => GridshakeError {
  return (message) => new GridshakeError(code, message);
}

/** Bad input data: unreadable or malformed files, bad coordinates, bad polygons (400). */
export const inputError = codedError('GS_ERR_INPUT');

/** A population-at-risk baseline or control file that cannot serve (400); the message names file and feature. */
export const baselineError = codedError('GS_ERR_BASELINE');

/** Bad parameters of a count or a plan: cell sizes, offsets, angles, alpha, placements, sims (400). */
export const parameterError = codedError('GS_ERR_PARAMETER');

/**
 * A plan whose Monte Carlo test could never reject: 1/(R+1) > alpha (shared/monte-carlo-rule.ts) (400; the CLI
 * exits 2, as for a bad command line, since the fix is a different --sims).
 */
export const tooFewSimsError = codedError('GS_ERR_TOO_FEW_SIMS');

/** The Redis queue did not answer within its timeout; the message names the URL and what to check (503). */
export const queueUnreachableError = codedError('GS_ERR_QUEUE_UNREACHABLE');

/** CLI exit codes of coded errors other than 1 (the default for a GridshakeError). */
export const CLI_EXIT_CODES: Readonly<Partial<Record<ErrorCode, number>>> = Object.freeze({ GS_ERR_TOO_FEW_SIMS: 2 });

/** A plan whose estimated work is above the budget (400). */
export const budgetError = codedError('GS_ERR_BUDGET');

/** An unknown dataset or sweep id (404). */
export const notFoundError = codedError('GS_ERR_NOT_FOUND');

/** A request that is too large: body size or point count (413). */
export const tooLargeError = codedError('GS_ERR_TOO_LARGE');

/** A request in the wrong state: e.g. cancelling a finished sweep (409). */
export const conflictError = codedError('GS_ERR_CONFLICT');

/** A grid export with more cells than the export may hold (422): the message says how to get it. */
export const gridTooLargeError = codedError('GS_ERR_GRID_TOO_LARGE');

/** A grid GeoPackage asked for while another is being written (429). */
export const exportBusyError = codedError('GS_ERR_EXPORT_BUSY');

/**
 * Rows of a CSV without usable coordinates (blank, "n/a", not a number): every such row is listed by line, with a
 * count, and the message says how to skip them (400).
 */
export const badRowsError = codedError('GS_ERR_BAD_ROWS');

export function isGridshakeError(value: unknown): value is GridshakeError {
  return value instanceof GridshakeError;
}

/** A full sweep queue: too many sweeps are waiting to run (429). */
export const queueFullError = codedError('GS_ERR_QUEUE_FULL');

/** Too many event streams open on this server (429). */
export const tooManyStreamsError = codedError('GS_ERR_TOO_MANY_STREAMS');

/** Too many uploads in progress at once (429). */
export const tooManyUploadsError = codedError('GS_ERR_TOO_MANY_UPLOADS');

/** A request whose headers or body did not arrive in time (408). */
export const timeoutError = codedError('GS_ERR_TIMEOUT');

/** A database that fails its schema or integrity check at start (500; the server refuses to start). */
export const databaseError = codedError('GS_ERR_DATABASE');
