/**
 * The stability surfaces of done sweeps: GeoTIFF bytes and the areas' GeoJSON (every outline; summary.json's list is
 * capped) per (shape, cell size), under their file names (stability-<side>m.tif, excess-areas-<side>m.geojson,
 * server/stability/stability-files.ts). Rows go with their sweep (ON DELETE CASCADE).
 */
import type Database from 'better-sqlite3';

export class StabilityStore {
  constructor(private readonly db: Database.Database) {}

  write(sweepId: string, name: string, content: Uint8Array): void {
    this.db.prepare('INSERT OR REPLACE INTO stability_files (sweep_id, name, content) VALUES (?, ?, ?)').run(sweepId, name, Buffer.from(content.buffer, content.byteOffset, content.byteLength));
  }

  /** The stored bytes, or undefined. */
  read(sweepId: string, name: string): Buffer | undefined {
    const row = this.db.prepare('SELECT content FROM stability_files WHERE sweep_id = ? AND name = ?').get(sweepId, name) as { content: Buffer } | undefined;
    return row?.content;
  }

  clear(sweepId: string): void {
    this.db.prepare('DELETE FROM stability_files WHERE sweep_id = ?').run(sweepId);
  }
}
