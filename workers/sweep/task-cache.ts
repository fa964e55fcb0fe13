/**
 * What a worker thread builds from shared memory, kept per dataset key (observed counter, region) and per
 * simulation key (one counter per simulated pattern). Bounded: the oldest entry goes when one more than `limit`
 * arrives, which also lets go of the shared memory it refers to.
 */
export class TaskCache<T> {
  private readonly entries = new Map<string, T>();

  constructor(private readonly limit = 2) {}

  get(key: string, build: () => T): T {
    let value = this.entries.get(key);
    if (value === undefined) {
      value = build();
      this.entries.set(key, value);
      while (this.entries.size > this.limit) this.entries.delete(this.entries.keys().next().value as string);
    }
    return value;
  }
}
