/** Points whose coordinates repeat an earlier point's exactly (same x and y). Cost O(n) with a hash map. */
export function findDuplicates(coordinates: Float64Array): number[] {
  const seen = new Set<string>();
  const duplicates: number[] = [];
  for (let k = 0; k < coordinates.length / 2; k += 1) {
    const key = `${coordinates[2 * k]},${coordinates[2 * k + 1]}`;
    if (seen.has(key)) duplicates.push(k);
    else seen.add(key);
  }
  return duplicates;
}
