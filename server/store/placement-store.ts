/**
 * Per-placement rows of a sweep, stored in numbered chunks of JSON (NaN and infinities kept, see blob-codec).
 * Chunks are written one transaction each so that a large sweep never holds the event loop for long; the sweep's
 * status turns `done` only after the last chunk, and a sweep that never got there has its chunks removed.
 */
import type Database from 'better-sqlite3';
import type { PlacementRow } from '../contracts.js';
import { fromStoredJson, toStoredJson } from './blob-codec.js';

export const ROWS_PER_CHUNK = 2000;

export class PlacementStore {
  constructor(private readonly db: Database.Database) {}

  writeChunk(sweepId: string, chunk: number, rows: readonly PlacementRow[]): void {
    this.db
      .prepare('INSERT OR REPLACE INTO placement_chunks (sweep_id, chunk, rows_json) VALUES (?, ?, ?)')
      .run(sweepId, chunk, toStoredJson(rows));
  }

  /** Every row of a sweep in the order it was written. */
  read(sweepId: string): PlacementRow[] {
    const chunks = this.db
      .prepare('SELECT rows_json FROM placement_chunks WHERE sweep_id = ? ORDER BY chunk')
      .all(sweepId) as { rows_json: string }[];
    return chunks.flatMap((chunk) => fromStoredJson<PlacementRow[]>(chunk.rows_json));
  }

  /** The rows of one chunk (empty when there is no such chunk). */
  readChunk(sweepId: string, chunk: number): PlacementRow[] {
    const row = this.db
      .prepare('SELECT rows_json FROM placement_chunks WHERE sweep_id = ? AND chunk = ?')
      .get(sweepId, chunk) as { rows_json: string } | undefined;
    return row === undefined ? [] : fromStoredJson<PlacementRow[]>(row.rows_json);
  }

  /** How many chunks a sweep has stored. */
  chunkCount(sweepId: string): number {
    const row = this.db.prepare('SELECT COUNT(*) AS n FROM placement_chunks WHERE sweep_id = ?').get(sweepId) as {
      n: number;
    };
    return row.n;
  }

  clear(sweepId: string): void {
    this.db.prepare('DELETE FROM placement_chunks WHERE sweep_id = ?').run(sweepId);
  }
}

/** Write rows in chunks, yielding to the event loop between chunks. */
export async function writeRowsInChunks(
  store: PlacementStore,
  sweepId: string,
  rows: readonly PlacementRow[],
): Promise<void> {
  store.clear(sweepId);
  for (let start = 0, chunk = 0; start < rows.length; start += ROWS_PER_CHUNK, chunk += 1) {
    store.writeChunk(sweepId, chunk, rows.slice(start, start + ROWS_PER_CHUNK));
    await new Promise<void>((resolve) => setImmediate(resolve));
  }
}
