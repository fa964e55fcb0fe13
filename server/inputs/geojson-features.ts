/**
 * The features of a GeoJSON text (RFC 7946): a FeatureCollection, a single Feature or a bare geometry,
 * each with a label for messages ("feature 3 (id 'a')", 1-based) and its geometry.
 */
import { inputError } from '../errors.js';
import { parseJsonText } from './parse-json.js';
import { legacyGeoJsonCrs } from './legacy-geojson-crs.js';

export interface GeoJsonGeometry {
  type: string;
  coordinates?: unknown;
  geometries?: unknown;
}

export interface LabelledFeature {
  /** e.g. "zones.geojson: feature 2 (id 'lake')" */
  label: string;
  /** feature id or its 1-based number */
  id: string;
  geometry: GeoJsonGeometry | null;
}

const GEOMETRY_TYPES = ['Point', 'MultiPoint', 'LineString', 'MultiLineString', 'Polygon', 'MultiPolygon', 'GeometryCollection'];

function isObject(value: unknown): value is Record<string, unknown> {
  return typeof value === 'object' && value !== null && !Array.isArray(value);
}

function asGeometry(value: unknown, label: string): GeoJsonGeometry | null {
  if (value === null || value === undefined) return null;
  if (!isObject(value) || typeof value.type !== 'string' || !GEOMETRY_TYPES.includes(value.type)) {
    throw inputError(`${label}: the geometry is not a GeoJSON geometry object`);
  }
  return value as unknown as GeoJsonGeometry;
}

function featureOf(value: unknown, fileName: string, index: number): LabelledFeature {
  const number = index + 1;
  if (!isObject(value) || value.type !== 'Feature') {
    throw inputError(`${fileName}: feature ${number}: not a GeoJSON Feature object`);
  }
  const hasId = typeof value.id === 'string' || typeof value.id === 'number';
  const id = hasId ? String(value.id) : String(number);
  const label = `${fileName}: feature ${number}${hasId ? ` (id '${id}')` : ''}`;
  return { label, id, geometry: asGeometry(value.geometry, label) };
}

export function readGeoJsonFeatures(fileName: string, text: string): LabelledFeature[] {
  return readGeoJson(fileName, text).features;
}

/** The features and the coordinate system a legacy `crs` member declares (see legacy-geojson-crs.ts), if any. */
export function readGeoJson(fileName: string, text: string): { features: LabelledFeature[]; declaredCrs?: string } {
  const root = parseJsonText(fileName, text);
  if (!isObject(root) || typeof root.type !== 'string') {
    throw inputError(`${fileName}: not GeoJSON (expected an object with a "type" member)`);
  }
  const declaredCrs = legacyGeoJsonCrs(fileName, root.crs);
  const features = (() => {
    if (root.type === 'FeatureCollection') {
      if (!Array.isArray(root.features)) throw inputError(`${fileName}: the FeatureCollection has no "features" array`);
      return root.features.map((feature, index) => featureOf(feature, fileName, index));
    }
    if (root.type === 'Feature') return [featureOf(root, fileName, 0)];
    const label = `${fileName}: geometry`;
    return [{ label, id: '1', geometry: asGeometry(root, label) }];
  })();
  return declaredCrs === undefined ? { features } : { features, declaredCrs };
}
