import Database from 'better-sqlite3';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { GridshakeError } from '../../server/errors.js';
import { toErrorBody } from '../../server/routes/error-handler.js';
import { lockDataFolder } from '../../server/store/data-folder-lock.js';

// Regression tests for storage bugs found by the fault tests (test/stress/data-folder-faults.test.ts), named after them.
const limits = { bodyLimit: 1 << 20, fileLimit: 1 << 20 };

describe('storage regressions', () => {
  it('a data folder under a file crashed serve with a raw ENOTDIR stack trace', () => {
    const folder = mkdtempSync(join(tmpdir(), 'gridshake-lock-'));
    try {
      writeFileSync(join(folder, 'file'), 'x');
      let error: unknown = null;
      try {
        lockDataFolder(join(folder, 'file', 'data'));
      } catch (caught) {
        error = caught;
      }
      expect(error).toBeInstanceOf(GridshakeError);
      expect((error as GridshakeError).code).toBe('GS_ERR_STORAGE');
      expect((error as GridshakeError).message).toMatch(/^cannot create the data folder .*file\/data: ENOTDIR/);
    } finally {
      rmSync(folder, { recursive: true, force: true });
    }
  });

  it('a full disk during an upload gave 500 GS_ERR_INTERNAL with no hint', () => {
    const full = new Database.SqliteError('database or disk is full', 'SQLITE_FULL');
    expect(toErrorBody(full, limits)).toEqual({
      statusCode: 507,
      code: 'GS_ERR_STORAGE',
      message: 'the database could not be written: the disk holding the data folder is full (SQLITE_FULL); nothing was stored',
    });
    const readOnly = new Database.SqliteError('attempt to write a readonly database', 'SQLITE_READONLY');
    expect(toErrorBody(readOnly, limits).statusCode).toBe(507);
    expect(toErrorBody(new Error('something else'), limits).code).toBe('GS_ERR_INTERNAL');
  });
});

describe('storage errors that cross a worker thread or come from the file system', () => {
  it('an upload on a full disk gave 500 GS_ERR_INTERNAL: ENOSPC while saving the upload is GS_ERR_STORAGE', () => {
    const enospc = Object.assign(new Error('ENOSPC: no space left on device, write'), { code: 'ENOSPC' });
    expect(toErrorBody(enospc, limits)).toEqual({
      statusCode: 507,
      code: 'GS_ERR_STORAGE',
      message: 'the upload could not be saved: the disk holding the data folder is full (ENOSPC); nothing was stored',
    });
    expect(toErrorBody(Object.assign(new Error('EACCES'), { code: 'EACCES' }), limits).code).toBe('GS_ERR_INTERNAL');
  });
});
