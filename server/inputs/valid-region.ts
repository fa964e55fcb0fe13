/**
 * The valid region: the study area (union of its polygons) minus the union of the no-data zones, so that
 * overlapping zones are removed once. Polygon overlay by @turf/turf (union, intersect, difference; planar on the
 * projected coordinates), run once per dataset, never per point.
 */
import * as turf from '@turf/turf';
import type { Feature, MultiPolygon, Polygon } from 'geojson';
import { inputError } from '../errors.js';
import { multiPolygonArea } from './planar-rings.js';

export interface LabelledRings {
  label: string;
  /** projected, closed GeoJSON rings: shell then holes */
  rings: number[][][];
}

export interface ValidRegionGeometry {
  studyArea: number[][][][];
  noDataZones: number[][][][];
  valid: number[][][][];
}

type Areal = Feature<Polygon | MultiPolygon>;

function asMulti(feature: Areal | null): number[][][][] {
  if (feature === null) return [];
  const geometry = feature.geometry;
  return geometry.type === 'Polygon' ? [geometry.coordinates] : geometry.coordinates;
}

function unionOf(features: Areal[]): Areal | null {
  if (features.length === 0) return null;
  if (features.length === 1) return features[0];
  return turf.union(turf.featureCollection(features)) as Areal | null;
}

/** Build the valid region; GS_ERR_INPUT when a zone misses the study area or the zones cover all of it. */
export function buildValidRegion(area: LabelledRings[], zones: LabelledRings[]): ValidRegionGeometry {
  const study = unionOf(area.map((p) => turf.polygon(p.rings)));
  if (study === null) throw inputError('the study area is empty');
  const zoneFeatures = zones.map((zone) => {
    const feature = turf.polygon(zone.rings);
    const overlap = turf.intersect(turf.featureCollection<Polygon | MultiPolygon>([study, feature]));
    if (overlap === null || multiPolygonArea(asMulti(overlap as Areal)) <= 0) {
      throw inputError(`${zone.label}: the no-data zone lies entirely outside the study area`);
    }
    return feature;
  });
  const zoneUnion = unionOf(zoneFeatures);
  const valid =
    zoneUnion === null
      ? study
      : (turf.difference(turf.featureCollection<Polygon | MultiPolygon>([study, zoneUnion])) as Areal | null);
  const validMulti = asMulti(valid);
  if (validMulti.length === 0 || multiPolygonArea(validMulti) <= 0) {
    throw inputError('the no-data zones cover the whole study area: no valid region is left');
  }
  return { studyArea: asMulti(study), noDataZones: asMulti(zoneUnion), valid: validMulti };
}
