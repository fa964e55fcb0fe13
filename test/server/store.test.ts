import { describe, it, expect, afterEach } from 'vitest';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import Database from 'better-sqlite3';
import { GridshakeStore } from '../../server/store/store.js';
import { MIGRATIONS } from '../../server/store/migrations.js';
import { fromStoredJson, toStoredJson, decodeRings, encodeRings } from '../../server/store/blob-codec.js';
import type { Dataset, DatasetSummary, PlacementRow } from '../../shared/contracts.js';
import { isEveryPointInside, withEveryPointInside } from '../../server/inputs/inside-points.js';

const folders: string[] = [];
function tempFolder(): string {
  const folder = mkdtempSync(join(tmpdir(), 'gridshake-store-'));
  folders.push(folder);
  return folder;
}
afterEach(() => {
  for (const folder of folders.splice(0)) rmSync(folder, { recursive: true, force: true });
});

/** A small dataset built by hand: a 100 m square with a 20 m square hole, three points (one in the hole). */
function squareDataset(): { dataset: Dataset; summary: DatasetSummary } {
  const shell = new Float64Array([0, 0, 100, 0, 100, 100, 0, 100]);
  const hole = new Float64Array([40, 40, 40, 60, 60, 60, 60, 40]);
  const dataset: Dataset = {
    name: 'square',
    crs: 'planar',
    projection: { kind: 'planar' },
    xy: new Float64Array([10.125, 20.5, 50, 50, 0.1 + 0.2, 99.999999999]),
    ids: ['a', 'b', 'c'],
    inside: new Uint32Array([0, 2]),
    outsideIds: ['b'],
    studyArea: [[[[0, 0], [100, 0], [100, 100], [0, 100], [0, 0]]]],
    noDataZones: [[[[40, 40], [60, 40], [60, 60], [40, 60], [40, 40]]]],
    areaIsDefault: false,
    region: { rings: [shell, hole], area: 9600, bbox: { minX: 0, minY: 0, maxX: 100, maxY: 100 } },
    origin: { x: 0, y: 0 },
    warnings: [{ code: 'W', message: 'one point outside', ids: ['b'] }],
  };
  const summary: DatasetSummary = {
    name: 'square', crs: 'planar', n: 3, nInside: 2, nOutside: 1, validArea: 9600, studyAreaArea: 10000,
    bbox: { minX: 0, minY: 0, maxX: 100, maxY: 100 }, areaIsDefault: false, warnings: dataset.warnings,
    suggestedCellSizes: [{ perCell: 2, cellSize: Math.sqrt((2 * 9600) / 2), rule: 'test' }],
  };
  return { dataset, summary };
}

describe('blob codec', () => {
  it('keeps NaN and infinities through stored JSON', () => {
    const value = { a: Number.NaN, b: Number.POSITIVE_INFINITY, c: Number.NEGATIVE_INFINITY, d: 0.1 + 0.2, e: 'csr' };
    const back = fromStoredJson<typeof value>(toStoredJson(value));
    expect(Number.isNaN(back.a)).toBe(true);
    expect(back.b).toBe(Number.POSITIVE_INFINITY);
    expect(back.c).toBe(Number.NEGATIVE_INFINITY);
    expect(back.d).toBe(0.30000000000000004);
    expect(back.e).toBe('csr');
  });
  it('packs rings of different lengths and reads them back bit for bit', () => {
    const rings = [new Float64Array([1, 2, 3, 4, 5, 6]), new Float64Array([Math.PI, Math.E, -0, 1e-300])];
    const back = decodeRings(encodeRings(rings));
    expect(back.map((ring) => Array.from(ring))).toEqual(rings.map((ring) => Array.from(ring)));
    expect(Object.is(back[1]?.[2], -0)).toBe(true);
  });
});

