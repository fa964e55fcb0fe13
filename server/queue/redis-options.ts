/**
 * ioredis connection options for a parsed --queue URL, with the reconnect backoff: 0.25 s doubling up to
 * `maxDelayMs` (10 s for workers; the server uses 1 s, well inside its lost-connection timeout, so that a sweep
 * started just after Redis came back finds it). `onRetry` hears each wait, so a worker can say it is retrying.
 */
import { isIP } from 'node:net';
import { rootCertificates } from 'node:tls';
import type { RedisOptions } from 'ioredis';
import { QUEUE_CA_ENV, type QueueConnection } from './queue-url.js';

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
    tls: connection.tls ? tlsOptions(connection) : undefined,
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

/**
 * TLS options of a rediss:// connection: the server's certificate is checked against the system's authorities and
 * GRIDSHAKE_QUEUE_CA's (Node's `ca` would otherwise replace the system's); SNI only for a host name (RFC 6066
 * section 3 forbids an IP address there).
 */
function tlsOptions(connection: QueueConnection): NonNullable<RedisOptions['tls']> {
  return {
    ...(isIP(connection.host) === 0 ? { servername: connection.host } : {}),
    ...(connection.ca === undefined ? {} : { ca: [...rootCertificates, connection.ca] }),
  };
}

/** Node's codes for a certificate that did not verify (node:tls, OpenSSL X509_V_ERR_* names). */
const CERTIFICATE_CODES = new Set([
  'SELF_SIGNED_CERT_IN_CHAIN',
  'DEPTH_ZERO_SELF_SIGNED_CERT',
  'UNABLE_TO_VERIFY_LEAF_SIGNATURE',
  'UNABLE_TO_GET_ISSUER_CERT',
  'UNABLE_TO_GET_ISSUER_CERT_LOCALLY',
  'CERT_HAS_EXPIRED',
  'CERT_NOT_YET_VALID',
  'CERT_SIGNATURE_FAILURE',
  'CERT_UNTRUSTED',
  'CERT_REJECTED',
  'CERT_REVOKED',
  'ERR_TLS_CERT_ALTNAME_INVALID',
]);

/**
 * For an error that is a failed check of Redis's TLS certificate, what to do about it; otherwise null. Such an
 * error does not go away by retrying, so the executor fails its sweep at once rather than after its timeout.
 */
export function certificateAdvice(error: unknown): string | null {
  const code = typeof error === 'object' && error !== null && 'code' in error ? String(error.code) : '';
  if (!CERTIFICATE_CODES.has(code)) return null;
  return (
    `Redis's TLS certificate was not accepted (${code}: ${(error as Error).message}); give the PEM file of the ` +
    `certificate authority that signed it in ${QUEUE_CA_ENV} (on this machine and on every worker), and check that ` +
    "the URL's host is a name or address the certificate carries"
  );
}
