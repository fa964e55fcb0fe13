import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { QueueWorker } from '../../server/queue/queue-worker.js';
import { parseQueueUrl } from '../../server/queue/queue-url.js';
import { normalizePlan } from '../../server/sweeps/plan.js';
import { fixtureDataset } from '../sweeps/sweep-fixtures.js';
import { queueRunner } from './queue-helpers.js';
import { startRedis, type TestRedis } from '../bench/redis-server.js';

// A Redis with a password (`requirepass`, as the README's "Securing Redis" advises): the URL form
// redis://:PASSWORD@host:port/db reaches it from both sides; a wrong password fails the sweep within its timeout with
// a message that names the URL without any password and says to check the password.

const PASSWORD = 'long-test-secret';
let redis: TestRedis;
let worker: QueueWorker;

beforeAll(async () => {
  redis = await startRedis(undefined, ['--requirepass', PASSWORD]);
  worker = new QueueWorker({ connection: parseQueueUrl(`redis://:${PASSWORD}@127.0.0.1:${redis.port}/0`), threads: 1, log: () => undefined });
}, 60_000);

afterAll(async () => {
  await worker?.close();
  await redis?.stop();
});

describe('a Redis queue with a password', () => {
  it('runs a sweep when both sides give the password in the URL', async () => {
    const runner = queueRunner(`redis://:${PASSWORD}@127.0.0.1:${redis.port}/0`, 'password');
    try {
      const result = await runner.runSweep(fixtureDataset(1500, false), normalizePlan({ cells: [100], placements: 8, sims: 4, alpha: 0.5 }));
      expect(result.rows).toHaveLength(8);
    } finally {
      await runner.destroy();
    }
  });

  it('fails within the timeout with a wrong password, naming the URL but no password', async () => {
    const runner = queueRunner(`redis://:wrong-secret@127.0.0.1:${redis.port}/0`, 'password', { lostAfterMs: 1500 });
    try {
      const failure = (await runner.runSweep(fixtureDataset(1500, false), normalizePlan({ cells: [100], placements: 8, sims: 4, alpha: 0.5 })).catch((e) => e)) as Error;
      expect(failure.message).toMatch(new RegExp(`the Redis queue at redis://127.0.0.1:${redis.port}/0 did not answer .*and the password`));
      expect(failure.message).not.toMatch(/wrong-secret|long-test-secret/);
    } finally {
      await runner.destroy();
    }
  });
});
