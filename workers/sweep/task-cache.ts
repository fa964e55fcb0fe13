/**
 * What a worker thread builds from shared memory, kept per dataset key (observed counter, region) and per
 * simulation key (one counter per simulated pattern). Bounded: the oldest entry goes when a third arrives.
 */
const LIMIT = 2;

export class TaskCache<T> {
  private readonly entries = new Map<string, T>();

  get(key: string, build: () => T): T {
    let value = this.entries.get(key);
    if (value === undefined) {
      value = build();
      this.entries.set(key, value);
      while (this.entries.size > LIMIT) this.entries.delete(this.entries.keys().next().value as string);
    }
    return value;
  }
}
