/**
 * Sweeps: validate a plan against its dataset (normalizePlan, cell sizes, the work budget) and queue it, read
 * status and summaries, cancel, rerun from the stored plan, delete. Refusals are coded 4xx errors raised before
 * anything is stored or queued; at most MAX_QUEUED_SWEEPS may wait (429 GS_ERR_QUEUE_FULL).
 */
import type { Plan, SweepProgress, SweepStatus, SweepView } from '../../shared/contracts.js';
import { conflictError, notFoundError, parameterError, queueFullError } from '../errors.js';
import { MAX_QUEUED_SWEEPS } from '../limits.js';
import type { GridshakeStore } from '../store/store.js';
import type { SweepRecord } from '../store/sweep-store.js';
import { FINISHED_STATUSES } from '../store/sweep-store.js';
import { normalizePlan, resolveCellSizes } from '../sweeps/plan.js';
import { assertWithinBudget, estimateSweep } from '../sweeps/sweep-budget.js';
import { baselineSizeOf } from '../../shared/plan-rules.js';
import type { SweepQueue } from './sweep-queue.js';
import type { ExecutorChoice } from './sweep-runner.js';

export class SweepService {
  constructor(
    private readonly store: GridshakeStore,
    private readonly queue: SweepQueue,
    private readonly workBudget: number,
    /** the executors a sweep may ask for (the runner's), the default first */
    private readonly executors: readonly ExecutorChoice[] = ['local'],
  ) {}

  /**
   * Validate and queue a sweep of a dataset; GS_ERR_PARAMETER / GS_ERR_BUDGET (400) or 404 before queuing.
   * `executor`: where its tasks run (the default when absent); one this server does not have is GS_ERR_PARAMETER.
   */
  start(datasetId: string, planInput: unknown, rerunOf: string | null = null, executor?: ExecutorChoice): SweepView {
    if (executor !== undefined && !this.executors.includes(executor)) {
      throw parameterError(
        `executor "${executor}" is not available: this server sends no sweeps to a Redis queue (start it with --queue URL ` +
          'or GRIDSHAKE_QUEUE); leave executor out to run on its own worker pool',
      );
    }
    const dataset = this.store.datasets.summary(datasetId);
    if (dataset === undefined) throw notFoundError(`no dataset with id ${datasetId}`);
    const plan: Plan = normalizePlan(planInput);
    const cellSizes = resolveCellSizes(plan, dataset.validArea, dataset.nInside);
    // every sweep of the service computes the stability surface (sweep-queue.ts); the study area's box holds the
    // valid region's, so the estimate is an upper bound of the runner's
    const estimate = estimateSweep(plan, dataset.nInside, this.workBudget, {
      baseline: baselineSizeOf(dataset.baseline),
      surface: { bbox: dataset.bbox, cellSizes },
    });
    assertWithinBudget(estimate);
    const waiting = this.store.sweeps.countQueued();
    if (waiting >= MAX_QUEUED_SWEEPS) {
      throw queueFullError(
        `${waiting} sweeps are already waiting to run (the most the queue holds is ${MAX_QUEUED_SWEEPS}); ` +
          'start this one when some have finished, or cancel some',
      );
    }
    // stored as chosen (the server's default when absent), so that the record shows it and a rerun goes there too
    const chosen = executor ?? this.executors[0];
    const record = this.store.sweeps.create({ datasetId, plan, estimate, rerunOf, executor: chosen });
    this.queue.enqueue(record.id, chosen);
    return this.view(record, false);
  }

  /**
   * A new sweep from a finished sweep's stored plan (e.g. one interrupted by a restart), on the executor that sweep
   * used (the server's default for sweeps stored before executors were recorded). A queue sweep on a server without
   * a queue is refused (GS_ERR_PARAMETER), not moved to this machine unasked.
   */
  rerun(id: string): SweepView {
    const record = this.record(id);
    if (!FINISHED_STATUSES.includes(record.status)) {
      throw conflictError(`sweep ${id} is ${record.status}; rerun it once it has finished, or cancel it first`);
    }
    const executor = record.executor ?? undefined;
    if (executor !== undefined && !this.executors.includes(executor)) {
      throw parameterError(
        `sweep ${id} ran on a Redis queue and this server sends no sweeps to one: start the server with --queue URL ` +
          '(or GRIDSHAKE_QUEUE) to rerun it there, or start a new sweep with its plan to run it on this machine',
      );
    }
    return this.start(record.datasetId, record.plan, id, executor);
  }

  /** One page of sweeps (newest first) and how many there are in all. */
  list(datasetId?: string, page: { limit: number; offset: number } = { limit: -1, offset: 0 }): { sweeps: SweepView[]; total: number } {
    const names = new Map<string, string | null>();
    const sweeps = this.store.sweeps.list(datasetId, page).map((record) => this.view(record, false, names));
    return { sweeps, total: this.store.sweeps.count(datasetId) };
  }

  get(id: string): SweepView {
    return this.view(this.record(id), true);
  }

  find(id: string): SweepRecord | undefined {
    return this.store.sweeps.get(id);
  }

  record(id: string): SweepRecord {
    const record = this.store.sweeps.get(id);
    if (record === undefined) throw notFoundError(`no sweep with id ${id}`);
    return record;
  }

  /** Progress as of now: live for the running sweep, stored for the others. */
  progress(id: string): { status: SweepStatus; progress: SweepProgress } {
    const record = this.record(id);
    return { status: record.status, progress: this.queue.liveProgress(id) ?? record.progress };
  }

  /** Cancel a queued or running sweep; 409 when it has already finished. */
  cancel(id: string): SweepView {
    const record = this.record(id);
    if (FINISHED_STATUSES.includes(record.status) || !this.queue.cancel(id)) {
      throw conflictError(`sweep ${id} has already finished (${record.status}); there is nothing to cancel`);
    }
    return this.get(id);
  }

  delete(id: string): void {
    this.record(id);
    if (this.queue.isActive(id)) this.queue.cancel(id);
    this.store.sweeps.delete(id);
  }

  private view(record: SweepRecord, withSummary: boolean, names = new Map<string, string | null>()): SweepView {
    const { summary, ...rest } = record;
    if (!names.has(record.datasetId)) names.set(record.datasetId, this.store.datasets.summary(record.datasetId)?.name ?? null);
    const position = this.queue.position(record.id);
    const live = this.queue.liveProgress(record.id);
    const view: SweepView = {
      ...rest,
      progress: live ?? record.progress,
      datasetName: names.get(record.datasetId) ?? null,
      queuePosition: position >= 0 ? position : null,
      conclusion: record.conclusion,
    };
    if (withSummary) view.summary = summary;
    return view;
  }
}
