/** Points from a GeoJSON FeatureCollection of Point and MultiPoint features (each point of a MultiPoint a record). */
import { inputError } from '../errors.js';
import { readGeoJson, type LabelledFeature } from './geojson-features.js';
import { parseCoordinate } from './parse-coordinate.js';
import type { RawPoints } from './raw-points.js';

function position(value: unknown, where: string): [number, number] {
  if (!Array.isArray(value) || value.length < 2) {
    throw inputError(`${where}: a position must be an array [x, y]`);
  }
  const [x, y] = value;
  const check = (v: unknown, axis: string): number => {
    if (typeof v === 'number') {
      if (!Number.isFinite(v)) throw inputError(`${where}: the ${axis} coordinate is not finite`);
      return v;
    }
    return parseCoordinate(String(v), where, axis);
  };
  return [check(x, 'x (longitude)'), check(y, 'y (latitude)')];
}

/** Points of a GeoJSON text; record ids as in featureId (`idProperty`: the --id option naming a property). */
export function readGeoJsonPoints(fileName: string, text: string, idProperty?: string): RawPoints {
  const { features, declaredCrs } = readGeoJson(fileName, text, idProperty);
  const points = pointsFromFeatures(fileName, features, 'geojson');
  // a legacy crs member (honoured): the coordinates are in that system, not RFC 7946 longitude/latitude
  return declaredCrs === undefined ? points : { ...points, declaredCrs, kind: declaredCrs === 'EPSG:4326' ? 'lonlat' : 'xy' };
}

/** Points of already-read features (GeoJSON or GeoPackage): each Point a record, each part of a MultiPoint one. */
export function pointsFromFeatures(fileName: string, features: LabelledFeature[], format: RawPoints['format']): RawPoints {
  const coordinates: number[] = [];
  const ids: string[] = [];
  const labels: string[] = [];
  for (const feature of features) {
    const geometry = feature.geometry;
    if (geometry === null) throw inputError(`${feature.label}: the feature has no geometry`);
    if (geometry.type === 'Point') {
      const [x, y] = position(geometry.coordinates, feature.label);
      coordinates.push(x, y);
      ids.push(feature.id);
      labels.push(feature.label);
    } else if (geometry.type === 'MultiPoint') {
      if (!Array.isArray(geometry.coordinates)) throw inputError(`${feature.label}: MultiPoint without coordinates`);
      geometry.coordinates.forEach((value: unknown, part: number) => {
        const where = `${feature.label}, point ${part + 1}`;
        const [x, y] = position(value, where);
        coordinates.push(x, y);
        ids.push(`${feature.id}.${part + 1}`);
        labels.push(where);
      });
    } else {
      throw inputError(`${feature.label}: a ${geometry.type} where a Point or MultiPoint was expected`);
    }
  }
  if (ids.length === 0) throw inputError(`${fileName}: the file holds no point features`);
  return {
    fileName,
    format,
    coordinates: Float64Array.from(coordinates),
    ids,
    kind: 'lonlat',
    locate: (index) => labels[index],
  };
}
