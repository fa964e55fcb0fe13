/**
 * The queue executor: a sweep's chunk tasks go to a BullMQ queue on Redis, and any number of `gridshake worker`
 * processes on any machines take them (queue-worker.ts). The dataset travels once, stored under its content hash
 * with an expiry; a task carries parameters only; a result comes back as raw float64 bytes under a key read once.
 * Workers draw the simulated CSR patterns themselves from the seed, so the results are the local pool's, bit for bit.
 *
 * Failure handling: each task may be tried 3 times (attempts), a worker killed mid-task has its task taken again
 * after BullMQ's stall detection, a parameter error fails at once; while Redis does not answer for `lostAfterMs`
 * the tasks in flight reject with a message naming the URL, and cancelled tasks are removed from Redis (a task a
 * worker holds is waited for, then its result deleted).
 *
 * Connections: the executor's own ioredis client connects first; BullMQ's Queue and QueueEvents are made only once it
 * has answered (startBullmq). BullMQ 5 re-emits a connection's failed start as an 'error' after close() removed every
 * listener, which surfaces as an unhandled ECONNREFUSED rejection when a Queue made against an unreachable Redis is
 * closed while a reconnect is under way; made after Redis answered, and told not to wait for their own first answer
 * (skipWaitingForReady, skipVersionCheck: the version is checked here), their start cannot fail.
 */
import { createRequire } from 'node:module';
import { randomBytes } from 'node:crypto';
import { setTimeout as sleep } from 'node:timers/promises';
import { Queue, QueueEvents, RedisConnection } from 'bullmq';
import { Redis } from 'ioredis';
import type { Dataset } from '../../shared/contracts.js';
import type { ChunkWork, DatasetRef, SimulateWork, SimulationRef, SweepExecutor } from '../sweeps/executor.js';
import { shareDataset } from '../sweeps/shared-dataset.js';
import { queueUnreachableError } from '../errors.js';
import { sweepCancelledError } from '../sweeps/sweep-errors.js';
import { packDataset } from './queue-dataset.js';
import { BULL_PREFIX, datasetKey, resultKey, TASK_QUEUE } from './queue-keys.js';
import { certificateAdvice, redisOptions } from './redis-options.js';
import { decodeResult, encodePlacements, TASK_FORMAT, type QueueTaskData } from './task-codec.js';
import type { QueueConnection } from './queue-url.js';

const BULLMQ_VERSION = (createRequire(import.meta.url)('bullmq/package.json') as { version: string }).version;

/** Tries of one task before its sweep fails with the last worker's message. */
export const TASK_ATTEMPTS = 3;

/** How long a dataset stays in Redis after the last sweep that used it (seconds). */
export const DATASET_TTL_SECONDS = 7 * 24 * 3600;

/** How long a result waits in Redis for a server that went away (seconds). */
export const RESULT_TTL_SECONDS = 3600;

/** Default time without an answer from Redis after which the sweep fails (GRIDSHAKE_QUEUE_TIMEOUT, seconds). */
export const DEFAULT_LOST_AFTER_SECONDS = 20;

export interface QueueExecutorOptions {
  connection: QueueConnection;
  /** this server's or data folder's key prefix (queue-keys.ts) */
  prefix: string;
  /** tasks in Redis at once per sweep; default 64 */
  maxInFlight?: number;
  /** default GRIDSHAKE_QUEUE_TIMEOUT seconds or DEFAULT_LOST_AFTER_SECONDS */
  lostAfterMs?: number;
  /** messages for the user: waiting for a worker, a worker connected */
  onNotice?: (message: string) => void;
}

interface PendingTask {
  jobId: string;
  added: Promise<unknown>;
  cancelled: boolean;
  resolve(result: Float64Array): void;
  reject(error: unknown): void;
}

interface Waiter {
  started: number;
  reject(error: unknown): void;
}

/** The lost-connection timeout from GRIDSHAKE_QUEUE_TIMEOUT (seconds) or the default. */
export function lostAfterFromEnv(env: Record<string, string | undefined> = process.env): number {
  const value = Number(env.GRIDSHAKE_QUEUE_TIMEOUT);
  return (Number.isFinite(value) && value > 0 ? value : DEFAULT_LOST_AFTER_SECONDS) * 1000;
}

