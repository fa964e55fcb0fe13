/**
 * `excess-areas-<side>m.geojson`: the stable areas of one cell size as a GeoJSON FeatureCollection of polygons with
 * the properties kind (`excess` | `deficit`), maxShare and areaKm2. Coordinates: RFC 7946 longitude/latitude (WGS 84)
 * when the working system is known (longitude/latitude input, or an EPSG code), edges densified to within 1 cm of
 * the planar pixel sides (server/grid-export/lonlat-ring.ts), outer rings counter-clockwise and holes clockwise (RFC
 * 7946 section 3.1.6); for input given as `crs planar`, the working metres with a note in the "gridshake" member.
 * Built from the full list of areas (stability-summary.ts areaSummaries, not summary.json's capped list) when given,
 * else from the summary's (sweeps stored before the cap), so the CLI and the server write the same file.
 */
import type { ProjectionInfo, StabilitySizeSummary, StableAreaSummary } from '../../shared/contracts.js';
import { lonLatRing } from '../grid-export/lonlat-ring.js';
import { workingSystem } from '../grid-export/working-system.js';

export function areasGeoJson(
  surface: StabilitySizeSummary,
  projection: ProjectionInfo,
  datasetName: string,
  areas: readonly StableAreaSummary[] = surface.areas,
): object {
  const system = workingSystem(projection);
  const { toLonLat, fromLonLat } = system;
  const lonlat = toLonLat !== null && fromLonLat !== null;
  const ring = (planar: [number, number][], hole: boolean): [number, number][] => {
    if (!lonlat) return planar;
    const converted = lonLatRing(planar, toLonLat, fromLonLat);
    return hole ? converted.reverse() : converted;
  };
  const features = areas.map((area, index) => ({
    type: 'Feature',
    id: index + 1,
    properties: { kind: area.kind, maxShare: area.maxShare, areaKm2: area.areaKm2 },
    geometry: { type: 'Polygon', coordinates: area.rings.map((planar, k) => ring(planar, k > 0)) },
  }));
  return {
    type: 'FeatureCollection',
    gridshake: {
      coordinates: lonlat
        ? 'longitude/latitude (WGS 84, RFC 7946); pixel edges densified to within 1 cm of the planar pixel sides'
        : `planar metres of the working system (not longitude/latitude; the input had no known coordinate system): ${system.description}`,
      projection: system.description,
      dataset: datasetName,
      cellSize: surface.cellSize,
      shape: surface.shape,
      placements: surface.placements,
      pixelSide: surface.raster.side,
      sims: surface.sims,
      levelPerKind: surface.level,
      excessThreshold: surface.excessThreshold,
      deficitThreshold: surface.deficitThreshold,
      note: surface.note,
    },
    features,
  };
}
