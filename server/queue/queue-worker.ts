/**
 * `gridshake worker`: takes sweep tasks from the Redis queue until stopped and runs them on a local piscina pool
 * (server/sweeps/local-executor.ts, the same engine and task entry as a local sweep). Each dataset is fetched from
 * Redis once and kept (the last two), each simulation (dataset, seed, sims) drawn once and kept (the last one).
 * A stop (SIGTERM) finishes the tasks in hand, then exits. An unreachable Redis is reported and retried with
 * backoff (redis-options.ts) by the worker's own client; BullMQ's Worker is made once that client has connected, so
 * that no BullMQ connection ever starts against an unreachable Redis (see queue-executor.ts: BullMQ 5 can leave an
 * unhandled rejection when such a connection is closed).
 */
import { Worker, UnrecoverableError, type Job } from 'bullmq';
import { Redis } from 'ioredis';
import type { Dataset } from '../../shared/contracts.js';
import type { DatasetRef, SimulationRef } from '../sweeps/executor.js';
import { LocalExecutor } from '../sweeps/local-executor.js';
import { simulateTasks } from '../sweeps/sweep-runner.js';
import { unpackRegion } from '../../workers/sweep/region-buffer.js';
import { engineErrorOf } from '../../workers/engine-error.js';
import { unpackDataset } from './queue-dataset.js';
import { withEveryPointInside } from '../inputs/inside-points.js';
import { unpackBaseline } from '../../workers/baseline/baseline-buffer.js';
import { BULL_PREFIX, datasetKey, resultKey, TASK_QUEUE } from './queue-keys.js';
import { RESULT_TTL_SECONDS } from './queue-executor.js';
import { certificateAdvice, redisOptions } from './redis-options.js';
import { decodeTask, encodeResult } from './task-codec.js';
import type { QueueConnection } from './queue-url.js';

/** Datasets a worker keeps. */
const KEPT_DATASETS = 2;

/** Default lock of a task a worker holds (seconds): a worker silent this long has its task taken again. */
export const DEFAULT_LOCK_SECONDS = 30;

export interface QueueWorkerOptions {
  connection: QueueConnection;
  threads?: number;
  /** task lock and stall-check interval, ms; default GRIDSHAKE_WORKER_LOCK_SECONDS or DEFAULT_LOCK_SECONDS */
  lockMs?: number;
  log: (line: string) => void;
  /** piscina task file; default the engine's (server/sweeps/local-executor.ts POOL_TASK_FILE) */
  taskFile?: string;
}

export function lockFromEnv(env: Record<string, string | undefined> = process.env): number {
  const value = Number(env.GRIDSHAKE_WORKER_LOCK_SECONDS);
  return (Number.isFinite(value) && value > 0 ? value : DEFAULT_LOCK_SECONDS) * 1000;
}

export class QueueWorker {
  private readonly executor: LocalExecutor;
  private readonly redis: Redis;
  private worker: Worker | null = null;
  private closing = false;
  private readonly datasets = new Map<string, Promise<DatasetRef>>();
  private simulation: { key: string; ready: Promise<SimulationRef> } | null = null;
  private lastError = 'no answer';
  private tasksDone = 0;

  constructor(options: QueueWorkerOptions) {
    const { connection, log } = options;
    this.executor = new LocalExecutor({ threads: options.threads, filename: options.taskFile });
    const lockMs = options.lockMs ?? lockFromEnv();
    this.redis = new Redis(
      redisOptions(connection, (_attempt, delay) => {
        log(`cannot reach the Redis queue at ${connection.display} (${this.lastError}); retrying in ${(delay / 1000).toFixed(1)} s`);
      }),
    );
    this.redis.on('error', (error: Error) => {
      this.lastError = certificateAdvice(error) ?? error.message;
    });
    this.redis.on('ready', () => {
      log(`connected to ${connection.display}; taking sweep tasks on ${this.executor.threads} threads`);
      if (this.worker === null && !this.closing) this.worker = this.startWorker(connection, lockMs, log);
    });
  }

