/**
 * The properties a baseline field may come from (issue 15): the names whose value is a number (or a numeric text) in
 * every feature of a GeoJSON FeatureCollection, in the order first seen. Pure, for the upload form's field picker;
 * the server still checks every feature (GS_ERR_BASELINE names the one that fails).
 */
function isNumeric(value: unknown): boolean {
  if (typeof value === 'number') return Number.isFinite(value);
  return typeof value === 'string' && value.trim() !== '' && Number.isFinite(Number(value.trim()));
}

export function numericProperties(geoJsonText: string): string[] {
  let root: unknown;
  try {
    root = JSON.parse(geoJsonText);
  } catch {
    return [];
  }
  const features = (root as { type?: unknown; features?: unknown })?.type === 'FeatureCollection' ? (root as { features: unknown }).features : [root];
  if (!Array.isArray(features) || features.length === 0) return [];
  const names: string[] = [];
  const seen = new Set<string>();
  for (const feature of features) {
    const properties = (feature as { properties?: unknown })?.properties;
    if (properties === null || typeof properties !== 'object') return [];
    for (const name of Object.keys(properties)) {
      if (seen.has(name)) continue;
      seen.add(name);
      names.push(name);
    }
  }
  return names.filter((name) => features.every((feature) => isNumeric((feature as { properties: Record<string, unknown> }).properties[name])));
}
