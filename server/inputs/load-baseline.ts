/**
 * The population at risk (issue 15), read in the points' coordinate system and projected with the points' projector
 * (the baseline never moves the projection centre: project-inputs.ts chooses it from points, study area and zones).
 *
 * Polygons: each feature's count P_p from property NAME (a non-negative finite number; a numeric text is accepted),
 * clipped to the valid region V by polygon overlay (@turf/turf intersect, planar, once per dataset). Polygons must not
 * overlap (refused with both 1-based feature numbers); polygons with |p ∩ V| = 0 (below 1e-9 of their own area) are
 * reported and ignored; the share of V outside every polygon is warned about; no positive count inside V is refused.
 * Controls: points in the same formats as the cases, in the same coordinate system; those inside V are the weights.
 * Every refusal is GS_ERR_BASELINE naming the file and the feature or record.
 */
import * as turf from '@turf/turf';
import type { Feature, MultiPolygon, Polygon } from 'geojson';
import { partitionByRegion } from '../../workers/geometry/point-in-region.js';
import { BASELINE_SHARE_NOISE, baselineSize, type Baseline, type PolygonBaseline } from '../../workers/baseline/baseline.js';
import type { Region } from '../../workers/types.js';
import type { BaselineInfo, InputWarning } from '../../shared/contracts.js';
import { baselineError, GridshakeError } from '../errors.js';
import type { CoordinateSystem, Projector } from './coordinate-system.js';
import type { InputFile } from './input-file.js';
import { checkLonLat } from './parse-coordinate.js';
import { multiPolygonArea, multiPolygonBBox } from './planar-rings.js';
import { projectRings } from './project-inputs.js';
import { readPoints } from './read-points.js';
import { readPolygonFeatures } from './read-polygon-file.js';
import { toRegion } from './to-region.js';

export interface LoadedBaseline {
  baseline: Baseline;
  info: BaselineInfo;
  warnings: InputWarning[];
}

type Areal = Feature<Polygon | MultiPolygon>;

function asMulti(feature: Areal | null): number[][][][] {
  if (feature === null) return [];
  const geometry = feature.geometry;
  return geometry.type === 'Polygon' ? [geometry.coordinates] : geometry.coordinates;
}

/** The count of a feature: a finite number >= 0 (a numeric text is read as a number), else a refusal naming it. */
function countOf(properties: Record<string, unknown> | undefined, field: string, where: string): number {
  if (properties === undefined || !Object.prototype.hasOwnProperty.call(properties, field) || properties[field] === null) {
    throw baselineError(`${where}: no value in the baseline field '${field}'`);
  }
  const raw = properties[field];
  const value = typeof raw === 'number' ? raw : typeof raw === 'string' && raw.trim() !== '' ? Number(raw.trim()) : Number.NaN;
  if (!Number.isFinite(value)) {
    throw baselineError(`${where}: the baseline field '${field}' holds ${JSON.stringify(raw)}, not a number`);
  }
  if (value < 0) throw baselineError(`${where}: the baseline field '${field}' is negative (${value}); counts must be >= 0`);
  return value;
}

interface ProjectedFeature {
  number: number;
  label: string;
  count: number;
  multi: number[][][][];
  area: number;
  bbox: { minX: number; minY: number; maxX: number; maxY: number };
}

function boxesMeet(a: ProjectedFeature['bbox'], b: ProjectedFeature['bbox']): boolean {
  return a.minX < b.maxX && b.minX < a.maxX && a.minY < b.maxY && b.minY < a.maxY;
}

/** Refuses the first pair of features whose overlap is more than clipping noise (1e-9 of the smaller area). */
function checkNoOverlap(features: ProjectedFeature[], fileName: string): void {
  const order = features.map((_, k) => k).sort((a, b) => features[a]!.bbox.minX - features[b]!.bbox.minX);
  for (let x = 0; x < order.length; x++) {
    const a = features[order[x]!]!;
    for (let y = x + 1; y < order.length; y++) {
      const b = features[order[y]!]!;
      if (b.bbox.minX >= a.bbox.maxX) break;
      if (!boxesMeet(a.bbox, b.bbox)) continue;
      const overlap = turf.intersect(turf.featureCollection<Polygon | MultiPolygon>([turf.multiPolygon(a.multi), turf.multiPolygon(b.multi)]));
      const area = multiPolygonArea(asMulti(overlap as Areal | null));
      if (area > BASELINE_SHARE_NOISE * Math.min(a.area, b.area)) {
        const [first, second] = a.number < b.number ? [a, b] : [b, a];
        throw baselineError(
          `${fileName}: features ${first.number} and ${second.number} overlap (${area.toPrecision(4)} m²); baseline polygons must not overlap`,
        );
      }
    }
  }
}

function percent(share: number): string {
  return `${(100 * share).toPrecision(3)} %`;
}

