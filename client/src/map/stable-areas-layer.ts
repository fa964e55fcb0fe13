/**
 * The placement-stable excess and deficit areas of the chosen cell size (summary.stability[k].areas: planar rings
 * of the working system, the same polygons as excess-areas-<side>m.geojson) as an optional map layer: excess areas
 * outlined in vermillion, deficit areas in blue (dashed), each lightly filled; the readout names the area under the
 * pointer (kind, largest share, area in km²).
 */
import Feature from 'ol/Feature.js';
import Polygon from 'ol/geom/Polygon.js';
import VectorLayer from 'ol/layer/Vector.js';
import VectorSource from 'ol/source/Vector.js';
import { Fill, Stroke, Style } from 'ol/style.js';
import type { StabilitySizeSummary, StableAreaSummary } from '../../../shared/contracts.js';
import { withAlpha } from '../../../shared/charts/palette.js';
import { formatNumber } from '../../../shared/format.js';
import type { MapLayerEntry } from './gridshake-map.js';
import { stabilityGroup, SURFACE_COLOURS } from './surface-layer.js';

export const AREAS_LAYER_ID = 'stable-areas';
/** Over the surface (24) and the no-data zones (30), under the points (40). */
const AREAS_Z_INDEX = 35;

const STYLES = {
  excess: new Style({ fill: new Fill({ color: withAlpha(SURFACE_COLOURS.excess, 0.12) }), stroke: new Stroke({ color: SURFACE_COLOURS.excess, width: 2.5 }) }),
  deficit: new Style({ fill: new Fill({ color: withAlpha(SURFACE_COLOURS.deficit, 0.12) }), stroke: new Stroke({ color: SURFACE_COLOURS.deficit, width: 2.5, lineDash: [6, 4] }) }),
} as const;

export interface StableAreasEntry extends MapLayerEntry {
  /** the stable area holding a map coordinate, or null */
  areaAt: (x: number, y: number) => StableAreaSummary | null;
}

export function stableAreasEntry(entry: StabilitySizeSummary): StableAreasEntry {
  const features = entry.areas.map((area) => {
    const feature = new Feature(new Polygon(area.rings));
    feature.set('area', area);
    feature.setStyle(STYLES[area.kind]);
    return feature;
  });
  const source = new VectorSource({ features });
  const layer = new VectorLayer({ source, zIndex: AREAS_Z_INDEX, updateWhileAnimating: true, updateWhileInteracting: true });
  layer.set('title', AREAS_LAYER_ID);
  const side = formatNumber(entry.cellSize);
  const excess = entry.areas.filter((area) => area.kind === 'excess').length;
  const deficit = entry.areas.length - excess;
  return {
    id: AREAS_LAYER_ID,
    label: `Stable areas (${excess} excess, ${deficit} deficit)`,
    layer,
    group: stabilityGroup(entry.shape, entry.cellSize),
    legend: () => entry.areas.length === 0 ? [{ kind: 'note', label: `No placement-stable area at ${side} m. ${entry.note}` }] : [
      { kind: 'fill', colour: withAlpha(SURFACE_COLOURS.excess, 0.12), outline: SURFACE_COLOURS.excess, label: `stable excess area (share above ${entry.excessThreshold === null ? 'n/a' : formatNumber(entry.excessThreshold)}, calibrated at ${side} m)` },
      { kind: 'fill', colour: withAlpha(SURFACE_COLOURS.deficit, 0.12), outline: SURFACE_COLOURS.deficit, label: `stable deficit area (share above ${entry.deficitThreshold === null ? 'n/a' : formatNumber(entry.deficitThreshold)})` },
    ],
    areaAt: (x, y) => {
      if (!layer.getVisible()) return null;
      for (const feature of source.getFeaturesAtCoordinate([x, y])) return feature.get('area') as StableAreaSummary;
      return null;
    },
  };
}
