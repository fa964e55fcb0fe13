/**
 * Opens (and creates) the SQLite database of a data folder: WAL journal, foreign keys on, migrations applied, then
 * the schema and integrity check (check-database.ts). A folder that cannot be created or written gives a coded error,
 * not a stack trace; a damaged file gives GS_ERR_DATABASE.
 */
import Database from 'better-sqlite3';
import { mkdirSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { GridshakeError } from '../errors.js';
import { MIGRATIONS } from './migrations.js';
import { checkDatabase, damagedDatabaseError } from './check-database.js';

export const DATABASE_FILE_NAME = 'gridshake.sqlite';

export function storageError(message: string): GridshakeError {
  return new GridshakeError('GS_ERR_STORAGE', message);
}

/** Open `<dataDir>/gridshake.sqlite`, or an in-memory database when dataDir is ':memory:'. */
export function openDatabase(dataDir: string): { db: Database.Database; path: string } {
  let path = ':memory:';
  if (dataDir !== ':memory:') {
    const folder = resolve(dataDir);
    try {
      mkdirSync(folder, { recursive: true });
    } catch (error) {
      throw storageError(`cannot create the data folder ${folder}: ${(error as Error).message}`);
    }
    path = join(folder, DATABASE_FILE_NAME);
  }
  let db: Database.Database;
  try {
    db = new Database(path);
    db.pragma('journal_mode = WAL');
    db.pragma('synchronous = NORMAL');
    db.pragma('foreign_keys = ON');
    db.pragma('busy_timeout = 5000');
    applyMigrations(db);
    if (path !== ':memory:') checkDatabase(db, path);
  } catch (error) {
    if (db! !== undefined && db.open) db.close();
    if (error instanceof GridshakeError) throw error;
    const code = (error as { code?: string }).code ?? '';
    if (code === 'SQLITE_CORRUPT' || code === 'SQLITE_NOTADB' || code.startsWith('SQLITE_CORRUPT')) {
      throw damagedDatabaseError(path, `${(error as Error).message} (${code})`);
    }
    throw storageError(`cannot open the database ${path}: ${(error as Error).message}`);
  }
  return { db, path };
}

function applyMigrations(db: Database.Database): void {
  const current = Number(db.pragma('user_version', { simple: true }));
  if (current > MIGRATIONS.length) {
    throw storageError(
      `the database was written by a newer gridshake (schema ${current}, this version knows ${MIGRATIONS.length})`,
    );
  }
  for (let version = current; version < MIGRATIONS.length; version += 1) {
    const migrate = db.transaction(() => {
      db.exec(MIGRATIONS[version] as string);
      db.pragma(`user_version = ${version + 1}`);
    });
    migrate();
  }
}
