/**
 * Polygons of a GeoJSON or GeoPackage file, feature by feature, checked (rings, self-intersections, longitude /
 * latitude ranges) in the points' coordinate system: a GeoPackage layer or a GeoJSON "crs" member that declares
 * another system than the points is refused. Shared by the study area, the no-data zones and the baseline.
 */
import { inputError, type GridshakeError } from '../errors.js';
import { checkPolygon } from './check-polygon.js';
import { checkPolygonIsLonLat } from './coordinate-sanity.js';
import type { CoordinateSystem } from './coordinate-system.js';
import { isSqliteFile, readGeoPackageFeatures } from './geopackage/read-geopackage.js';
import { polygonsFromFeatures } from './geojson-polygons.js';
import { readGeoJson, type LabelledFeature } from './geojson-features.js';
import { readText, type InputFile } from './input-file.js';
import type { LabelledRings } from './valid-region.js';

export interface PolygonFeature {
  feature: LabelledFeature;
  /** 1-based feature number in the file */
  number: number;
  /** the feature's polygons (a MultiPolygon's parts), checked, not yet projected */
  polygons: LabelledRings[];
}

export function readPolygonFeatures(
  file: InputFile,
  system: CoordinateSystem,
  role: string,
  pointsFile: string,
  refuse: (message: string) => GridshakeError = inputError,
): PolygonFeature[] {
  let features: LabelledFeature[];
  if (isSqliteFile(file)) {
    const layer = readGeoPackageFeatures(file);
    if (layer.crs !== undefined && system.crs !== 'planar' && layer.crs !== system.crs) {
      throw refuse(`${file.name}: the layer is in ${layer.crs} but the points are in ${system.crs}; give every file in one coordinate system`);
    }
    features = layer.features;
  } else {
    const { features: read, declaredCrs } = readGeoJson(file.name, readText(file));
    if (declaredCrs !== undefined && system.crs !== 'planar' && declaredCrs !== system.crs) {
      throw refuse(`${file.name}: the GeoJSON "crs" member says ${declaredCrs} but the points are in ${system.crs}; give every file in one coordinate system`);
    }
    features = read;
  }
  // one call over all features keeps the "no polygon features" refusal for an empty file
  polygonsFromFeatures(file.name, features);
  return features.map((feature, index) => {
    const polygons = polygonsFromFeatures(file.name, [feature]).map((polygon) => {
      checkPolygonIsLonLat(system, polygon, role, pointsFile);
      return { label: polygon.label, rings: checkPolygon(polygon, system.geographic) };
    });
    return { feature, number: index + 1, polygons };
  });
}
