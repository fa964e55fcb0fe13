/**
 * The optional basemap: the analyst's own XYZ tile server (serve --basemap URL, reported by /api/health), never a
 * public one and never by default. Tiles are in the web-mercator scheme (EPSG:3857) and reprojected by the map
 * library into the dataset's working projection, so the basemap is offered only when the coordinate system is known
 * (an EPSG code or longitude/latitude input), not for `crs planar`. The layer starts off: no tile is requested until
 * the user switches it on. Tiles are requested with CORS (crossOrigin anonymous) so that the PNG export can include
 * them; the tile server must send Access-Control-Allow-Origin.
 */
import TileLayer from 'ol/layer/Tile.js';
import XYZ from 'ol/source/XYZ.js';
import type { MapLayerEntry } from './gridshake-map.js';

export const BASEMAP_LAYER_ID = 'basemap';
/** Over the study area's fill (10), under the population at risk (15), the grid (20) and the rest. */
const BASEMAP_Z_INDEX = 12;

export function basemapLayerEntry(template: string): MapLayerEntry {
  const layer = new TileLayer({ source: new XYZ({ url: template, crossOrigin: 'anonymous' }), zIndex: BASEMAP_Z_INDEX, opacity: 0.75, visible: false });
  layer.set('title', BASEMAP_LAYER_ID);
  const origin = new URL(template.replaceAll('{z}', '0').replaceAll('{x}', '0').replaceAll('{y}', '0')).origin;
  return {
    id: BASEMAP_LAYER_ID,
    label: `Basemap (${origin})`,
    layer,
    legend: () => [{ kind: 'note', label: `Basemap tiles from your tile server at ${origin} (configured with serve --basemap).` }],
  };
}