export class QueueExecutor implements SweepExecutor {
  readonly name = 'redis queue';
  readonly simulatesInWorkers = true;
  readonly maxInFlight: number;
  readonly threads: number;
  readonly versions: Record<string, string> = { bullmq: BULLMQ_VERSION };
  readonly display: string;
  private readonly prefix: string;
  private readonly lostAfterMs: number;
  private readonly connection: QueueConnection;
  private readonly redis: Redis;
  private bullmq: { queue: Queue; events: QueueEvents } | null = null;
  private readyWait: Promise<void> | null = null;
  private readonly pending = new Map<string, PendingTask>();
  private readonly waiters = new Set<Waiter>();
  private readonly runId = randomBytes(6).toString('hex');
  private readonly watchdog: NodeJS.Timeout;
  private readonly onNotice: (message: string) => void;
  private started: Promise<void> | null = null;
  private nextJob = 0;
  private notReadySince: number | null = null;
  private lastError = 'no answer';
  /** what to do about Redis's TLS certificate when the last connection failed its check, else null */
  private certificateError: string | null = null;
  private closed = false;

  constructor(options: QueueExecutorOptions) {
    this.display = options.connection.display;
    this.prefix = options.prefix;
    this.maxInFlight = options.maxInFlight ?? 64;
    this.threads = this.maxInFlight;
    this.lostAfterMs = options.lostAfterMs ?? lostAfterFromEnv();
    this.onNotice = options.onNotice ?? (() => undefined);
    this.connection = options.connection;
    this.redis = new Redis({ ...redisOptions(options.connection, undefined, 1000), lazyConnect: true });
    this.redis.on('error', (error: Error) => {
      this.lastError = error.message;
      this.certificateError = certificateAdvice(error);
    });
    this.redis.on('ready', () => {
      this.certificateError = null;
    });
    this.watchdog = setInterval(() => this.checkConnection(), 250);
    this.watchdog.unref();
  }

  /** Uploads the dataset once per content hash (or refreshes its expiry), then waits until a worker is connected. */
  async share(dataset: Dataset, ref: DatasetRef, signal: AbortSignal): Promise<void> {
    await this.guarded(this.start());
    const key = datasetKey(this.prefix, ref.hash);
    const refreshed = await this.guarded(this.redis.expire(key, DATASET_TTL_SECONDS));
    if (refreshed !== 1) {
      const shared = shareDataset(dataset, ref.key);
      await this.guarded(this.redis.set(key, packDataset(shared), 'EX', DATASET_TTL_SECONDS));
    }
    await this.waitForWorkers(signal);
  }

  run(work: ChunkWork, signal: AbortSignal): Promise<Float64Array>;
  run(work: SimulateWork, signal: AbortSignal): Promise<number>;
  run(work: ChunkWork | SimulateWork, signal: AbortSignal): Promise<Float64Array | number> {
    if (work.kind !== 'chunk') return Promise.reject(new Error('the queue executor draws simulated patterns in its workers'));
    if (signal.aborted) return Promise.reject(sweepCancelledError());
    const jobId = `${this.prefix}-${this.runId}-${++this.nextJob}`;
    const data: QueueTaskData = {
      format: TASK_FORMAT,
      prefix: this.prefix,
      dataset: work.dataset.hash,
      pointCount: work.dataset.pointCount,
      seed: work.simulation?.seed ?? 0,
      sims: work.simulation?.sims ?? 0,
      cellSize: work.cellSize,
      ...(work.shape === undefined || work.shape === 'square' ? {} : { shape: work.shape }),
      minCoverage: work.minCoverage,
      alpha: work.alpha,
      placements: encodePlacements(work.placements),
      ...(work.stability === undefined ? {} : { stability: work.stability }),
    };
    const result = new Promise<Float64Array>((resolve, reject) => {
      const task: PendingTask = { jobId, added: Promise.resolve(), cancelled: false, resolve, reject };
      this.pending.set(jobId, task);
      task.added = this.bullQueue()
        .add('chunk', data, { jobId, attempts: TASK_ATTEMPTS, removeOnComplete: true, removeOnFail: true })
        .catch((error: unknown) => {
          this.pending.delete(jobId);
          reject(error);
        });
      const onAbort = (): void => {
        void this.cancel(task);
      };
      signal.addEventListener('abort', onAbort, { once: true });
      const settled = (): void => signal.removeEventListener('abort', onAbort);
      task.resolve = (value) => {
        settled();
        resolve(value);
      };
      task.reject = (error) => {
        settled();
        reject(error);
      };
    });
    return this.guarded(result);
  }

