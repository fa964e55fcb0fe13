/**
 * Turns the pool's placements-done counts into SweepProgress: elapsed seconds since the sweep started and the
 * remaining time extrapolated linearly, remaining = elapsed * (total - done) / done (null before the first task ends).
 */
import type { SweepProgress } from '../../shared/contracts.js';
import type { RunnerProgress } from './sweep-runner.js';

export class ProgressClock {
  private readonly startedAt = Date.now();
  private latest: SweepProgress;

  constructor(total: number) {
    this.latest = { done: 0, total, elapsedSeconds: 0, remainingSeconds: null };
  }

  update(progress: RunnerProgress): SweepProgress {
    this.latest = this.build(progress.done, progress.total);
    return this.latest;
  }

  /** The latest counts with the elapsed time brought up to now (for the once-a-second heartbeat). */
  now(): SweepProgress {
    this.latest = this.build(this.latest.done, this.latest.total);
    return this.latest;
  }

  private build(done: number, total: number): SweepProgress {
    const elapsedSeconds = (Date.now() - this.startedAt) / 1000;
    const remainingSeconds = done > 0 ? (elapsedSeconds * Math.max(0, total - done)) / done : null;
    return { done, total, elapsedSeconds, remainingSeconds };
  }
}