  private startWorker(connection: QueueConnection, lockMs: number, log: (line: string) => void): Worker {
    const worker = new Worker(TASK_QUEUE, (job) => this.process(job), {
      connection: redisOptions(connection),
      prefix: BULL_PREFIX,
      concurrency: this.executor.threads,
      lockDuration: lockMs,
      stalledInterval: lockMs,
      maxStalledCount: 2,
    });
    worker.on('error', (error: Error) => {
      this.lastError = error.message;
    });
    worker.on('failed', (job: Job | undefined, error: Error) => {
      if (job !== undefined) log(`task ${job.id} failed (try ${job.attemptsMade}): ${error.message}`);
    });
    return worker;
  }

  get threads(): number {
    return this.executor.threads;
  }

  get completed(): number {
    return this.tasksDone;
  }

  /** Finishes the tasks in hand and disconnects. */
  async close(): Promise<void> {
    this.closing = true;
    await this.worker?.close();
    await this.executor.destroy();
    await this.redis.quit().catch(() => undefined);
    this.redis.disconnect();
  }

  private async process(job: Job): Promise<number> {
    const task = decodeTask(job.data);
    const dataset = await this.datasetFor(task.prefix, task.dataset);
    const simulation = task.sims > 0 ? await this.simulationFor(dataset, task.seed, task.sims) : null;
    let result: Float64Array;
    try {
      result = await this.executor.run(
        {
          kind: 'chunk',
          dataset,
          simulation,
          cellSize: task.cellSize,
          shape: task.shape,
          minCoverage: task.minCoverage,
          alpha: task.alpha,
          placements: task.placementValues,
          ...(task.stability === undefined ? {} : { stability: task.stability }),
        },
        new AbortController().signal,
      );
    } catch (error) {
      const message = error instanceof Error ? error.message : String(error);
      // an engine error (e.g. too few kept cells) is the same on every worker: no retry; its message keeps the code
      if (engineErrorOf(error) !== null) throw new UnrecoverableError(message);
      throw error;
    }
    await this.redis.set(resultKey(task.prefix, String(job.id)), encodeResult(result), 'EX', RESULT_TTL_SECONDS);
    this.tasksDone += 1;
    return result.length;
  }

  /** The dataset of a content hash, fetched from Redis once and shared with the threads. */
  private datasetFor(prefix: string, hash: string): Promise<DatasetRef> {
    let ref = this.datasets.get(hash);
    if (ref === undefined) {
      ref = (async () => {
        const bytes = await this.redis.getBuffer(datasetKey(prefix, hash));
        if (bytes === null) throw new Error(`the dataset ${hash.slice(0, 12)}… is no longer in Redis (expired or removed); run the sweep again`);
        const packed = unpackDataset(bytes);
        const xy = new Float64Array(packed.points);
        const dataset = withEveryPointInside({
          xy,
          region: unpackRegion(packed.region),
          origin: packed.origin,
          // the engine's part of the population at risk is all a worker needs (its description stays with the sweep)
          ...(packed.baseline === null ? {} : { baseline: { engine: unpackBaseline(packed.baseline) } }),
        }) as unknown as Dataset;
        const shared: DatasetRef = { key: `queue:${hash}`, hash, pointCount: packed.pointCount };
        await this.executor.share(dataset, shared);
        return shared;
      })();
      this.datasets.set(hash, ref);
      ref.catch(() => this.datasets.delete(hash));
      while (this.datasets.size > KEPT_DATASETS) this.datasets.delete(this.datasets.keys().next().value as string);
    }
    return ref;
  }

  /** The simulated patterns of (dataset, seed, sims), drawn once on the worker's threads as a local sweep draws them. */
  private simulationFor(dataset: DatasetRef, seed: number, sims: number): Promise<SimulationRef> {
    const key = `${dataset.key}:seed ${seed}:sims ${sims}`;
    if (this.simulation?.key === key) return this.simulation.ready;
    const previous = this.simulation;
    const simulation: SimulationRef = { key, seed, sims };
    const ready = (async () => {
      if (previous !== null) await previous.ready.then((old) => this.executor.release(old)).catch(() => undefined);
      const signal = new AbortController().signal;
      await Promise.all([...simulateTasks(dataset, simulation)].map((work) => this.executor.run(work, signal)));
      return simulation;
    })();
    this.simulation = { key, ready };
    ready.catch(() => {
      if (this.simulation?.ready === ready) this.simulation = null;
    });
    return ready;
  }
}
