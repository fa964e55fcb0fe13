/**
 * The gridshake store: one SQLite database in the data folder, with datasets, sweeps and placement rows.
 */
import type Database from 'better-sqlite3';
import { DatasetStore } from './dataset-store.js';
import { openDatabase } from './open-database.js';
import { PlacementStore } from './placement-store.js';
import { StabilityStore } from './stability-store.js';
import { SweepStore } from './sweep-store.js';

export class GridshakeStore {
  readonly datasets: DatasetStore;
  readonly sweeps: SweepStore;
  readonly placements: PlacementStore;
  readonly stability: StabilityStore;

  private constructor(
    private readonly db: Database.Database,
    readonly path: string,
  ) {
    this.datasets = new DatasetStore(db);
    this.sweeps = new SweepStore(db);
    this.placements = new PlacementStore(db);
    this.stability = new StabilityStore(db);
  }

  /** Open the store of a data folder (':memory:' for a throw-away one). */
  static open(dataDir: string): GridshakeStore {
    const { db, path } = openDatabase(dataDir);
    return new GridshakeStore(db, path);
  }

  /** Copy the write-ahead log into the main database file (e.g. before a backup or a checksum). */
  checkpoint(): void {
    this.db.pragma('wal_checkpoint(TRUNCATE)');
  }

  close(): void {
    if (this.db.open) this.db.close();
  }
}