  release(_simulation: SimulationRef): void {
    // the workers keep one simulation each and replace it with the next
  }

  /** Tasks this server still has in Redis (waiting, held by a worker, or cancelled and not yet cleaned up). */
  get tasksInFlight(): number {
    return this.pending.size;
  }

  async destroy(): Promise<void> {
    this.closed = true;
    clearInterval(this.watchdog);
    const quit = async (close: () => Promise<unknown>): Promise<void> => {
      await Promise.race([close().catch(() => undefined), sleep(2000, undefined, { ref: false })]);
    };
    const bullmq = this.bullmq;
    if (bullmq !== null) await Promise.all([quit(() => bullmq.events.close()), quit(() => bullmq.queue.close())]);
    // quit answers at once when the client is not connected; disconnect stops its reconnect timer in every state
    await quit(() => this.redis.quit());
    this.redis.disconnect();
  }

  /** Connects (once Redis answers) and makes BullMQ's queue and event reader; a failed start is tried again by the next sweep. */
  private start(): Promise<void> {
    this.started ??= (async () => {
      if (this.redis.status === 'wait') {
        // a refused first connection is retried by the client itself (retryStrategy); the watchdog bounds the wait
        this.redis.connect().catch((error: Error) => {
          this.lastError = error.message;
        });
      }
      await this.whenReady();
      if (this.bullmq === null && !this.closed) await this.startBullmq();
    })();
    this.started.catch(() => {
      this.started = null;
    });
    return this.started;
  }

  /** Resolves when the executor's own client is connected and has answered its ready check. */
  private whenReady(): Promise<void> {
    if (this.redis.status === 'ready') return Promise.resolve();
    this.readyWait ??= new Promise<void>((resolve) => {
      this.redis.once('ready', () => {
        this.readyWait = null;
        resolve();
      });
    });
    return this.readyWait;
  }

  /** BullMQ's Queue and QueueEvents, made once the executor's own client has answered (see the file comment). */
  private async startBullmq(): Promise<void> {
    const info = await this.redis.info('server');
    const version = /^redis_version:(\S+)/m.exec(info)?.[1] ?? '0';
    if (versionBelow(version, RedisConnection.minimumVersion)) {
      throw new Error(`the Redis at ${this.display} is version ${version}; BullMQ needs ${RedisConnection.minimumVersion} or newer (Redis 7 recommended)`);
    }
    if (this.bullmq !== null || this.closed) return;
    const options = { connection: redisOptions(this.connection, undefined, 1000), prefix: BULL_PREFIX, skipWaitingForReady: true, skipVersionCheck: true };
    const queue = new Queue(TASK_QUEUE, options);
    queue.on('error', (error: Error) => {
      this.lastError = error.message;
    });
    // read the event stream from its present end, however late the reader's first XREAD reaches Redis
    const last = await this.redis.xrevrange(queue.keys.events, '+', '-', 'COUNT', 1).catch(() => []);
    const events = new QueueEvents(TASK_QUEUE, { ...options, autorun: false, lastEventId: last[0]?.[0] ?? '0' });
    events.on('error', (error: Error) => {
      this.lastError = error.message;
    });
    events.on('completed', ({ jobId }) => this.completed(jobId));
    events.on('failed', ({ jobId, failedReason }) => this.failed(jobId, failedReason));
    events.run().catch((error: Error) => {
      this.lastError = error.message;
    });
    this.bullmq = { queue, events };
  }

  private bullQueue(): Queue {
    if (this.bullmq === null) throw new Error('the queue executor was used before share()');
    return this.bullmq.queue;
  }

