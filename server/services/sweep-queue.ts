/**
 * The sweep queue: sweeps run one after another on one shared worker pool, in the order they were started.
 * The pool computes in worker threads, so the event loop stays free for status requests; rows are stored in chunks
 * with a yield between them. Events: 'progress' (id, SweepProgress) and 'finished' (id, SweepStatus).
 * A sweep's status turns `done` only after all its rows are stored; on shutdown the running and queued sweeps become
 * `interrupted`, as they would after a crash.
 */
import { EventEmitter } from 'node:events';
import type { SweepProgress, SweepStatus } from '../../shared/contracts.js';
import type { GridshakeStore } from '../store/store.js';
import { writeRowsInChunks } from '../store/placement-store.js';
import { trustStoredPlan } from '../sweeps/plan.js';
import { ProgressClock } from './progress-clock.js';
import type { ExecutorChoice, SweepRunner } from './sweep-runner.js';
import { storeStabilityFiles } from '../stability/stored-stability.js';

/** How often the progress of a running sweep is written to the store (ms). */
const SAVE_PROGRESS_EVERY_MS = 1000;

interface ActiveSweep {
  id: string;
  controller: AbortController;
  clock: ProgressClock;
  stopReason: 'cancelled' | 'interrupted' | null;
}

export interface QueueLogger {
  error(object: unknown, message: string): void;
}

export class SweepQueue extends EventEmitter {
  private readonly pending: string[] = [];
  /** the executor each waiting or running sweep asked for (absent: the runner's default) */
  private readonly executors = new Map<string, ExecutorChoice>();
  private active: ActiveSweep | null = null;
  private running: Promise<void> | null = null;
  private closed = false;

  constructor(
    private readonly store: GridshakeStore,
    private readonly runner: SweepRunner,
    private readonly log: QueueLogger,
  ) {
    super();
    this.setMaxListeners(0);
  }

  enqueue(id: string, executor?: ExecutorChoice): void {
    if (this.closed) return;
    if (executor !== undefined) this.executors.set(id, executor);
    this.pending.push(id);
    this.pump();
  }

  /** Position in the queue (0 = next), or -1 when not waiting. */
  position(id: string): number {
    return this.pending.indexOf(id);
  }

  isActive(id: string): boolean {
    return this.active?.id === id || this.pending.includes(id);
  }

  /** The live progress of the running sweep (elapsed brought up to now), or null. */
  liveProgress(id: string): SweepProgress | null {
    return this.active?.id === id ? this.active.clock.now() : null;
  }

  /** Cancel a queued or running sweep; false when it is neither. */
  cancel(id: string): boolean {
    const waiting = this.pending.indexOf(id);
    if (waiting >= 0) {
      this.pending.splice(waiting, 1);
      this.executors.delete(id);
      this.store.sweeps.finish(id, 'cancelled', {});
      this.emit('finished', id, 'cancelled');
      return true;
    }
    if (this.active?.id === id) {
      this.active.stopReason = 'cancelled';
      this.active.controller.abort();
      return true;
    }
    return false;
  }

  /** Stop taking work, stop the running sweep, and mark it and the waiting ones interrupted. */
  async close(): Promise<void> {
    this.closed = true;
    for (const id of this.pending.splice(0)) {
      this.store.sweeps.finish(id, 'interrupted', { error: 'the server stopped before this sweep started' });
      this.emit('finished', id, 'interrupted');
    }
    if (this.active !== null) {
      this.active.stopReason = 'interrupted';
      this.active.controller.abort();
    }
    await this.running;
  }

  private pump(): void {
    if (this.running !== null || this.closed) return;
    const id = this.pending.shift();
    if (id === undefined) return;
    this.running = this.runOne(id)
      .catch((error: unknown) => this.log.error({ err: error, sweepId: id }, 'sweep queue failure'))
      .finally(() => {
        this.executors.delete(id);
        this.active = null;
        this.running = null;
        this.pump();
      });
  }

  private async runOne(id: string): Promise<void> {
    const record = this.store.sweeps.get(id);
    if (record === undefined || record.status !== 'queued') return;
    const dataset = this.store.datasets.load(record.datasetId);
    if (dataset === undefined) {
      this.finish(id, 'failed', { error: 'the dataset of this sweep no longer exists' });
      return;
    }
    const active: ActiveSweep = {
      id,
      controller: new AbortController(),
      clock: new ProgressClock(record.progress.total),
      stopReason: null,
    };
    this.active = active;
    this.store.sweeps.markRunning(id);
    this.emit('progress', id, active.clock.now());
    let lastSaved = 0;
    try {
      // the store holds only plans that normalizePlan returned: not validated again
      const result = await this.runner.runSweep(dataset, trustStoredPlan(record.plan), {
        signal: active.controller.signal,
        datasetId: record.datasetId,
        stability: true,
        executor: this.executors.get(id),
        onProgress: (reported) => {
          const progress = active.clock.update(reported);
          if (Date.now() - lastSaved >= SAVE_PROGRESS_EVERY_MS) {
            lastSaved = Date.now();
            this.store.sweeps.saveProgress(id, progress);
          }
          this.emit('progress', id, progress);
        },
      });
      if (active.stopReason !== null) throw new Error('stopped');
      if (this.store.sweeps.get(id) === undefined) return;
      await writeRowsInChunks(this.store.placements, id, result.rows);
      if (active.stopReason !== null) throw new Error('stopped');
      storeStabilityFiles(this.store, id, result, dataset.projection, dataset.name);
      const final = active.clock.now();
      this.finish(id, 'done', { summary: result.summary, progress: { ...final, done: final.total, remainingSeconds: 0 } });
    } catch (error) {
      if (this.store.sweeps.get(id) === undefined) return;
      this.store.placements.clear(id);
      this.store.stability.clear(id);
      if (active.stopReason === 'cancelled') this.finish(id, 'cancelled', { progress: active.clock.now() });
      else if (active.stopReason === 'interrupted') {
        this.finish(id, 'interrupted', { progress: active.clock.now(), error: 'the server stopped while this sweep ran' });
      } else {
        const message = error instanceof Error ? error.message : String(error);
        this.finish(id, 'failed', { progress: active.clock.now(), error: message });
      }
    }
  }

  private finish(id: string, status: SweepStatus, detail: Parameters<GridshakeStore['sweeps']['finish']>[2]): void {
    this.store.sweeps.finish(id, status, detail);
    this.emit('finished', id, status);
  }
}
