/**
 * A write into the data folder that failed for lack of disk space or write access (SQLite result codes SQLITE_FULL,
 * SQLITE_READONLY, SQLITE_IOERR*, https://www.sqlite.org/rescode.html; file-system errors ENOSPC, EDQUOT, EROFS while
 * an upload is saved there) as the coded GS_ERR_STORAGE error, or null for any other failure. Used by the HTTP error handler and by the upload parser's worker thread, whose errors cross
 * to the main thread by structured clone, which drops the SqliteError's `code`.
 */
import { GridshakeError } from '../errors.js';

export function storageWriteError(error: unknown): GridshakeError | null {
  const code = (error as { code?: unknown } | null)?.code;
  if (typeof code !== 'string') return null;
  const full = code === 'SQLITE_FULL' || code === 'ENOSPC' || code === 'EDQUOT';
  if (!full && code !== 'SQLITE_READONLY' && code !== 'EROFS' && !code.startsWith('SQLITE_IOERR')) return null;
  const why = full ? 'the disk holding the data folder is full' : 'the data folder cannot be written';
  const what = code.startsWith('SQLITE_') ? 'the database could not be written' : 'the upload could not be saved';
  return new GridshakeError('GS_ERR_STORAGE', `${what}: ${why} (${code}); nothing was stored`);
}
