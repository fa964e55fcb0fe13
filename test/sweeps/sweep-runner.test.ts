import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Dataset } from '../../shared/contracts.js';
import { datasetRef } from '../../server/sweeps/dataset-key.js';
import type { ChunkWork, DatasetRef, SimulateWork, SimulationRef, SweepExecutor } from '../../server/sweeps/executor.js';
import { LocalExecutor } from '../../server/sweeps/local-executor.js';
import { normalizePlan, trustStoredPlan } from '../../server/sweeps/plan.js';
import { ExecutorSweepRunner } from '../../server/sweeps/sweep-runner.js';
import { fixtureDataset } from './sweep-fixtures.js';

// Runs dist/workers (npm test builds first). The checks here are about the seam, not the statistics: the
// statistics are checked against outside references in sweep-pool.test.ts and the engine suites.

/** A LocalExecutor that counts the tasks in flight and what was shared. */
class CountingExecutor implements SweepExecutor {
  readonly inner: LocalExecutor;
  inFlight = 0;
  mostInFlight = 0;
  shareCalls: string[] = [];
  constructor(readonly maxInFlight: number) {
    this.inner = new LocalExecutor({ threads: 2 });
  }
  get name(): string {
    return this.inner.name;
  }
  get threads(): number {
    return this.inner.threads;
  }
  get simulatesInWorkers(): boolean {
    return false;
  }
  get versions(): Record<string, string> {
    return this.inner.versions;
  }
  share(dataset: Dataset, ref: DatasetRef): Promise<void> {
    this.shareCalls.push(ref.key);
    return this.inner.share(dataset, ref);
  }
  run(work: ChunkWork, signal: AbortSignal): Promise<Float64Array>;
  run(work: SimulateWork, signal: AbortSignal): Promise<number>;
  async run(work: ChunkWork | SimulateWork, signal: AbortSignal): Promise<Float64Array | number> {
    this.inFlight += 1;
    this.mostInFlight = Math.max(this.mostInFlight, this.inFlight);
    try {
      return await (this.inner.run as (w: ChunkWork | SimulateWork, s: AbortSignal) => Promise<Float64Array | number>)(work, signal);
    } finally {
      this.inFlight -= 1;
    }
  }
  release(simulation: SimulationRef): void {
    this.inner.release(simulation);
  }
  destroy(): Promise<void> {
    return this.inner.destroy();
  }
}

let executor: CountingExecutor;
let runner: ExecutorSweepRunner;
let uniform: Dataset;

beforeAll(() => {
  executor = new CountingExecutor(3);
  runner = new ExecutorSweepRunner(executor);
  uniform = fixtureDataset(3000, false);
});

afterAll(async () => {
  await runner.destroy();
});

describe('the sweep runner on an executor', () => {
  it('keeps at most maxInFlight tasks in flight', async () => {
    // 3000 points and 3 sims: 64 placements per chunk, 512 placements x 2 sizes = 16 chunk tasks
    await runner.runSweep(uniform, normalizePlan({ cells: [80, 120], placements: 512, sims: 3, alpha: 0.5 }));
    expect(executor.mostInFlight).toBeGreaterThan(1);
    expect(executor.mostInFlight).toBeLessThanOrEqual(3);
  });

  it('keys the shared copy by dataset id and content: a fresh load of the same dataset is not sorted and shared again', async () => {
    const before = executor.inner.sharedCopies;
    const plan = normalizePlan({ cells: [100], placements: 8, sims: 2, alpha: 0.5 });
    // two loads of one stored dataset: equal content, different objects (as the store returns them)
    const first = structuredClone(uniform);
    const second = structuredClone(uniform);
    const a = await runner.runSweep(first, plan, { datasetId: 'ds-1' });
    const b = await runner.runSweep(second, plan, { datasetId: 'ds-1' });
    expect(b.rows).toEqual(a.rows);
    expect(executor.inner.sharedCopies - before).toBe(1);
    expect(datasetRef(first, 'ds-1')).toEqual(datasetRef(second, 'ds-1'));
    // other content (one point moved) is another dataset
    const moved = structuredClone(uniform);
    moved.xy[2 * moved.inside[0]] += 1;
    expect(datasetRef(moved, 'ds-1').key).not.toBe(datasetRef(first, 'ds-1').key);
    await runner.runSweep(moved, plan, { datasetId: 'ds-1' });
    expect(executor.inner.sharedCopies - before).toBe(2);
  });

  it('does not validate again a plan that normalizePlan returned or the store holds, and validates any other', async () => {
    const plan = normalizePlan({ cells: [100], placements: 8, sims: 0 });
    // a validated plan is used as it is: a field changed after validation is not caught again (the store never does this)
    const stored = trustStoredPlan(JSON.parse(JSON.stringify(plan)));
    (stored as { placements: number }).placements = 4;
    expect((await runner.runSweep(uniform, stored)).rows).toHaveLength(4);
    // an unvalidated object is validated: an unknown field is refused
    await expect(runner.runSweep(uniform, { ...plan, extra: 1 } as never)).rejects.toMatchObject({ code: 'GS_ERR_PARAMETER' });
  });

  it('records the executor in the versions', async () => {
    const { summary } = await runner.runSweep(uniform, normalizePlan({ cells: [100], placements: 4, sims: 0 }));
    expect(summary.versions.executor).toBe('local pool');
    expect(summary.versions.piscina).toMatch(/^\d+\.\d+/);
  });
});
