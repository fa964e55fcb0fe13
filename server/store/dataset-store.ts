/**
 * Datasets in SQLite: the summary and plain metadata as JSON, the points and the valid region as BLOBs.
 * Every write is one transaction, so a failed or interrupted request leaves nothing half-written.
 */
import type Database from 'better-sqlite3';
import { randomUUID } from 'node:crypto';
import { deserialize, serialize } from 'node:v8';
import type { BaselineInfo, Dataset, DatasetSummary } from '../../shared/contracts.js';
import { isEveryPointInside, withEveryPointInside } from '../inputs/inside-points.js';
import type { Baseline } from '../../workers/baseline/baseline.js';
import {
  bufferToFloat64,
  bufferToUint32,
  decodeRings,
  encodeRings,
  fromStoredJson,
  toStoredJson,
  typedArrayToBuffer,
} from './blob-codec.js';

interface DatasetRow {
  id: string;
  name: string;
  created_at: string;
  meta_json: string;
  summary_json: string;
  xy: Buffer;
  inside: Buffer;
  ids_json: string;
  region_rings: Buffer;
  sample_id: string | null;
  baseline: Buffer | null;
}

/** A dataset summary as stored: with its id, creation time and, for a demo scenario, the sample's folder name. */
export type StoredDatasetSummary = DatasetSummary & { id: string; createdAt: string; sample: string | null };

type DatasetMeta = Omit<Dataset, 'xy' | 'ids' | 'inside' | 'region' | 'baseline'> & {
  region: Omit<Dataset['region'], 'rings'>;
  /** what is recorded about the baseline (its engine data is the baseline BLOB) */
  baselineInfo?: BaselineInfo;
};

/** The fields stored apart from meta_json (BLOBs and columns of their own). */
const STORED_APART = new Set(['xy', 'ids', 'inside', 'region', 'baseline']);

/** The dataset's other fields, read without touching the ones stored apart (an unread `inside` stays unbuilt). */
function plainFields(dataset: Dataset): Record<string, unknown> {
  const plain: Record<string, unknown> = {};
  for (const key of Object.keys(dataset)) if (!STORED_APART.has(key)) plain[key] = dataset[key as keyof Dataset];
  return plain;
}

/** Loaded datasets kept for the next load of the same id (a stored dataset never changes; deleting one drops it). */
const KEPT_LOADS = 1;

export class DatasetStore {
  /** the last loaded dataset by id: a server's sweeps mostly reuse one (its content hash is then memoised too) */
  private readonly loaded = new Map<string, Dataset>();

  constructor(private readonly db: Database.Database) {}

  /** Store a dataset and its summary; returns the summary with its new id and creation time. */
  insert(dataset: Dataset, summary: DatasetSummary, sampleId: string | null = null): StoredDatasetSummary {
    const id = randomUUID();
    const createdAt = new Date().toISOString();
    const stored: StoredDatasetSummary = { ...summary, id, createdAt, sample: sampleId };
    // every point inside: an empty blob, never the index (server/inputs/inside-points.ts); a stored dataset always
    // has points inside (server/inputs refuses one without), so an empty blob cannot mean "none inside"
    const inside = isEveryPointInside(dataset) ? new Uint32Array(0) : dataset.inside;
    const { xy, ids, region, baseline } = dataset;
    const meta: DatasetMeta = {
      ...(plainFields(dataset) as Omit<DatasetMeta, 'region' | 'baselineInfo'>),
      region: { area: region.area, bbox: region.bbox },
      ...(baseline === undefined ? {} : { baselineInfo: baseline.info }),
    };
    const write = this.db.transaction(() => {
      this.db
        .prepare(
          `INSERT INTO datasets (id, name, created_at, meta_json, summary_json, xy, inside, ids_json, region_rings,
             sample_id, baseline) VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`,
        )
        .run(
          id,
          dataset.name,
          createdAt,
          toStoredJson(meta),
          toStoredJson(stored),
          typedArrayToBuffer(xy),
          typedArrayToBuffer(inside),
          JSON.stringify(ids),
          encodeRings(region.rings),
          sampleId,
          baseline === undefined ? null : serialize(baseline.engine),
        );
    });
    write();
    return stored;
  }

  list(): StoredDatasetSummary[] {
    const rows = this.db
      .prepare('SELECT summary_json FROM datasets ORDER BY created_at, rowid')
      .all() as Pick<DatasetRow, 'summary_json'>[];
    return rows.map((row) => fromStoredJson<StoredDatasetSummary>(row.summary_json));
  }

  count(): number {
    const row = this.db.prepare('SELECT COUNT(*) AS n FROM datasets').get() as { n: number };
    return row.n;
  }

  summary(id: string): StoredDatasetSummary | undefined {
    const row = this.db.prepare('SELECT summary_json FROM datasets WHERE id = ?').get(id) as
      | Pick<DatasetRow, 'summary_json'>
      | undefined;
    return row === undefined ? undefined : fromStoredJson<StoredDatasetSummary>(row.summary_json);
  }

  /**
   * The full dataset, as server/inputs built it, ready for the engine. The record ids are read from their JSON when
   * first asked for (a sweep only counts them): parsing 200,000 of them took most of the 70 ms a load cost, once
   * per sweep. The last loaded dataset is kept: loading it again (and hashing it for its shared copy,
   * server/sweeps/dataset-key.ts) cost about 20 ms of each sweep of 2e5 points.
   */
  load(id: string): Dataset | undefined {
    const kept = this.loaded.get(id);
    if (kept !== undefined) {
      this.loaded.delete(id);
      this.loaded.set(id, kept);
      return kept;
    }
    const dataset = this.read(id);
    if (dataset !== undefined) {
      this.loaded.set(id, dataset);
      while (this.loaded.size > KEPT_LOADS) this.loaded.delete(this.loaded.keys().next().value as string);
    }
    return dataset;
  }

  private read(id: string): Dataset | undefined {
    const row = this.db.prepare('SELECT * FROM datasets WHERE id = ?').get(id) as DatasetRow | undefined;
    if (row === undefined) return undefined;
    const { baselineInfo, ...meta } = fromStoredJson<DatasetMeta>(row.meta_json);
    const baseline =
      row.baseline === null || row.baseline === undefined || baselineInfo === undefined
        ? {}
        : { baseline: { engine: deserialize(row.baseline) as Baseline, info: baselineInfo } };
    let ids: string[] | undefined;
    const idsJson = row.ids_json;
    const dataset: Omit<Dataset, 'inside'> = {
      ...meta,
      ...baseline,
      xy: bufferToFloat64(row.xy),
      get ids(): string[] {
        ids ??= JSON.parse(idsJson) as string[];
        return ids;
      },
      region: { ...meta.region, rings: decodeRings(row.region_rings) },
    };
    // no spread: it would call the ids getter (parsing every id)
    return row.inside.length === 0 ? withEveryPointInside(dataset) : Object.assign(dataset, { inside: bufferToUint32(row.inside) });
  }

  /** Delete a dataset; its sweeps and their rows go with it (foreign keys, one transaction). */
  delete(id: string): boolean {
    this.loaded.delete(id);
    const remove = this.db.transaction(() => this.db.prepare('DELETE FROM datasets WHERE id = ?').run(id).changes);
    return remove() > 0;
  }
}
