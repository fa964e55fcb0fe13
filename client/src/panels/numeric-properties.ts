/**
 * The numeric properties of a GeoJSON FeatureCollection (or one Feature) read in the browser, for the upload form's
 * field picker (issue 15); the rule is shared/numeric-properties.ts. A GeoPackage is read by the server instead
 * (api.baselineFields).
 */
import { numericPropertyNames } from '../../../shared/numeric-properties.js';

export function numericProperties(geoJsonText: string): string[] {
  let root: unknown;
  try {
    root = JSON.parse(geoJsonText);
  } catch {
    return [];
  }
  const features = (root as { type?: unknown; features?: unknown })?.type === 'FeatureCollection' ? (root as { features: unknown }).features : [root];
  if (!Array.isArray(features)) return [];
  return numericPropertyNames(features.map((feature) => (feature as { properties?: unknown })?.properties ?? null));
}
