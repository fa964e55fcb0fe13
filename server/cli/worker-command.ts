/**
 * `gridshake worker --queue URL [--threads N]`: takes sweep tasks from a Redis queue until stopped (server/queue).
 * It connects out to Redis only and listens on no port. SIGTERM or SIGINT: the tasks in hand are finished, then it
 * exits; a second signal exits at once.
 */
import { parameterError } from '../errors.js';
import { QUEUE_ENV } from '../queue/queue-url.js';
import { optionalString, parseWholeNumber, type OptionSpecs, type OptionValues } from './args.js';
import type { CliCommand, CliIo } from './cli-command.js';
import { QUEUE_OPTION, queueFromOptions } from './queue-option.js';
import { untilSignal } from './until-signal.js';

const OPTIONS: OptionSpecs = {
  ...QUEUE_OPTION,
  threads: { type: 'string', value: 'N', description: 'worker threads, tasks run at once; default one per core' },
};

async function run(values: OptionValues, io: CliIo): Promise<number> {
  const connection = queueFromOptions(values);
  if (connection === null) throw parameterError(`gridshake worker needs --queue redis://[:password@]host:port[/db] (or ${QUEUE_ENV})`);
  const threadsText = optionalString(values, 'threads');
  const threads = threadsText === undefined ? undefined : parseWholeNumber(threadsText, 'threads', 1);
  const log = (line: string): void => io.stderr(`gridshake worker: ${line}\n`);
  const { QueueWorker } = await import('../queue/queue-worker.js');
  const worker = new QueueWorker({ connection, threads, log });
  log(`connecting to ${connection.display} with ${worker.threads} threads`);
  const signal = await untilSignal();
  log(`${signal}: finishing the tasks in hand (${signal} again stops at once)`);
  const again = (): void => process.exit(143);
  process.once('SIGINT', again);
  process.once('SIGTERM', again);
  await worker.close();
  log(`stopped after ${worker.completed} tasks`);
  return 0;
}

export const workerCommand: CliCommand = {
  name: 'worker',
  summary: 'take sweep tasks from a Redis queue (for sweeps over several machines)',
  usage: 'Usage: gridshake worker --queue redis://[:password@]host:port[/db] [--threads N]',
  options: OPTIONS,
  run,
};
