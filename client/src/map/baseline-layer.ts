/**
 * The population at risk (issue 15) as an optional map layer: the baseline polygons' parts inside the valid region,
 * each filled by its density P_p / |p ∩ V| per km² on the sequential ramp (darker = denser, relative to the densest
 * polygon), under the grid and the points. Control points have their own layer (controls-layer.ts).
 */
import Feature from 'ol/Feature.js';
import Polygon from 'ol/geom/Polygon.js';
import VectorLayer from 'ol/layer/Vector.js';
import VectorSource from 'ol/source/Vector.js';
import { Fill, Stroke, Style } from 'ol/style.js';
import type { DatasetGeometry } from '../api/api-client.js';
import { sequentialColour, withAlpha } from '../../../shared/charts/palette.js';
import { formatNumber } from '../../../shared/format.js';
import type { MapLayerEntry } from './gridshake-map.js';

export const BASELINE_LAYER_ID = 'baseline';

/** Above the study area (10), below the grid (20) and the points (40). */
const BASELINE_Z_INDEX = 15;

/** The layer entry for the map's list and legend, or null when the dataset has no baseline polygons with weight. */
export function baselineLayerEntry(geometry: DatasetGeometry | null): MapLayerEntry | null {
  const baseline = geometry?.baseline;
  if (!baseline || !(baseline.maxDensity > 0)) return null;
  const outline = new Stroke({ color: 'rgba(255,255,255,0.7)', width: 0.6 });
  const features = baseline.polygons.map((polygon) => {
    const feature = new Feature(new Polygon(polygon.rings));
    feature.setStyle(new Style({ fill: new Fill({ color: withAlpha(sequentialColour(polygon.density / baseline.maxDensity), 0.55) }), stroke: outline }));
    return feature;
  });
  const layer = new VectorLayer({ source: new VectorSource({ features }), zIndex: BASELINE_Z_INDEX, updateWhileAnimating: true, updateWhileInteracting: true });
  layer.set('title', BASELINE_LAYER_ID);
  return {
    id: BASELINE_LAYER_ID,
    label: 'Population at risk (density per km²)',
    layer,
    legend: () => [{ kind: 'ramp', low: '0', high: formatNumber(baseline.maxDensity), label: 'population at risk per km²' }],
  };
}
