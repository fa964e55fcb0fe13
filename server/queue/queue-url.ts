/**
 * The --queue URL: `redis://[:password@]host:port[/db]` or `rediss://…` (TLS), as Redis clients spell it. Parsed
 * into connection options; the password never appears in messages (redact, `display`). For rediss:// the
 * environment variable GRIDSHAKE_QUEUE_CA may name a PEM file of the certificate authority that signed Redis's
 * certificate (a private one); it is trusted besides the system's authorities, and read here so that a missing or
 * wrong file is refused before anything connects.
 */
import { readFileSync } from 'node:fs';
import { parameterError } from '../errors.js';

export interface QueueConnection {
  host: string;
  port: number;
  username?: string;
  password?: string;
  db: number;
  tls: boolean;
  /** for rediss://: the PEM text of GRIDSHAKE_QUEUE_CA, trusted besides the system's authorities */
  ca?: string;
  /** the URL without its password, for messages and logs */
  display: string;
}

/** Environment variable that sends sweeps to the queue when --queue is not given. */
export const QUEUE_ENV = 'GRIDSHAKE_QUEUE';

/** Environment variable naming a PEM file of the certificate authority to trust for rediss:// URLs. */
export const QUEUE_CA_ENV = 'GRIDSHAKE_QUEUE_CA';

const FORM = 'redis://[:password@]host:port[/db] or rediss://… for TLS';

/**
 * Parses a queue URL (with GRIDSHAKE_QUEUE_CA from `env` for rediss://).
 * @throws GridshakeError GS_ERR_PARAMETER naming the expected form, or the CA file that cannot serve
 */
export function parseQueueUrl(text: string, env: Record<string, string | undefined> = process.env): QueueConnection {
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
  const caFile = env[QUEUE_CA_ENV];
  return {
    ...(tls && caFile !== undefined && caFile !== '' ? { ca: readCertificateAuthority(caFile) } : {}),
    host,
    port,
    username: url.username === '' ? undefined : decodeURIComponent(url.username),
    password: url.password === '' ? undefined : decodeURIComponent(url.password),
    db,
    tls,
    display: `${url.protocol}//${url.hostname}:${port}/${db}`,
  };
}

/** The PEM text of a certificate authority file, refused with a message naming the file when it cannot serve. */
function readCertificateAuthority(file: string): string {
  let text: string;
  try {
    text = readFileSync(file, 'utf8');
  } catch (error) {
    const reason = error instanceof Error && 'code' in error ? String(error.code) : 'unreadable';
    throw parameterError(`${QUEUE_CA_ENV} names ${file}, which cannot be read (${reason}); give the PEM file of the certificate authority that signed Redis's certificate`);
  }
  if (!text.includes('-----BEGIN CERTIFICATE-----')) {
    throw parameterError(`${QUEUE_CA_ENV} names ${file}, which holds no PEM certificate (-----BEGIN CERTIFICATE-----); give the certificate authority's certificate, not its key`);
  }
  return text;
}

/** The URL with any password replaced by ***. */
export function redact(text: string): string {
  return text.replace(/^(rediss?:\/\/)([^@/]*)@/, (_, scheme: string) => `${scheme}***@`);
}