/** Baseline polygons with a count field, clipped to the valid region (header comment). */
export function loadBaselinePolygons(
  file: InputFile,
  field: string,
  system: CoordinateSystem,
  projector: Projector,
  valid: number[][][][],
  region: Region,
  pointsFile: string,
): LoadedBaseline {
  if (field.trim() === '') throw baselineError(`${file.name}: give the baseline field that holds the counts`);
  const read = readPolygonFeatures(file, system, 'baseline', pointsFile, baselineError);
  const features: ProjectedFeature[] = read.map(({ feature, number, polygons }) => {
    const where = `${file.name}: feature ${number}`;
    const count = countOf(feature.properties, field, where);
    const multi = polygons.map((polygon) => projectRings(polygon, projector).rings);
    return { number, label: feature.label, count, multi, area: multiPolygonArea(multi), bbox: multiPolygonBBox(multi) };
  });
  checkNoOverlap(features, file.name);
  const validFeature = turf.multiPolygon(valid);
  const validBox = multiPolygonBBox(valid);
  const pieces: Region[] = [];
  const counts: number[] = [];
  const outsideFeatures: number[] = [];
  let coveredArea = 0;
  let totalInside = 0;
  let total = 0;
  for (const feature of features) {
    total += feature.count;
    let clipped: number[][][][] = [];
    if (boxesMeet(feature.bbox, validBox)) {
      const overlap = turf.intersect(turf.featureCollection<Polygon | MultiPolygon>([turf.multiPolygon(feature.multi), validFeature]));
      clipped = asMulti(overlap as Areal | null);
    }
    const inside = multiPolygonArea(clipped);
    if (!(inside > BASELINE_SHARE_NOISE * feature.area)) {
      outsideFeatures.push(feature.number);
      continue;
    }
    coveredArea += inside;
    const piece = toRegion(clipped);
    pieces.push(piece);
    counts.push(feature.count);
    totalInside += feature.count;
  }
  if (!(totalInside > 0)) {
    throw baselineError(
      `${file.name}: no baseline weight anywhere in the valid region (the polygons inside it hold 0 in '${field}', or none lies inside it)`,
    );
  }
  const uncoveredShare = Math.max(0, 1 - coveredArea / region.area);
  const warnings: InputWarning[] = [];
  if (uncoveredShare > BASELINE_SHARE_NOISE) {
    warnings.push({
      code: 'baseline-gap',
      message: `${percent(uncoveredShare)} of the valid region lies outside every baseline polygon of ${file.name}: no population at risk is assumed there (weight 0)`,
    });
  }
  if (outsideFeatures.length > 0) {
    warnings.push({
      code: 'baseline-outside',
      message: `${outsideFeatures.length} baseline polygon(s) of ${file.name} lie outside the valid region and are ignored`,
      ids: outsideFeatures.slice(0, 100).map(String),
    });
  }
  const engine: PolygonBaseline = { kind: 'polygons', pieces, counts: Float64Array.from(counts) };
  return {
    baseline: engine,
    info: {
      kind: 'polygons', file: file.name, field, features: features.length, totalInside, total, outsideFeatures, uncoveredShare,
      // what the work budget counts of the areal weighting (shared/plan-rules.ts baselineWork)
      pieces: engine.pieces.length,
      vertices: baselineSize(engine).vertices,
    },
    warnings,
  };
}

/** Control points in the points' formats and coordinate system; those inside the valid region count (header). */
export function loadControls(file: InputFile, system: CoordinateSystem, projector: Projector, region: Region): LoadedBaseline {
  let raw;
  try {
    raw = readPoints(file, {});
  } catch (error) {
    if (error instanceof GridshakeError) throw baselineError(error.message);
    throw error;
  }
  if (raw.declaredCrs !== undefined && system.crs !== 'planar' && raw.declaredCrs !== system.crs) {
    throw baselineError(`${file.name}: the controls are in ${raw.declaredCrs} but the points are in ${system.crs}; give every file in one coordinate system`);
  }
  const n = raw.coordinates.length / 2;
  const xy = new Float64Array(2 * n);
  for (let k = 0; k < n; k++) {
    const x = raw.coordinates[2 * k]!;
    const y = raw.coordinates[2 * k + 1]!;
    if (system.geographic) {
      try {
        checkLonLat(x, y, raw.locate(k));
      } catch (error) {
        if (error instanceof GridshakeError) throw baselineError(`${error.message} (the controls must be in the points' coordinate system)`);
        throw error;
      }
    }
    const [px, py] = projector.forward(x, y);
    if (!Number.isFinite(px) || !Number.isFinite(py)) throw baselineError(`${raw.locate(k)}: the position cannot be projected with ${system.crs}`);
    xy[2 * k] = px;
    xy[2 * k + 1] = py;
  }
  const { inside } = partitionByRegion(xy, region);
  if (inside.length === 0) {
    throw baselineError(`${file.name}: no control point lies in the valid region: no baseline weight anywhere in it (are they in the points' coordinate system?)`);
  }
  const controls = new Float64Array(2 * inside.length);
  inside.forEach((index, k) => {
    controls[2 * k] = xy[2 * index]!;
    controls[2 * k + 1] = xy[2 * index + 1]!;
  });
  const controlsOutside = n - inside.length;
  const warnings: InputWarning[] =
    controlsOutside > 0
      ? [{ code: 'controls-outside', message: `${controlsOutside} of ${n} control points of ${file.name} lie outside the valid region and are not counted` }]
      : [];
  return {
    baseline: { kind: 'controls', controls },
    info: { kind: 'controls', file: file.name, features: n, totalInside: inside.length, total: n, outsideFeatures: [], uncoveredShare: 0, controlsOutside },
    warnings,
  };
}
