/**
 * Polygons (study area or no-data zones) from GeoJSON: Polygon and MultiPolygon as Feature, FeatureCollection or
 * bare geometry. Each polygon keeps a label naming the file, the feature and the part, for messages.
 */
import { inputError } from '../errors.js';
import { readGeoJsonFeatures, type LabelledFeature } from './geojson-features.js';

export interface RawPolygon {
  /** e.g. "area.geojson: feature 1, polygon 2" */
  label: string;
  /** GeoJSON rings as written: shell first, then holes; positions not yet checked */
  rings: unknown[];
}

function polygonRings(value: unknown, label: string): unknown[] {
  if (!Array.isArray(value) || value.length === 0) {
    throw inputError(`${label}: a polygon must be a non-empty array of rings`);
  }
  return value;
}

export function readGeoJsonPolygons(fileName: string, text: string): RawPolygon[] {
  return polygonsFromFeatures(fileName, readGeoJsonFeatures(fileName, text));
}

/** Polygons of already-read features (GeoJSON or GeoPackage), one per Polygon or MultiPolygon part. */
export function polygonsFromFeatures(fileName: string, features: LabelledFeature[]): RawPolygon[] {
  const polygons: RawPolygon[] = [];
  for (const feature of features) {
    const geometry = feature.geometry;
    if (geometry === null) throw inputError(`${feature.label}: the feature has no geometry`);
    if (geometry.type === 'Polygon') {
      polygons.push({ label: feature.label, rings: polygonRings(geometry.coordinates, feature.label) });
    } else if (geometry.type === 'MultiPolygon') {
      if (!Array.isArray(geometry.coordinates) || geometry.coordinates.length === 0) {
        throw inputError(`${feature.label}: a MultiPolygon must hold at least one polygon`);
      }
      geometry.coordinates.forEach((part: unknown, index: number) => {
        const label = `${feature.label}, polygon ${index + 1}`;
        polygons.push({ label, rings: polygonRings(part, label) });
      });
    } else {
      throw inputError(`${feature.label}: a ${geometry.type} where a Polygon or MultiPolygon was expected`);
    }
  }
  if (polygons.length === 0) throw inputError(`${fileName}: the file holds no polygon features`);
  return polygons;
}
