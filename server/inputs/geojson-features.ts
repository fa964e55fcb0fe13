/**
 * The features of a GeoJSON text (RFC 7946): a FeatureCollection, a single Feature or a bare geometry,
 * each with a label for messages ("feature 3 (id 'a')", 1-based) and its geometry.
 */
import { inputError } from '../errors.js';
import { ID_NAMES } from './column-names.js';
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
  /** the Feature.id, else an id-like property (ID_NAMES, or the one named by `idProperty`), else its 1-based number */
  id: string;
  geometry: GeoJsonGeometry | null;
  /** the feature's properties (GeoJSON "properties", a GeoPackage row's other columns); absent for a bare geometry */
  properties?: Record<string, unknown>;
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

const isIdValue = (value: unknown): value is string | number =>
  (typeof value === 'string' && value.trim() !== '') || (typeof value === 'number' && Number.isFinite(value));

/**
 * The record id of a feature, as for a CSV's id column: Feature.id (RFC 7946 section 3.2), else the property named
 * `idProperty` (the --id option), else the first id-like property (ID_NAMES, case-insensitive), else undefined.
 */
export function featureId(value: Record<string, unknown>, idProperty?: string): string | undefined {
  if (isIdValue(value.id)) return String(value.id);
  const properties = isObject(value.properties) ? value.properties : {};
  const keys = Object.keys(properties);
  const wanted = idProperty !== undefined ? [idProperty.trim().toLowerCase()] : ID_NAMES;
  for (const name of wanted) {
    const key = keys.find((candidate) => candidate.trim().toLowerCase() === name);
    if (key !== undefined && isIdValue(properties[key])) return String(properties[key]);
  }
  return undefined;
}

function featureOf(value: unknown, fileName: string, index: number, idProperty?: string): LabelledFeature {
  const number = index + 1;
  if (!isObject(value) || value.type !== 'Feature') {
    throw inputError(`${fileName}: feature ${number}: not a GeoJSON Feature object`);
  }
  const found = featureId(value, idProperty);
  const id = found ?? String(number);
  const label = `${fileName}: feature ${number}${found !== undefined ? ` (id '${id}')` : ''}`;
  const properties = isObject(value.properties) ? value.properties : {};
  return { label, id, geometry: asGeometry(value.geometry, label), properties };
}

export function readGeoJsonFeatures(fileName: string, text: string, idProperty?: string): LabelledFeature[] {
  return readGeoJson(fileName, text, idProperty).features;
}

/** The features and the coordinate system a legacy `crs` member declares (see legacy-geojson-crs.ts), if any. */
export function readGeoJson(fileName: string, text: string, idProperty?: string): { features: LabelledFeature[]; declaredCrs?: string } {
  const root = parseJsonText(fileName, text);
  if (!isObject(root) || typeof root.type !== 'string') {
    throw inputError(`${fileName}: not GeoJSON (expected an object with a "type" member)`);
  }
  const declaredCrs = legacyGeoJsonCrs(fileName, root.crs);
  const features = (() => {
    if (root.type === 'FeatureCollection') {
      if (!Array.isArray(root.features)) throw inputError(`${fileName}: the FeatureCollection has no "features" array`);
      return root.features.map((feature, index) => featureOf(feature, fileName, index, idProperty));
    }
    if (root.type === 'Feature') return [featureOf(root, fileName, 0, idProperty)];
    const label = `${fileName}: geometry`;
    return [{ label, id: '1', geometry: asGeometry(root, label) }];
  })();
  return declaredCrs === undefined ? { features } : { features, declaredCrs };
}
