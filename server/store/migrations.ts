/**
 * Schema migrations of the store, applied in order; PRAGMA user_version holds how many have run.
 * Append new migrations at the end; never edit one that has shipped.
 */
export const MIGRATIONS: readonly string[] = [
  `
  CREATE TABLE datasets (
    id TEXT PRIMARY KEY,
    name TEXT NOT NULL,
    created_at TEXT NOT NULL,
    -- every plain field of the Dataset (crs, projection, study area, zones, origin, warnings, ...)
    meta_json TEXT NOT NULL,
    summary_json TEXT NOT NULL,
    -- Float64Array x,y interleaved, all points
    xy BLOB NOT NULL,
    -- Uint32Array indices of the points inside the valid region
    inside BLOB NOT NULL,
    ids_json TEXT NOT NULL,
    -- valid region rings (see blob-codec encodeRings)
    region_rings BLOB NOT NULL,
    sample_id TEXT
  );
  CREATE TABLE sweeps (
    id TEXT PRIMARY KEY,
    dataset_id TEXT NOT NULL REFERENCES datasets(id) ON DELETE CASCADE,
    plan_json TEXT NOT NULL,
    estimate_json TEXT NOT NULL,
    status TEXT NOT NULL,
    progress_json TEXT NOT NULL,
    summary_json TEXT,
    error TEXT,
    rerun_of TEXT,
    created_at TEXT NOT NULL,
    started_at TEXT,
    finished_at TEXT
  );
  CREATE INDEX sweeps_by_dataset ON sweeps(dataset_id);
  CREATE TABLE placement_chunks (
    sweep_id TEXT NOT NULL REFERENCES sweeps(id) ON DELETE CASCADE,
    chunk INTEGER NOT NULL,
    rows_json TEXT NOT NULL,
    PRIMARY KEY (sweep_id, chunk)
  );
  `,
  // 2: placement rows as v8-serialised BLOBs (exact doubles, NaN and infinities, fast to read); older chunks
  // written as JSON text stay readable
  `ALTER TABLE placement_chunks RENAME COLUMN rows_json TO rows_data;`,
  // 3: the stability surfaces of a sweep (GeoTIFF bytes per shape and cell size, under their file names)
  `
  CREATE TABLE stability_files (
    sweep_id TEXT NOT NULL REFERENCES sweeps(id) ON DELETE CASCADE,
    name TEXT NOT NULL,
    content BLOB NOT NULL,
    PRIMARY KEY (sweep_id, name)
  );
  `,
  // 4: the population at risk of a dataset (issue 15), the engine's baseline v8-serialised (typed arrays kept exact);
  // NULL when expected counts follow area
  `ALTER TABLE datasets ADD COLUMN baseline BLOB;`,
  // 5: where a sweep's tasks ran ('local' or 'queue', shared/contracts.ts ExecutorChoice), so that a rerun runs there
  // too; NULL for sweeps stored before it was recorded (they ran on the server's default)
  `ALTER TABLE sweeps ADD COLUMN executor TEXT;`,
  // 6: no new column: an empty datasets.inside BLOB now means that every point is inside (server/inputs/inside-points.ts),
  // which an older gridshake would read as "no point inside"; the version step makes it refuse this store instead
  `UPDATE datasets SET inside = inside WHERE 0;`,
];
