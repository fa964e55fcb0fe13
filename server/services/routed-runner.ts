/**
 * The runner of `serve --queue`: sweeps go to the Redis queue by default, and a sweep started with
 * `executor: "local"` runs on the server's own worker pool instead, made on first use. So the local pool stays usable
 * while Redis is down (a queue sweep then fails with the URL and what to check, and the user chooses to run it here);
 * nothing falls back silently: a sweep sized for many machines never lands on this one unasked, and an outage of the
 * queue shows instead of hiding behind a slow local run.
 */
import type { ExecutorChoice, SweepRunner, SweepRunOptions } from './sweep-runner.js';
import type { Dataset, Plan } from '../../shared/contracts.js';

export class RoutedSweepRunner implements SweepRunner {
  readonly executors: readonly ExecutorChoice[] = ['queue', 'local'];
  private local: SweepRunner | null = null;

  constructor(
    private readonly queue: SweepRunner,
    private readonly makeLocal: () => SweepRunner,
  ) {}

  get threads(): number | undefined {
    return this.queue.threads;
  }

  runSweep(dataset: Dataset, plan: Plan, options: SweepRunOptions): ReturnType<SweepRunner['runSweep']> {
    if (options.executor === 'local') {
      this.local ??= this.makeLocal();
      return this.local.runSweep(dataset, plan, options);
    }
    return this.queue.runSweep(dataset, plan, options);
  }

  async destroy(): Promise<void> {
    await Promise.all([this.queue.destroy(), this.local?.destroy()]);
  }
}
