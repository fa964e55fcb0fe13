/**
 * A write that failed because of the disk, not the request: SQLite's SQLITE_FULL, SQLITE_READONLY and SQLITE_IOERR*,
 * and the file system's ENOSPC, EDQUOT and EROFS (an upload streamed to the data folder, a database write in the
 * parser thread). One answer for all of them: 507 GS_ERR_STORAGE saying that nothing was stored.
 */
export interface StorageFailure {
  statusCode: 507;
  code: 'GS_ERR_STORAGE';
  message: string;
}

const FULL = new Set(['SQLITE_FULL', 'ENOSPC', 'EDQUOT']);
const NOT_WRITABLE = new Set(['SQLITE_READONLY', 'EROFS']);

/** The 507 answer for a storage error code, or null when the code is not one. */
export function storageFailure(code: string | undefined): StorageFailure | null {
  if (code === undefined) return null;
  const full = FULL.has(code);
  if (!full && !NOT_WRITABLE.has(code) && !code.startsWith('SQLITE_IOERR')) return null;
  const why = full ? 'the disk holding the data folder is full' : 'the data folder cannot be written';
  const what = code.startsWith('SQLITE_') ? 'the database' : 'the upload';
  return { statusCode: 507, code: 'GS_ERR_STORAGE', message: `${what} could not be written: ${why} (${code}); nothing was stored` };
}