describe('GridshakeStore', () => {
  it('applies the migrations, sets user_version and uses WAL', () => {
    const folder = tempFolder();
    const store = GridshakeStore.open(folder);
    store.close();
    const db = new Database(join(folder, 'gridshake.sqlite'));
    expect(db.pragma('user_version', { simple: true })).toBe(MIGRATIONS.length);
    expect(db.pragma('journal_mode', { simple: true })).toBe('wal');
    db.close();
  });

  it('upgrades a database written before the stability files (3), the baseline column (4), the sweeps\' executor (5) and empty inside indexes (6), keeping its datasets and sweeps', () => {
    const folder = tempFolder();
    const { dataset, summary } = squareDataset();
    const first = GridshakeStore.open(folder);
    const stored = first.datasets.insert(dataset, summary);
    const oldSweep = first.sweeps.create({ datasetId: stored.id as string, plan: { cells: [10], placements: 2, rotation: false, design: 'halton', minCoverage: 0.5, alpha: 0.05, sims: 0, seed: 1 }, estimate: { work: 1, budget: 1, tasks: 1 } });
    first.close();
    // make it a schema-2 database: what a store written before these migrations holds
    const old = new Database(join(folder, 'gridshake.sqlite'));
    old.exec('DROP TABLE stability_files; ALTER TABLE datasets DROP COLUMN baseline; ALTER TABLE sweeps DROP COLUMN executor;');
    old.pragma('user_version = 2');
    old.close();
    const again = GridshakeStore.open(folder);
    const loaded = again.datasets.load(stored.id as string) as Dataset;
    expect(Array.from(loaded.xy)).toEqual(Array.from(dataset.xy));
    expect(loaded.baseline).toBeUndefined();
    expect(again.datasets.summary(stored.id as string)).toEqual(stored);
    // a sweep stored before executors were recorded: kept, its executor unknown (a rerun takes the server's default)
    expect(again.sweeps.get(oldSweep.id)).toEqual({ ...oldSweep, executor: null });
    again.close();
    const db = new Database(join(folder, 'gridshake.sqlite'));
    expect(db.pragma('user_version', { simple: true })).toBe(6);
    expect(MIGRATIONS.length).toBe(6);
    expect((db.prepare('PRAGMA table_info(sweeps)').all() as { name: string }[]).map((column) => column.name)).toContain('executor');
    const columns = (db.prepare('PRAGMA table_info(datasets)').all() as { name: string }[]).map((column) => column.name);
    expect(columns).toContain('baseline');
    expect(db.prepare("SELECT name FROM sqlite_master WHERE type = 'table' AND name = 'stability_files'").get()).toBeDefined();
    db.close();
  });

  it('refuses a database written by a newer schema with GS_ERR_STORAGE', () => {
    const folder = tempFolder();
    GridshakeStore.open(folder).close();
    const db = new Database(join(folder, 'gridshake.sqlite'));
    db.pragma(`user_version = ${MIGRATIONS.length + 1}`);
    db.close();
    expect(() => GridshakeStore.open(folder)).toThrow(/newer gridshake/);
  });

  it('stores a dataset whose points are all inside without an index, and reads back the same points and index', () => {
    const folder = tempFolder();
    const { dataset: withOutside, summary } = squareDataset();
    const { inside: _dropped, ...rest } = withOutside;
    const dataset = withEveryPointInside({ ...rest, xy: new Float64Array([10.125, 20.5, 0.3, 99.999999999]), ids: ['a', 'c'], outsideIds: [] });
    const store = GridshakeStore.open(folder);
    const stored = store.datasets.insert(dataset, { ...summary, n: 2, nOutside: 0 });
    const row = (store as unknown as { db: Database.Database }).db.prepare('SELECT length(inside) AS bytes FROM datasets').get() as { bytes: number };
    expect(row.bytes).toBe(0);
    const loaded = store.datasets.load(stored.id as string) as Dataset;
    expect(isEveryPointInside(loaded)).toBe(true);
    expect(Array.from(loaded.xy)).toEqual(Array.from(dataset.xy));
    expect(Array.from(loaded.inside)).toEqual([0, 1]);
    expect(loaded.ids).toEqual(['a', 'c']);
    store.close();
  });

  it('stores a dataset and reads back the identical engine input after reopening', () => {
    const folder = tempFolder();
    const { dataset, summary } = squareDataset();
    const first = GridshakeStore.open(folder);
    const stored = first.datasets.insert(dataset, summary);
    first.close();
    const again = GridshakeStore.open(folder);
    const loaded = again.datasets.load(stored.id as string) as Dataset;
    expect(Array.from(loaded.xy)).toEqual(Array.from(dataset.xy));
    expect(loaded.xy).toBeInstanceOf(Float64Array);
    expect(Array.from(loaded.inside)).toEqual([0, 2]);
    expect(loaded.region.rings.map((ring) => Array.from(ring))).toEqual(dataset.region.rings.map((r) => Array.from(r)));
    expect(loaded.region.area).toBe(9600);
    expect(loaded.ids).toEqual(['a', 'b', 'c']);
    expect(loaded.studyArea).toEqual(dataset.studyArea);
    expect(loaded.warnings).toEqual(dataset.warnings);
    expect(again.datasets.summary(stored.id as string)).toEqual(stored);
    expect(again.datasets.list()).toEqual([stored]);
    again.close();
  });

  it('marks sweeps left queued or running as interrupted and drops their partial rows', () => {
    const store = GridshakeStore.open(':memory:');
    const { dataset, summary } = squareDataset();
    const { id } = store.datasets.insert(dataset, summary);
    const plan = { cells: [10], placements: 4, rotation: true, design: 'halton' as const, minCoverage: 0.5, alpha: 0.05, sims: 0, seed: 1 };
    const estimate = { work: 8, budget: 100, tasks: 1 };
    const running = store.sweeps.create({ datasetId: id as string, plan, estimate });
    const queued = store.sweeps.create({ datasetId: id as string, plan, estimate });
    const done = store.sweeps.create({ datasetId: id as string, plan, estimate });
    store.sweeps.markRunning(running.id);
    store.placements.writeChunk(running.id, 0, [{ vmr: 1 } as unknown as PlacementRow]);
    store.sweeps.finish(done.id, 'done', {});
    expect(store.sweeps.markInterrupted().sort()).toEqual([running.id, queued.id].sort());
    expect(store.sweeps.get(running.id)?.status).toBe('interrupted');
    expect(store.sweeps.get(queued.id)?.status).toBe('interrupted');
    expect(store.sweeps.get(done.id)?.status).toBe('done');
    expect(store.placements.read(running.id)).toEqual([]);
    store.close();
  });

  it('deleting a dataset removes its sweeps and rows in one transaction', () => {
    const store = GridshakeStore.open(':memory:');
    const { dataset, summary } = squareDataset();
    const { id } = store.datasets.insert(dataset, summary);
    const plan = { cells: [10], placements: 1, rotation: false, design: 'lattice' as const, minCoverage: 1, alpha: 0.05, sims: 0, seed: 1 };
    const sweep = store.sweeps.create({ datasetId: id as string, plan, estimate: { work: 1, budget: 1, tasks: 1 } });
    store.placements.writeChunk(sweep.id, 0, [{ vmr: Number.NaN } as unknown as PlacementRow]);
    expect(Number.isNaN(store.placements.read(sweep.id)[0]?.vmr)).toBe(true);
    expect(store.datasets.delete(id as string)).toBe(true);
    expect(store.sweeps.get(sweep.id)).toBeUndefined();
    expect(store.placements.read(sweep.id)).toEqual([]);
    expect(store.datasets.delete(id as string)).toBe(false);
    store.close();
  });

  it('keeps the last loaded dataset for the next load of its id, and forgets it when the dataset is deleted', () => {
    const store = GridshakeStore.open(':memory:');
    const first = squareDataset();
    const second = squareDataset();
    const a = store.datasets.insert(first.dataset, first.summary).id as string;
    const b = store.datasets.insert(second.dataset, second.summary).id as string;
    const loaded = store.datasets.load(a);
    expect(store.datasets.load(a)).toBe(loaded);
    // one kept: loading another replaces it, and the first is read again (equal, not the same object)
    const other = store.datasets.load(b);
    expect(other).not.toBe(loaded);
    const again = store.datasets.load(a);
    expect(again).not.toBe(loaded);
    expect(Array.from(again!.xy)).toEqual(Array.from(loaded!.xy));
    expect(store.datasets.delete(a)).toBe(true);
    expect(store.datasets.load(a)).toBeUndefined();
    store.close();
  });

  it('a failed insert (constraint violation mid-write) leaves the store unchanged', () => {
    const store = GridshakeStore.open(':memory:');
    const { dataset, summary } = squareDataset();
    const broken = { ...dataset, name: null as unknown as string };
    expect(() => store.datasets.insert(broken, summary)).toThrow();
    expect(store.datasets.count()).toBe(0);
    store.close();
  });
});