  private async waitForWorkers(signal: AbortSignal): Promise<void> {
    let told = false;
    for (;;) {
      const workers = await this.guarded(this.bullQueue().getWorkersCount());
      if (workers > 0) {
        if (told) this.onNotice(`a worker connected to ${this.display}; sending tasks`);
        return;
      }
      if (!told) {
        this.onNotice(`waiting for a worker to connect to ${this.display} (start one with: gridshake worker --queue <URL>)`);
        told = true;
      }
      await sleep(1000, undefined, { signal }).catch(() => {
        throw sweepCancelledError();
      });
    }
  }

  /** Removes a cancelled task from Redis; a task a worker holds is waited for and its result deleted (completed). */
  private async cancel(task: PendingTask): Promise<void> {
    task.cancelled = true;
    await task.added;
    if (!this.pending.has(task.jobId)) return;
    const removed = await this.bullQueue().remove(task.jobId).catch(() => 0);
    if (removed === 1) {
      this.pending.delete(task.jobId);
      task.reject(sweepCancelledError());
    }
  }

  private completed(jobId: string): void {
    const task = this.pending.get(jobId);
    if (task === undefined) return;
    const key = resultKey(this.prefix, jobId);
    this.redis
      .multi()
      .getBuffer(key)
      .del(key)
      .exec()
      .then((replies) => {
        this.pending.delete(jobId);
        if (task.cancelled) return task.reject(sweepCancelledError());
        const [error, bytes] = replies?.[0] ?? [new Error('no reply'), null];
        if (error !== null || !(bytes instanceof Buffer)) throw error ?? new Error(`the result of task ${jobId} is missing from Redis`);
        task.resolve(decodeResult(bytes));
      })
      .catch((error: unknown) => {
        this.pending.delete(jobId);
        task.reject(error);
      });
  }

  private failed(jobId: string, reason: string): void {
    const task = this.pending.get(jobId);
    if (task === undefined) return;
    this.pending.delete(jobId);
    task.reject(task.cancelled ? sweepCancelledError() : new Error(reason));
  }

  /**
   * Rejects `promise` when Redis has not answered for lostAfterMs while it waits, or at once (next watchdog tick)
   * when Redis's TLS certificate failed its check: retrying cannot help there.
   */
  private guarded<T>(promise: Promise<T>): Promise<T> {
    return new Promise<T>((resolve, reject) => {
      const waiter: Waiter = { started: Date.now(), reject };
      this.waiters.add(waiter);
      promise.then(resolve, reject).finally(() => this.waiters.delete(waiter));
    });
  }

  private checkConnection(): void {
    if (this.closed) return;
    if (this.redis.status === 'ready' || this.started === null) {
      this.notReadySince = null;
      return;
    }
    const now = Date.now();
    this.notReadySince ??= now;
    const advice = this.certificateError;
    for (const waiter of [...this.waiters]) {
      const waited = now - Math.max(this.notReadySince, waiter.started);
      if (advice === null && waited < this.lostAfterMs) continue;
      this.waiters.delete(waiter);
      waiter.reject(advice === null ? this.lostError() : this.untrustedError(advice));
    }
    // the tasks in flight are abandoned: their ids are forgotten, and Redis (when back) drops finished ones itself
    const givenUp = advice !== null || now - this.notReadySince >= this.lostAfterMs;
    if (this.waiters.size === 0 && this.pending.size > 0 && givenUp) this.pending.clear();
  }

  private untrustedError(advice: string): Error {
    return queueUnreachableError(`the Redis queue at ${this.display} cannot be used: ${advice}; the sweep was stopped`);
  }

  private lostError(): Error {
    const seconds = Math.round(this.lostAfterMs / 1000);
    return queueUnreachableError(
      `the Redis queue at ${this.display} did not answer for ${seconds} s (${this.lastError}); check that Redis runs there, ` +
        'that this machine can reach it (address, port, firewall, TLS) and the password; the sweep was stopped',
    );
  }
}

/** Whether the dotted version `version` is below `minimum` (numeric parts compared left to right). */
function versionBelow(version: string, minimum: string): boolean {
  const a = version.split('.').map(Number);
  const b = minimum.split('.').map(Number);
  for (let k = 0; k < Math.max(a.length, b.length); k++) {
    const x = a[k] ?? 0;
    const y = b[k] ?? 0;
    if (x !== y) return x < y;
  }
  return false;
}
