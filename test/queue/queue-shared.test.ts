import { readFileSync, readdirSync, readlinkSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Dataset } from '../../shared/contracts.js';
import { normalizePlan } from '../../server/sweeps/plan.js';
import { SweepPool } from '../../server/sweeps/sweep-pool.js';
import { fixtureDataset } from '../sweeps/sweep-fixtures.js';
import { keptFiles, queueRunner, startWorker, type WorkerProcess } from './queue-helpers.js';
import { redisKeys, startRedis, type TestRedis } from '../bench/redis-server.js';

// Several servers on one Redis (each with its own key prefix, as `serve --queue` derives it from the data folder)
// run sweeps at the same time through the same workers without mixing datasets or results; and a worker process
// listens on no port (it only connects out to Redis). Linux: listening sockets are read from /proc.

let redis: TestRedis;
let local: SweepPool;
let worker: WorkerProcess;

beforeAll(async () => {
  redis = await startRedis();
  local = new SweepPool({ threads: 2 });
  worker = await startWorker(redis.url, 2);
}, 60_000);

afterAll(async () => {
  await worker?.stop();
  await local?.destroy();
  await redis?.stop();
});

/** Inodes of the TCP sockets in LISTEN state (st 0A) on this machine (RFC 793 LISTEN; Linux proc(5) net/tcp). */
function listeningInodes(): Set<string> {
  const inodes = new Set<string>();
  for (const table of ['/proc/net/tcp', '/proc/net/tcp6']) {
    let text = '';
    try {
      text = readFileSync(table, 'utf8');
    } catch {
      continue;
    }
    for (const line of text.trim().split('\n').slice(1)) {
      const fields = line.trim().split(/\s+/);
      if (fields[3] === '0A') inodes.add(fields[9] as string);
    }
  }
  return inodes;
}

/** The listening TCP sockets a process holds. */
function listeningSocketsOf(pid: number): string[] {
  const listening = listeningInodes();
  const held: string[] = [];
  for (const fd of readdirSync(`/proc/${pid}/fd`)) {
    let target = '';
    try {
      target = readlinkSync(`/proc/${pid}/fd/${fd}`);
    } catch {
      continue;
    }
    const inode = /^socket:\[(\d+)\]$/.exec(target)?.[1];
    if (inode !== undefined && listening.has(inode)) held.push(inode);
  }
  return held;
}

describe('one Redis, several servers', () => {
  it('a worker process listens on no port (the redis-server it serves does, as a control)', () => {
    expect(listeningSocketsOf(redis.process.pid as number).length).toBeGreaterThan(0);
    expect(listeningSocketsOf(worker.child.pid as number)).toEqual([]);
  });

  it('two servers with their own prefixes sweep at the same time with the local results', async () => {
    const shared: Dataset = fixtureDataset(2500, true, 17);
    const other: Dataset = fixtureDataset(2000, false, 23);
    const plan = normalizePlan({ cells: [70, 100], placements: 48, sims: 9, alpha: 0.2, seed: 3 });
    const expectedShared = keptFiles(await local.runSweep(shared, plan));
    const expectedOther = keptFiles(await local.runSweep(other, plan));
    const serverA = queueRunner(redis.url, 'data-aaaaaaaaaaaa');
    const serverB = queueRunner(redis.url, 'data-bbbbbbbbbbbb');
    try {
      // the same dataset on both servers, and a second one on B, all in flight together
      const [a, b, c] = await Promise.all([serverA.runSweep(shared, plan), serverB.runSweep(shared, plan), serverB.runSweep(other, plan)]);
      expect(keptFiles(a)).toEqual(expectedShared);
      expect(keptFiles(b)).toEqual(expectedShared);
      expect(keptFiles(c)).toEqual(expectedOther);
    } finally {
      await serverA.destroy();
      await serverB.destroy();
    }
    const keys = await redisKeys(redis.port);
    expect(keys.filter((key) => key.startsWith('gridshake:data-aaaaaaaaaaaa:dataset:'))).toHaveLength(1);
    expect(keys.filter((key) => key.startsWith('gridshake:data-bbbbbbbbbbbb:dataset:'))).toHaveLength(2);
    expect(keys.filter((key) => key.includes(':result:'))).toEqual([]);
  }, 180_000);
});
