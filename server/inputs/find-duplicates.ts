/**
 * Points whose coordinates repeat an earlier point's exactly (same x and y). A map keyed by x holds the y (or the
 * set of ys) seen with it, so that no string keys are built. Cost O(n) expected time.
 */
export function findDuplicates(coordinates: Float64Array): number[] {
  const seen = new Map<number, number | Set<number>>();
  const duplicates: number[] = [];
  for (let k = 0; k < coordinates.length / 2; k += 1) {
    const x = coordinates[2 * k];
    const y = coordinates[2 * k + 1];
    const known = seen.get(x);
    if (known === undefined) seen.set(x, y);
    else if (typeof known === 'number') {
      if (known === y) duplicates.push(k);
      else seen.set(x, new Set([known, y]));
    } else if (known.has(y)) duplicates.push(k);
    else known.add(y);
  }
  return duplicates;
}
