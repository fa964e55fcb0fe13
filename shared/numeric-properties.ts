/**
 * The properties a baseline count field may come from (issue 15): the names whose value is a number (or a numeric
 * text) in every feature, in the order first seen. Pure; used by the page's field picker for GeoJSON read in the
 * browser and by the server for a GeoPackage layer (POST /api/datasets/baseline-fields), so both list the same
 * names. The upload still checks every feature (GS_ERR_BASELINE names the one that fails).
 */
function isNumeric(value: unknown): boolean {
  if (typeof value === 'number') return Number.isFinite(value);
  if (typeof value === 'bigint') return true;
  return typeof value === 'string' && value.trim() !== '' && Number.isFinite(Number(value.trim()));
}

/** `properties`: each feature's property object, in file order; [] when there are none or one is not an object. */
export function numericPropertyNames(properties: readonly unknown[]): string[] {
  if (properties.length === 0) return [];
  const names: string[] = [];
  const seen = new Set<string>();
  for (const entry of properties) {
    if (entry === null || typeof entry !== 'object') return [];
    for (const name of Object.keys(entry)) {
      if (seen.has(name)) continue;
      seen.add(name);
      names.push(name);
    }
  }
  return names.filter((name) => properties.every((entry) => isNumeric((entry as Record<string, unknown>)[name])));
}
