/**
 * The start-up check of a data folder's database: its schema must be the one the migrations build (every table,
 * column and index, compared with a fresh in-memory database built from MIGRATIONS, so the expected schema lives in
 * one place) and `PRAGMA quick_check` (SQLite's structural check of every page; sqlite.org/pragma.html#pragma_quick_check)
 * must say `ok`. A dropped table, a missing column or garbage written into the file stops the start with
 * GS_ERR_DATABASE and one line that says what to do, instead of a server that looks healthy and fails later.
 */
import Database from 'better-sqlite3';
import { dirname } from 'node:path';
import { databaseError } from '../errors.js';
import type { GridshakeError } from '../errors.js';
import { MIGRATIONS } from './migrations.js';

/** Most problems quick_check lists in the message. */
const LISTED_PROBLEMS = 3;

type Schema = Map<string, string>;

/** Tables with their columns, and indexes with their table: `table name` -> `col1,col2,...`. */
function schemaOf(db: Database.Database): Schema {
  const schema: Schema = new Map();
  const objects = db
    .prepare(`SELECT type, name, tbl_name FROM sqlite_master WHERE type IN ('table', 'index') AND name NOT LIKE 'sqlite_%' ORDER BY name`)
    .all() as { type: string; name: string; tbl_name: string }[];
  for (const object of objects) {
    if (object.type === 'table') {
      const columns = db.prepare(`SELECT name, type FROM pragma_table_info(?) ORDER BY cid`).all(object.name) as { name: string; type: string }[];
      schema.set(`table ${object.name}`, columns.map((c) => `${c.name} ${c.type}`).join(','));
    } else {
      schema.set(`index ${object.name}`, object.tbl_name);
    }
  }
  return schema;
}

let expectedSchema: Schema | null = null;

/** The schema MIGRATIONS build. */
export function expectedDatabaseSchema(): Schema {
  if (expectedSchema === null) {
    const db = new Database(':memory:');
    try {
      for (const migration of MIGRATIONS) db.exec(migration);
      expectedSchema = schemaOf(db);
    } finally {
      db.close();
    }
  }
  return expectedSchema;
}

/** The one-line refusal for a damaged database file. */
export function damagedDatabaseError(path: string, detail: string): GridshakeError {
  return databaseError(
    `the database ${path} is damaged (${detail}); gridshake did not start and changed nothing. Keep a copy of the ` +
      `data folder ${dirname(path)}, then restore gridshake.sqlite from a backup, or start with an empty folder ` +
      '(--data NEWDIR) and upload the data again',
  );
}

/** Differences between the schema found and the one expected, worded for the message ('' when none). */
function schemaDifference(found: Schema, expected: Schema): string {
  const problems: string[] = [];
  for (const [name, shape] of expected) {
    const actual = found.get(name);
    if (actual === undefined) problems.push(`${name} is missing`);
    else if (actual !== shape) problems.push(`${name} has columns ${actual || 'none'}, expected ${shape}`);
  }
  return problems.slice(0, LISTED_PROBLEMS).join('; ');
}

/** Throws GS_ERR_DATABASE unless the schema is complete and quick_check passes. */
export function checkDatabase(db: Database.Database, path: string): void {
  const difference = schemaDifference(schemaOf(db), expectedDatabaseSchema());
  if (difference !== '') throw damagedDatabaseError(path, `schema: ${difference}`);
  const rows = db.pragma(`quick_check(${LISTED_PROBLEMS})`) as { quick_check: string }[];
  const messages = rows.map((row) => row.quick_check);
  if (messages.length !== 1 || messages[0] !== 'ok') {
    throw damagedDatabaseError(path, `integrity check: ${messages.join('; ').replace(/\s+/g, ' ')}`);
  }
}
