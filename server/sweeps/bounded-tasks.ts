/**
 * Runs work items with at most `limit` in flight, taking the next item only when one finishes, so that a sweep of
 * a million tasks never holds a million pending promises (nor a million queued tasks in the executor). Stops
 * taking items once `stopped()` turns true; `work` handles its own errors.
 */
export async function runBounded<T>(items: Iterable<T>, limit: number, work: (item: T) => Promise<void>, stopped: () => boolean): Promise<void> {
  const iterator = items[Symbol.iterator]();
  const lane = async (): Promise<void> => {
    for (;;) {
      if (stopped()) return;
      const next = iterator.next();
      if (next.done === true) return;
      await work(next.value);
    }
  };
  await Promise.all(Array.from({ length: Math.max(1, Math.floor(limit)) }, lane));
}
