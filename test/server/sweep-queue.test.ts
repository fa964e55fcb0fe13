import { describe, it, expect, afterEach } from 'vitest';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Dataset, PlacementRow, Plan, SweepSummary } from '../../shared/contracts.js';
import { loadDataset, summarizeDataset } from '../../server/inputs/index.js';
import { SweepQueue } from '../../server/services/sweep-queue.js';
import type { SweepRunner, SweepRunOptions } from '../../server/services/sweep-runner.js';
import { GridshakeStore } from '../../server/store/store.js';
import { SAMPLES } from './server-helpers.js';

/**
 * A runner under the test's control (a test double for the worker pool): each run waits until the test releases
 * it, reports progress, and records how many runs overlapped.
 */
class ControlledRunner implements SweepRunner {
  readonly threads = 1;
  running = 0;
  maxConcurrent = 0;
  readonly started: string[] = [];
  private releases: ((outcome: Error | null) => void)[] = [];

  async runSweep(dataset: Dataset, plan: Plan, options: SweepRunOptions): Promise<{ rows: PlacementRow[]; summary: SweepSummary }> {
    this.running += 1;
    this.maxConcurrent = Math.max(this.maxConcurrent, this.running);
    this.started.push(String(plan.seed));
    try {
      options.onProgress?.({ done: 1, total: 2 });
      const outcome = await new Promise<Error | null>((resolve, reject) => {
        this.releases.push(resolve);
        options.signal?.addEventListener('abort', () => reject(new Error('aborted')), { once: true });
      });
      if (outcome !== null) throw outcome;
      const rows = [{ sizeIndex: 0, placementIndex: 0, vmr: Number.NaN, chi2: 1 / 3 } as unknown as PlacementRow];
      return { rows, summary: { conclusion: `seed ${plan.seed}`, dataset: summarizeDataset(dataset) } as unknown as SweepSummary };
    } finally {
      this.running -= 1;
    }
  }

  async release(outcome: Error | null = null): Promise<void> {
    for (let attempt = 0; attempt < 200 && this.releases.length === 0; attempt++) await new Promise((resolve) => setTimeout(resolve, 5));
    this.releases.shift()?.(outcome);
  }

  async destroy(): Promise<void> {}
}

const stores: GridshakeStore[] = [];
afterEach(() => stores.splice(0).forEach((store) => store.close()));

function setup(): { store: GridshakeStore; runner: ControlledRunner; queue: SweepQueue; datasetId: string } {
  const store = GridshakeStore.open(':memory:');
  stores.push(store);
  const read = (name: string) => ({ name, content: new Uint8Array(readFileSync(join(SAMPLES, 'brannock-heath', name))) });
  const dataset = loadDataset({ points: read('points.csv'), area: read('area.geojson') }, { crs: 'planar' });
  const { id } = store.datasets.insert(dataset, summarizeDataset(dataset));
  const runner = new ControlledRunner();
  const queue = new SweepQueue(store, runner, { error: () => undefined });
  return { store, runner, queue, datasetId: id };
}

function plan(seed: number): Plan {
  return { cells: [100], placements: 2, rotation: false, design: 'lattice', minCoverage: 0.5, alpha: 0.05, sims: 0, seed };
}

async function finished(queue: SweepQueue, id: string): Promise<string> {
  return new Promise((resolve) => {
    const listener = (sweepId: string, status: string): void => {
      if (sweepId !== id) return;
      queue.off('finished', listener);
      resolve(status);
    };
    queue.on('finished', listener);
  });
}

describe('SweepQueue', () => {
  it('runs sweeps one after another in the order they were queued', async () => {
    const { store, runner, queue, datasetId } = setup();
    const ids = [1, 2, 3].map((seed) => store.sweeps.create({ datasetId, plan: plan(seed), estimate: { work: 1, budget: 1, tasks: 1 } }).id);
    ids.forEach((id) => queue.enqueue(id));
    expect(queue.position(ids[2]!)).toBe(1);
    for (const id of ids) {
      const done = finished(queue, id);
      await runner.release();
      expect(await done).toBe('done');
    }
    expect(runner.started).toEqual(['1', '2', '3']);
    expect(runner.maxConcurrent).toBe(1);
    const record = store.sweeps.get(ids[0]!)!;
    expect(record.status).toBe('done');
    expect(record.conclusion).toBe('seed 1');
    const rows = store.placements.read(ids[0]!);
    expect(Number.isNaN(rows[0]!.vmr)).toBe(true);
    expect(rows[0]!.chi2).toBe(1 / 3);
  });

  it('a failing run fails only its sweep, with the error message, and the next one runs', async () => {
    const { store, runner, queue, datasetId } = setup();
    const first = store.sweeps.create({ datasetId, plan: plan(1), estimate: { work: 1, budget: 1, tasks: 1 } }).id;
    const second = store.sweeps.create({ datasetId, plan: plan(2), estimate: { work: 1, budget: 1, tasks: 1 } }).id;
    queue.enqueue(first);
    queue.enqueue(second);
    const failed = finished(queue, first);
    await runner.release(new Error('worker ran out of memory at size 0'));
    expect(await failed).toBe('failed');
    expect(store.sweeps.get(first)!.error).toBe('worker ran out of memory at size 0');
    expect(store.placements.read(first)).toEqual([]);
    const done = finished(queue, second);
    await runner.release();
    expect(await done).toBe('done');
  });

  it('close() marks the running and the waiting sweeps interrupted', async () => {
    const { store, runner, queue, datasetId } = setup();
    const running = store.sweeps.create({ datasetId, plan: plan(1), estimate: { work: 1, budget: 1, tasks: 1 } }).id;
    const waiting = store.sweeps.create({ datasetId, plan: plan(2), estimate: { work: 1, budget: 1, tasks: 1 } }).id;
    queue.enqueue(running);
    queue.enqueue(waiting);
    for (let attempt = 0; attempt < 100 && runner.running === 0; attempt++) await new Promise((resolve) => setTimeout(resolve, 5));
    expect(store.sweeps.get(running)!.status).toBe('running');
    expect(queue.liveProgress(running)).toMatchObject({ done: 1, total: 2 });
    await queue.close();
    expect(store.sweeps.get(running)!.status).toBe('interrupted');
    expect(store.sweeps.get(waiting)!.status).toBe('interrupted');
    queue.enqueue(store.sweeps.create({ datasetId, plan: plan(3), estimate: { work: 1, budget: 1, tasks: 1 } }).id);
    expect(runner.started).toEqual(['1']);
  });
});
