import { spawn } from 'node:child_process';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { GridshakeError } from '../../server/errors.js';
import { parseQueueUrl } from '../../server/queue/queue-url.js';
import { normalizePlan } from '../../server/sweeps/plan.js';
import { SweepPool } from '../../server/sweeps/sweep-pool.js';
import { fixtureDataset } from '../sweeps/sweep-fixtures.js';
import { stopProcess, type TestRedis } from '../bench/redis-server.js';
import { CLI, keptFiles, queueRunner, startWorker, type WorkerProcess } from './queue-helpers.js';
import { makeCertificates, startTlsRedis, type TestCertificates } from './tls-redis.js';

// rediss:// (TLS) end to end: a Redis that listens on a TLS port only (its certificate signed by a throw-away
// authority made here with openssl), a `gridshake worker` process and the executor both given that authority in
// GRIDSHAKE_QUEUE_CA. The sweep's files equal the local pool's byte for byte. A certificate the client does not trust
// (another authority, or none beyond the system's) fails the sweep at once, well inside the 20 s lost-connection
// timeout, with GS_ERR_QUEUE_UNREACHABLE and a message that names the URL and GRIDSHAKE_QUEUE_CA.

let certificates: TestCertificates;
let redis: TestRedis;
let worker: WorkerProcess;
let expected: ReturnType<typeof keptFiles>;
const dataset = fixtureDataset(2000, true);
const plan = normalizePlan({ cells: [60, 110], placements: 96, sims: 19, seed: 5 });

beforeAll(async () => {
  certificates = makeCertificates();
  redis = await startTlsRedis(certificates);
  worker = await startWorker(redis.url, 1, { GRIDSHAKE_QUEUE_CA: certificates.ca });
  const local = new SweepPool({ threads: 1 });
  try {
    expected = keptFiles(await local.runSweep(dataset, plan));
  } finally {
    await local.destroy();
  }
}, 120_000);

afterAll(async () => {
  await worker?.stop();
  await redis?.stop();
  certificates?.remove();
});

async function failureOf(ca: string | null): Promise<{ error: GridshakeError; seconds: number }> {
  const runner = queueRunner(redis.url, 'tls-untrusted', { env: ca === null ? {} : { GRIDSHAKE_QUEUE_CA: ca } });
  const started = Date.now();
  try {
    const error = (await runner.runSweep(dataset, plan).catch((e: unknown) => e)) as GridshakeError;
    return { error, seconds: (Date.now() - started) / 1000 };
  } finally {
    await runner.destroy();
  }
}

describe('a Redis queue over TLS (rediss://)', () => {
  it("gives the local pool's placements.csv and summary.json with the authority in GRIDSHAKE_QUEUE_CA", async () => {
    const runner = queueRunner(redis.url, 'tls', { env: { GRIDSHAKE_QUEUE_CA: certificates.ca } });
    try {
      const result = await runner.runSweep(dataset, plan);
      expect(result.summary.versions.executor).toBe('redis queue');
      expect(keptFiles(result)).toEqual(expected);
    } finally {
      await runner.destroy();
    }
  }, 120_000);

  for (const [name, ca] of [['another authority', 'other'], ['only the system authorities', null]] as const) {
    it(`fails at once with a coded message naming the URL and GRIDSHAKE_QUEUE_CA when trusting ${name}`, async () => {
      const { error, seconds } = await failureOf(ca === null ? null : certificates.otherCa);
      expect(error).toBeInstanceOf(GridshakeError);
      expect(error.code).toBe('GS_ERR_QUEUE_UNREACHABLE');
      expect(error.message).toContain(`the Redis queue at rediss://127.0.0.1:${redis.port}/0 cannot be used: Redis's TLS certificate was not accepted (`);
      expect(error.message).toMatch(/\((SELF_SIGNED_CERT_IN_CHAIN|UNABLE_TO_VERIFY_LEAF_SIGNATURE|UNABLE_TO_GET_ISSUER_CERT_LOCALLY): /);
      expect(error.message).toContain('GRIDSHAKE_QUEUE_CA');
      // bounded: a certificate error is not waited out like a Redis that does not answer (20 s by default)
      expect(seconds).toBeLessThan(10);
    }, 60_000);
  }

  it('a worker that does not trust the certificate says what to give, and keeps retrying', async () => {
    const child = spawn(process.execPath, [CLI, 'worker', '--queue', redis.url, '--threads', '1'], {
      env: { ...process.env, GRIDSHAKE_QUEUE_CA: certificates.otherCa },
      stdio: ['ignore', 'ignore', 'pipe'],
    });
    let text = '';
    child.stderr?.on('data', (data: Buffer) => {
      text += data.toString('utf8');
    });
    try {
      await expect.poll(() => (text.match(/retrying in/g) ?? []).length, { timeout: 20_000, interval: 100 }).toBeGreaterThanOrEqual(2);
      expect(text).toContain(`cannot reach the Redis queue at rediss://127.0.0.1:${redis.port}/0 (Redis's TLS certificate was not accepted`);
      expect(text).toContain('GRIDSHAKE_QUEUE_CA');
      expect(text).not.toContain('connected to');
    } finally {
      await stopProcess(child);
    }
  }, 60_000);

  it('refuses a GRIDSHAKE_QUEUE_CA that is missing or holds no certificate, naming the file', () => {
    const missing = `${certificates.folder}/no-such.crt`;
    expect(() => parseQueueUrl(redis.url, { GRIDSHAKE_QUEUE_CA: missing })).toThrow(
      expect.objectContaining({ code: 'GS_ERR_PARAMETER', message: expect.stringContaining(`GRIDSHAKE_QUEUE_CA names ${missing}, which cannot be read (ENOENT)`) }),
    );
    const key = `${certificates.folder}/ca.key`;
    expect(() => parseQueueUrl(redis.url, { GRIDSHAKE_QUEUE_CA: key })).toThrow(
      expect.objectContaining({ code: 'GS_ERR_PARAMETER', message: expect.stringContaining(`GRIDSHAKE_QUEUE_CA names ${key}, which holds no PEM certificate`) }),
    );
    // a plain redis:// URL does not read it
    expect(parseQueueUrl(`redis://127.0.0.1:${redis.port}/0`, { GRIDSHAKE_QUEUE_CA: missing }).ca).toBeUndefined();
  });
});
