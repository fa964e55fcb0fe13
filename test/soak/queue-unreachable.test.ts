import { describe, expect, it } from 'vitest';
import { normalizePlan } from '../../server/sweeps/plan.js';
import { fixtureDataset } from '../sweeps/sweep-fixtures.js';
import { queueRunner } from '../queue/queue-helpers.js';
import { freePort } from '../bench/redis-server.js';

// A sweep sent to a Redis queue that nobody listens on fails within its timeout, naming the URL without the password.
// Kept out of CI for now: in 1 of 6 whole-suite runs an ECONNREFUSED from the Redis client surfaced as an unhandled
// rejection after this test (not yet traced; see the README's "Beyond one machine").
describe('queue faults (soak)', () => {
  it('fails within the timeout naming the URL when Redis is unreachable', async () => {
    const uniform = fixtureDataset(3000, false);
    const port = await freePort();
    const runner = queueRunner(`redis://:secret@127.0.0.1:${port}`, 'unreachable', { lostAfterMs: 1500 });
    const started = Date.now();
    try {
      const failure = (await runner.runSweep(uniform, normalizePlan({ cells: [100], placements: 8, sims: 2, alpha: 0.5 })).catch((e) => e)) as Error;
      expect(failure.message).toMatch(new RegExp(`the Redis queue at redis://127.0.0.1:${port}/0 did not answer for 2 s .*check that Redis runs there`));
      expect(failure.message).not.toContain('secret');
      expect(Date.now() - started).toBeLessThan(10_000);
    } finally {
      await runner.destroy();
    }
  });
});
