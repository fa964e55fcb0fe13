/**
 * Sweeps in SQLite: plan, estimate, status, progress, summary, error and timestamps.
 * Status changes are single statements or transactions; a sweep found `queued` or `running` when the server starts
 * belonged to a process that stopped, and is marked `interrupted` (its partial rows removed).
 */
import type Database from 'better-sqlite3';
import { randomUUID } from 'node:crypto';
import type { ExecutorChoice, Plan, SweepEstimate, SweepProgress, SweepStatus, SweepSummary, SweepView } from '../../shared/contracts.js';
import { fromStoredJson, toStoredJson } from './blob-codec.js';

/** A sweep as stored: the API's view of it (http-schemas SWEEP_SCHEMA) without its dataset's name and queue place. */
export type SweepRecord = Omit<SweepView, 'datasetName' | 'queuePosition' | 'summary'> & { summary: SweepSummary | null };

interface SweepRow {
  id: string;
  dataset_id: string;
  plan_json: string;
  estimate_json: string;
  status: SweepStatus;
  progress_json: string;
  summary_json: string | null;
  conclusion: string | null;
  error: string | null;
  rerun_of: string | null;
  executor: ExecutorChoice | null;
  created_at: string;
  started_at: string | null;
  finished_at: string | null;
}

const LIST_COLUMNS = `SELECT id, dataset_id, plan_json, estimate_json, status, progress_json, NULL AS summary_json,
  json_extract(summary_json, '$.conclusion') AS conclusion, error, rerun_of, executor, created_at, started_at, finished_at
  FROM sweeps`;

export const FINISHED_STATUSES: readonly SweepStatus[] = ['done', 'failed', 'cancelled', 'interrupted'];

function toRecord(row: SweepRow, withSummary: boolean): SweepRecord {
  return {
    id: row.id,
    datasetId: row.dataset_id,
    plan: fromStoredJson<Plan>(row.plan_json),
    estimate: fromStoredJson<SweepEstimate>(row.estimate_json),
    status: row.status,
    progress: fromStoredJson<SweepProgress>(row.progress_json),
    summary: withSummary && row.summary_json !== null ? fromStoredJson<SweepSummary>(row.summary_json) : null,
    conclusion: row.conclusion,
    error: row.error,
    rerunOf: row.rerun_of,
    executor: row.executor ?? null,
    createdAt: row.created_at,
    startedAt: row.started_at,
    finishedAt: row.finished_at,
  };
}

export class SweepStore {
  constructor(private readonly db: Database.Database) {}

  create(input: { datasetId: string; plan: Plan; estimate: SweepEstimate; rerunOf?: string | null; executor?: ExecutorChoice | null }): SweepRecord {
    const id = randomUUID();
    // progress counts placements (sizes x placements), as the pool reports them
    const sizes = (input.plan.cells ?? input.plan.perCell ?? []).length;
    const progress: SweepProgress = { done: 0, total: sizes * input.plan.placements, elapsedSeconds: 0, remainingSeconds: null };
    this.db
      .prepare(
        `INSERT INTO sweeps (id, dataset_id, plan_json, estimate_json, status, progress_json, rerun_of, executor, created_at)
         VALUES (?, ?, ?, ?, 'queued', ?, ?, ?, ?)`,
      )
      .run(
        id,
        input.datasetId,
        toStoredJson(input.plan),
        toStoredJson(input.estimate),
        toStoredJson(progress),
        input.rerunOf ?? null,
        input.executor ?? null,
        new Date().toISOString(),
      );
    return this.get(id) as SweepRecord;
  }

  get(id: string): SweepRecord | undefined {
    const row = this.db.prepare(`SELECT *, json_extract(summary_json, '$.conclusion') AS conclusion FROM sweeps WHERE id = ?`).get(id) as SweepRow | undefined;
    return row === undefined ? undefined : toRecord(row, true);
  }

