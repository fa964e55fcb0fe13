/**
 * The --queue option shared by `sweep`, `serve` and `worker`, with GRIDSHAKE_QUEUE as its fallback: the Redis URL
 * whose queue runs the sweep's tasks instead of the local pool.
 */
import type { OptionSpec, OptionValues } from './args.js';
import { optionalString } from './args.js';
import { parseQueueUrl, QUEUE_CA_ENV, QUEUE_ENV, type QueueConnection } from '../queue/queue-url.js';

export const QUEUE_OPTION: Record<'queue', OptionSpec> = {
  queue: {
    type: 'string',
    value: 'URL',
    description: `send the tasks to the Redis queue redis://[:password@]host:port[/db] (rediss:// for TLS; $${QUEUE_CA_ENV} names a private CA's PEM file); default $${QUEUE_ENV}, else the local pool`,
  },
};

/** The queue connection from --queue or GRIDSHAKE_QUEUE, or null for the local pool. */
export function queueFromOptions(values: OptionValues, env: Record<string, string | undefined> = process.env): QueueConnection | null {
  const text = optionalString(values, 'queue') ?? env[QUEUE_ENV];
  if (text === undefined || text === '') return null;
  return parseQueueUrl(text, env);
}
