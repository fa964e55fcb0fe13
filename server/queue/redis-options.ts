/**
 * ioredis connection options for a parsed --queue URL, with the reconnect backoff: 0.25 s doubling up to
 * `maxDelayMs` (10 s for workers; the server uses 1 s, well inside its lost-connection timeout, so that a sweep
 * started just after Redis came back finds it). `onRetry` hears each wait, so a worker can say it is retrying.
 */
import type { RedisOptions } from 'ioredis';
import type { QueueConnection } from './queue-url.js';

export const MAX_RETRY_DELAY_MS = 10_000;

export function retryDelay(attempt: number, maxDelayMs = MAX_RETRY_DELAY_MS): number {
  return Math.min(maxDelayMs, 250 * 2 ** Math.min(attempt - 1, 10));
}

export function redisOptions(
  connection: QueueConnection,
  onRetry?: (attempt: number, delayMs: number) => void,
  maxDelayMs = MAX_RETRY_DELAY_MS,
): RedisOptions {
  return {
    host: connection.host,
    port: connection.port,
    username: connection.username,
    password: connection.password,
    db: connection.db,
    tls: connection.tls ? { servername: connection.host } : undefined,
    // BullMQ's blocking connections require it; our own commands are bounded by the executor's watchdog instead
    maxRetriesPerRequest: null,
    connectTimeout: 5_000,
    retryStrategy: (attempt: number) => {
      const delay = retryDelay(attempt, maxDelayMs);
      onRetry?.(attempt, delay);
      return delay;
    },
  };
}
