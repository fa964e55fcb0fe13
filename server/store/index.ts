export { GridshakeStore } from './store.js';
export { DatasetStore, type StoredDatasetSummary } from './dataset-store.js';
export { SweepStore, FINISHED_STATUSES, type SweepRecord } from './sweep-store.js';
export { PlacementStore, writeRowsInChunks, ROWS_PER_CHUNK } from './placement-store.js';
export { openDatabase, DATABASE_FILE_NAME, storageError } from './open-database.js';
