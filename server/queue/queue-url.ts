/**
 * The --queue URL: `redis://[:password@]host:port[/db]` or `rediss://…` (TLS), as Redis clients spell it. Parsed
 * into connection options; the password never appears in messages (displayQueueUrl).
 */
import { parameterError } from '../errors.js';

export interface QueueConnection {
  host: string;
  port: number;
  username?: string;
  password?: string;
  db: number;
  tls: boolean;
  /** the URL without its password, for messages and logs */
  display: string;
}

/** Environment variable that sends sweeps to the queue when --queue is not given. */
export const QUEUE_ENV = 'GRIDSHAKE_QUEUE';

const FORM = 'redis://[:password@]host:port[/db] or rediss://… for TLS';

/**
 * Parses a queue URL.
 * @throws GridshakeError GS_ERR_PARAMETER naming the expected form
 */
export function parseQueueUrl(text: string): QueueConnection {
  let url: URL;
  try {
    url = new URL(text);
  } catch {
    throw parameterError(`--queue must be a Redis URL (${FORM}), got ${JSON.stringify(redact(text))}`);
  }
  if (url.protocol !== 'redis:' && url.protocol !== 'rediss:') {
    throw parameterError(`--queue must start with redis:// or rediss:// (${FORM}), got ${JSON.stringify(redact(text))}`);
  }
  if (url.hostname === '') throw parameterError(`--queue needs a host (${FORM})`);
  const port = url.port === '' ? 6379 : Number(url.port);
  const dbText = url.pathname.replace(/^\//, '');
  const db = dbText === '' ? 0 : Number(dbText);
  if (!Number.isInteger(db) || db < 0 || db > 15) throw parameterError(`--queue database must be a number from 0 to 15 (${FORM}), got /${dbText}`);
  const tls = url.protocol === 'rediss:';
  const host = url.hostname.replace(/^\[(.*)\]$/, '$1');
  return {
    host,
    port,
    username: url.username === '' ? undefined : decodeURIComponent(url.username),
    password: url.password === '' ? undefined : decodeURIComponent(url.password),
    db,
    tls,
    display: `${url.protocol}//${url.hostname}:${port}/${db}`,
  };
}

/** The URL with any password replaced by ***. */
export function redact(text: string): string {
  return text.replace(/^(rediss?:\/\/)([^@/]*)@/, (_, scheme: string) => `${scheme}***@`);
}
