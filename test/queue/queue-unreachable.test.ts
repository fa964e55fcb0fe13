import { spawn } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { createServer, type Server, type Socket } from 'node:net';
import { join } from 'node:path';
import { setTimeout as sleep } from 'node:timers/promises';
import { describe, expect, it } from 'vitest';
import { normalizePlan } from '../../server/sweeps/plan.js';
import { fixtureDataset } from '../sweeps/sweep-fixtures.js';
import { CLI, queueRunner } from './queue-helpers.js';
import { freePort, stopProcess } from '../bench/redis-server.js';

// A Redis that nothing listens on (a free loopback port), or a port that takes connections and resets them without
// an answer: a sweep sent to it fails within its timeout naming the URL without the password, a worker says so and
// retries with growing waits, and neither leaves an unhandled rejection behind. BullMQ 5 re-emits a connection's
// failed start after close() as an unhandled rejection (server/queue/queue-executor.ts) when the close comes while a
// connection attempt is under way: rare with a refused port, likely with the resetting one (each attempt lasts 300 ms).

/** A port that accepts connections, says nothing, and resets each one after `holdMs`. */
async function resettingPort(holdMs = 300): Promise<{ port: number; close(): Promise<void> }> {
  const sockets = new Set<Socket>();
  const server: Server = createServer((socket) => {
    sockets.add(socket);
    socket.on('error', () => undefined);
    socket.on('close', () => sockets.delete(socket));
    setTimeout(() => socket.resetAndDestroy(), holdMs).unref();
  });
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const address = server.address();
  return {
    port: typeof address === 'object' && address !== null ? address.port : 0,
    close: () =>
      new Promise<void>((resolve) => {
        for (const socket of sockets) socket.destroy();
        server.close(() => resolve());
      }),
  };
}

/** Collects the process's unhandled rejections while `body` runs and for `settleMs` after it. */
async function unhandledDuring(body: () => Promise<void>, settleMs = 1500): Promise<string[]> {
  const seen: string[] = [];
  const listener = (reason: unknown): void => {
    seen.push(reason instanceof Error ? reason.message : String(reason));
  };
  process.on('unhandledRejection', listener);
  try {
    await body();
    await sleep(settleMs);
  } finally {
    process.off('unhandledRejection', listener);
  }
  return seen;
}

describe('an unreachable Redis queue', () => {
  it('fails the sweep within the timeout naming the URL, and leaves no unhandled rejection', async () => {
    const uniform = fixtureDataset(3000, false);
    const refused = await freePort();
    const resetting = await resettingPort();
    try {
      const unhandled = await unhandledDuring(async () => {
        for (const [port, lostAfterMs] of [[refused, 1500], [refused, 2400], [resetting.port, 1500], [resetting.port, 1900], [resetting.port, 2400]] as const) {
          const runner = queueRunner(`redis://:secret@127.0.0.1:${port}`, 'unreachable', { lostAfterMs });
          const started = Date.now();
          try {
            const failure = (await runner.runSweep(uniform, normalizePlan({ cells: [100], placements: 8, sims: 2, alpha: 0.5 })).catch((e) => e)) as Error;
            const seconds = Math.round(lostAfterMs / 1000);
            expect(failure.message).toMatch(new RegExp(`the Redis queue at redis://127.0.0.1:${port}/0 did not answer for ${seconds} s .*check that Redis runs there`));
            expect(failure.message).not.toContain('secret');
          expect((failure as { code?: string }).code).toBe('GS_ERR_QUEUE_UNREACHABLE');
            expect(Date.now() - started).toBeLessThan(lostAfterMs + 8000);
          } finally {
            await runner.destroy();
          }
        }
      });
      expect(unhandled).toEqual([]);
    } finally {
      await resetting.close();
    }
  });

  it('`gridshake sweep --queue` exits with a one-line message and no stack trace', async () => {
    const port = await freePort();
    const folder = mkdtempSync(join(tmpdir(), 'gridshake-unreachable-'));
    const points = join(folder, 'points.csv');
    writeFileSync(points, `x,y\n${Array.from({ length: 200 }, (_, k) => `${(k * 37) % 1000},${(k * 53) % 1000}`).join('\n')}\n`);
    const child = spawn(process.execPath, [CLI, 'sweep', '--points', points, '--crs', 'planar', '--cells', '200', '--placements', '4', '--queue', `redis://127.0.0.1:${port}`, '--out', join(folder, 'out')], {
      env: { ...process.env, GRIDSHAKE_QUEUE: '', GRIDSHAKE_QUEUE_TIMEOUT: '2' },
      stdio: ['ignore', 'ignore', 'pipe'],
    });
    let stderr = '';
    child.stderr?.on('data', (data: Buffer) => {
      stderr += data.toString('utf8');
    });
    const code = await new Promise<number | null>((resolve) => child.once('exit', resolve));
    expect(code, stderr).not.toBe(0);
    expect(stderr).toMatch(new RegExp(`the Redis queue at redis://127.0.0.1:${port}/0 did not answer for 2 s`));
    // one line: a late unhandled rejection would add a second "gridshake: unexpected error" line (bin/gridshake.js)
    expect(stderr.trim().split('\n'), stderr).toHaveLength(1);
    expect(stderr).toMatch(/^gridshake: the Redis queue at /);
    expect(stderr).not.toMatch(/\n\s+at |Unhandled|unhandled/);
  }, 90_000);

  it.each(['refused', 'reset'] as const)('`gridshake worker` (connections %s) says so, retries with growing waits, and stops on SIGTERM without an unhandled rejection', async (kind) => {
    const resetting = kind === 'reset' ? await resettingPort() : null;
    const port = resetting?.port ?? (await freePort());
    const child = spawn(process.execPath, [CLI, 'worker', '--queue', `redis://127.0.0.1:${port}`, '--threads', '1'], {
      env: { ...process.env, GRIDSHAKE_QUEUE: '' },
      stdio: ['ignore', 'ignore', 'pipe'],
    });
    let stderr = '';
    child.stderr?.on('data', (data: Buffer) => {
      stderr += data.toString('utf8');
    });
    const retries = (): string[] => stderr.split('\n').filter((line) => line.includes(`cannot reach the Redis queue at redis://127.0.0.1:${port}/0`));
    try {
      // a deadline, not a count: starting node takes seconds on a loaded machine
      const deadline = Date.now() + 45_000;
      while (Date.now() < deadline && retries().length < 3 && child.exitCode === null) await sleep(100);
      const waits = retries().map((line) => Number(/retrying in ([\d.]+) s/.exec(line)?.[1]));
      expect(waits.length, stderr).toBeGreaterThanOrEqual(3);
      expect(waits[1]).toBeGreaterThan(waits[0] as number);
      expect(waits[2]).toBeGreaterThan(waits[1] as number);
    } finally {
      await stopProcess(child, 'SIGTERM');
      await resetting?.close();
    }
    // an unhandled rejection would end the process with code 1 and "gridshake: unexpected error" (bin/gridshake.js)
    expect(child.exitCode, stderr).toBe(0);
    expect(stderr).toMatch(/stopped after 0 tasks/);
    expect(stderr).not.toMatch(/unexpected error|\n\s+at |Unhandled|unhandled/);
  }, 90_000);
});
