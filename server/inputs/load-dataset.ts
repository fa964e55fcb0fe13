/**
 * loadDataset: points, study area and no-data zones (text or bytes) to a validated, projected Dataset ready for
 * the engine. Pure apart from reading the EPSG definitions package; the CLI reads files, the server passes uploads.
 */
import { partitionByRegion } from '../../workers/geometry/point-in-region.js';
import type { Dataset, InputWarning } from '../../shared/contracts.js';
import { inputError, tooLargeError } from '../errors.js';
import { checkPolygon } from './check-polygon.js';
import { checkCoordinateSanity, checkPolygonIsLonLat } from './coordinate-sanity.js';
import { resolveCoordinateSystem, type CoordinateSystem } from './coordinate-system.js';
import { isSqliteFile, readGeoPackageFeatures } from './geopackage/read-geopackage.js';
import { defaultStudyArea } from './default-study-area.js';
import { findDuplicates } from './find-duplicates.js';
import { polygonsFromFeatures, type RawPolygon } from './geojson-polygons.js';
import { readGeoJson } from './geojson-features.js';
import { readText, type InputFile } from './input-file.js';
import { duplicateWarning, outsideWarning, projectionWarning, skippedRowsWarning } from './input-warnings.js';
import { projectInputs } from './project-inputs.js';
import { readPoints } from './read-points.js';
import { toRegion } from './to-region.js';
import { buildValidRegion, type LabelledRings } from './valid-region.js';
import { fieldRef, twoWays } from '../messages/field-names.js';

export interface DatasetInput {
  points: InputFile;
  area?: InputFile;
  noData?: InputFile[];
}

export interface DatasetOptions {
  crs?: string;
  x?: string;
  y?: string;
  id?: string;
  name?: string;
  maxPoints?: number;
  /** leave out CSV rows whose coordinates are blank or n/a, with a warning listing their lines */
  skipBadRows?: boolean;
}

/** Polygons of a GeoJSON or GeoPackage file; a GeoPackage must declare the same system as the points, or none. */
function readPolygons(file: InputFile, system: CoordinateSystem, role: string, pointsFile: string): LabelledRings[] {
  let polygons: RawPolygon[];
  if (isSqliteFile(file)) {
    const layer = readGeoPackageFeatures(file);
    if (layer.crs !== undefined && system.crs !== 'planar' && layer.crs !== system.crs) {
      throw inputError(`${file.name}: the layer is in ${layer.crs} but the points are in ${system.crs}; give every file in one coordinate system`);
    }
    polygons = polygonsFromFeatures(file.name, layer.features);
  } else {
    const { features, declaredCrs } = readGeoJson(file.name, readText(file));
    if (declaredCrs !== undefined && system.crs !== 'planar' && declaredCrs !== system.crs) {
      throw inputError(`${file.name}: the GeoJSON "crs" member says ${declaredCrs} but the points are in ${system.crs}; give every file in one coordinate system`);
    }
    polygons = polygonsFromFeatures(file.name, features);
  }
  const geographic = system.geographic;
  for (const polygon of polygons) checkPolygonIsLonLat(system, polygon, role, pointsFile);
  return polygons.map((polygon) => ({
    label: polygon.label,
    rings: checkPolygon(polygon, geographic),
  }));
}

function baseName(fileName: string): string {
  const last = fileName.split(/[\\/]/).pop() ?? fileName;
  return last.replace(/\.[^.]+$/, '') || last;
}

export function loadDataset(input: DatasetInput, options: DatasetOptions = {}): Dataset {
  const raw = readPoints(input.points, options);
  const n = raw.ids.length;
  if (options.maxPoints !== undefined && n > options.maxPoints) {
    throw tooLargeError(`${input.points.name}: ${n} points, more than the limit of ${options.maxPoints}`);
  }
  const crs = options.crs ?? raw.declaredCrs;
  if (crs === undefined && raw.format === 'geopackage') {
    throw inputError(`${input.points.name}: the GeoPackage layer declares no EPSG coordinate system; give ${twoWays('--crs planar or --crs EPSG:n', 'choose "planar metres" or an EPSG code in the "Coordinate system" field')}`);
  }
  const system = resolveCoordinateSystem(crs, raw.kind, input.points.name);
  const area = input.area ? readPolygons(input.area, system, 'study area', input.points.name) : [];
  const zones = (input.noData ?? []).flatMap((file) => readPolygons(file, system, 'no-data zone', input.points.name));
  const sanityWarnings = checkCoordinateSanity(system, raw, area, zones);
  const projected = projectInputs(system, raw, area, zones);
  const warnings: InputWarning[] = [...system.warnings.map(projectionWarning), ...sanityWarnings];
  if (raw.skippedLines && raw.skippedLines.length > 0) warnings.push(skippedRowsWarning(input.points.name, raw.skippedLines));

  let studyRings = projected.area;
  if (studyRings.length === 0) {
    const fallback = defaultStudyArea(projected.xy, input.points.name);
    studyRings = [fallback.polygon];
    warnings.push(fallback.warning);
  }
  const geometry = buildValidRegion(studyRings, projected.zones);
  const region = toRegion(geometry.valid);
  const studyRegion = toRegion(geometry.studyArea);
  if (!Number.isFinite(region.area) || !Number.isFinite(studyRegion.area)) {
    throw inputError(
      `${input.area?.name ?? input.points.name}: the coordinates are too large: the study area's size overflows ` +
        `(are they metres in a projected system? check ${fieldRef('crs')})`,
    );
  }

  const inside = partitionByRegion(projected.xy, region).inside;
  if (inside.length === 0) {
    // which message: the study area is tested only here, when no point is left (one pass over the points otherwise)
    if (partitionByRegion(projected.xy, studyRegion).inside.length === 0) {
      throw inputError(`${input.area?.name ?? 'study area'}: the study area does not contain any point of ${input.points.name}`);
    }
    throw inputError(`${input.points.name}: every point lies inside a no-data zone: none is left to count`);
  }
  const duplicates = findDuplicates(projected.xy);
  if (duplicates.length > 0) warnings.push(duplicateWarning(duplicates.length, duplicates.map((k) => raw.ids[k])));
  const isInside = new Uint8Array(n);
  for (const k of inside) isInside[k] = 1;
  const outsideIds = raw.ids.filter((_, k) => isInside[k] === 0);
  if (outsideIds.length > 0) warnings.push(outsideWarning(outsideIds.length, n, outsideIds));

  return {
    name: options.name ?? baseName(input.points.name),
    crs: system.crs,
    projection: projected.projector.info,
    xy: projected.xy,
    ids: raw.ids,
    inside,
    outsideIds,
    studyArea: geometry.studyArea,
    noDataZones: geometry.noDataZones,
    areaIsDefault: projected.area.length === 0,
    region,
    origin: { x: studyRegion.bbox.minX, y: studyRegion.bbox.minY },
    warnings,
  };
}