  /** Sweeps (newest first), without their summaries: all of them, or one page (`limit` from `offset`). */
  list(datasetId?: string, page: { limit: number; offset: number } = { limit: -1, offset: 0 }): SweepRecord[] {
    const rows = (
      datasetId === undefined
        ? this.db.prepare(`${LIST_COLUMNS} ORDER BY created_at DESC, rowid DESC LIMIT ? OFFSET ?`).all(page.limit, page.offset)
        : this.db
            .prepare(`${LIST_COLUMNS} WHERE dataset_id = ? ORDER BY created_at DESC, rowid DESC LIMIT ? OFFSET ?`)
            .all(datasetId, page.limit, page.offset)
    ) as SweepRow[];
    return rows.map((row) => toRecord(row, false));
  }

  /** How many sweeps there are (of one dataset). */
  count(datasetId?: string): number {
    const row = (
      datasetId === undefined
        ? this.db.prepare('SELECT COUNT(*) AS n FROM sweeps').get()
        : this.db.prepare('SELECT COUNT(*) AS n FROM sweeps WHERE dataset_id = ?').get(datasetId)
    ) as { n: number };
    return row.n;
  }

  /** How many sweeps wait to run (status `queued`). */
  countQueued(): number {
    return (this.db.prepare(`SELECT COUNT(*) AS n FROM sweeps WHERE status = 'queued'`).get() as { n: number }).n;
  }

  markRunning(id: string): void {
    this.db
      .prepare(`UPDATE sweeps SET status = 'running', started_at = ? WHERE id = ? AND status = 'queued'`)
      .run(new Date().toISOString(), id);
  }

  /**
   * Save a running sweep's progress. Advisory (the next save follows a second later), so it never waits for the
   * write lock: while the upload parser's thread stores a large dataset, waiting here would stall the event loop for
   * as long as that write takes. Returns false when the save was skipped.
   */
  saveProgress(id: string, progress: SweepProgress): boolean {
    const waitMs = Number(this.db.pragma('busy_timeout', { simple: true }));
    this.db.pragma('busy_timeout = 0');
    try {
      this.db.prepare('UPDATE sweeps SET progress_json = ? WHERE id = ?').run(toStoredJson(progress), id);
      return true;
    } catch (error) {
      if ((error as { code?: string }).code === 'SQLITE_BUSY') return false;
      throw error;
    } finally {
      this.db.pragma(`busy_timeout = ${waitMs}`);
    }
  }

  /** Record the end of a sweep: its final status, progress, and summary or error, in one statement. */
  finish(
    id: string,
    status: SweepStatus,
    detail: { progress?: SweepProgress; summary?: SweepSummary; error?: string },
  ): void {
    const current = this.get(id);
    if (current === undefined) return;
    this.db
      .prepare(
        `UPDATE sweeps SET status = ?, progress_json = ?, summary_json = ?, error = ?, finished_at = ? WHERE id = ?`,
      )
      .run(
        status,
        toStoredJson(detail.progress ?? current.progress),
        detail.summary === undefined ? null : toStoredJson(detail.summary),
        detail.error ?? null,
        new Date().toISOString(),
        id,
      );
  }

  /** At start: every sweep left `queued` or `running` by an earlier process becomes `interrupted`. */
  markInterrupted(): string[] {
    const mark = this.db.transaction(() => {
      const rows = this.db
        .prepare(`SELECT id FROM sweeps WHERE status IN ('queued', 'running')`)
        .all() as { id: string }[];
      const ids = rows.map((row) => row.id);
      const now = new Date().toISOString();
      for (const id of ids) {
        this.db.prepare('DELETE FROM placement_chunks WHERE sweep_id = ?').run(id);
        this.db
          .prepare(
            `UPDATE sweeps SET status = 'interrupted', finished_at = ?,
               error = 'the server stopped while this sweep was queued or running; rerun it from its plan'
             WHERE id = ?`,
          )
          .run(now, id);
      }
      return ids;
    });
    return mark();
  }

  delete(id: string): boolean {
    const remove = this.db.transaction(() => this.db.prepare('DELETE FROM sweeps WHERE id = ?').run(id).changes);
    return remove() > 0;
  }
}
