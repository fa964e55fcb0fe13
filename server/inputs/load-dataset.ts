/**
 * loadDataset: points, study area and no-data zones (text or bytes) to a validated, projected Dataset ready for
 * the engine. Pure apart from reading the EPSG definitions package; the CLI reads files, the server passes uploads.
 */
import { partitionByRegion } from '../../workers/geometry/point-in-region.js';
import type { Dataset, InputWarning } from '../../shared/contracts.js';
import { baselineError, inputError, tooLargeError } from '../errors.js';
import { checkCoordinateSanity } from './coordinate-sanity.js';
import { readPolygonFeatures } from './read-polygon-file.js';
import { resolveCoordinateSystem, type CoordinateSystem, type Projector } from './coordinate-system.js';
import { loadBaselinePolygons, loadControls, type LoadedBaseline } from './load-baseline.js';
import type { Region } from '../../workers/types.js';
import { defaultStudyArea } from './default-study-area.js';
import { findDuplicates } from './find-duplicates.js';
import type { InputFile } from './input-file.js';
import { duplicateWarning, outsideWarning, projectionWarning, skippedRowsWarning } from './input-warnings.js';
import { projectInputs } from './project-inputs.js';
import { readPoints } from './read-points.js';
import { toRegion } from './to-region.js';
import { withEveryPointInside } from './inside-points.js';
import { buildValidRegion, type LabelledRings } from './valid-region.js';
import { fieldRef, twoWays } from '../messages/field-names.js';

export interface DatasetInput {
  points: InputFile;
  area?: InputFile;
  noData?: InputFile[];
  /** population-at-risk polygons (with DatasetOptions.baselineField) — issue 15 */
  baseline?: InputFile;
  /** control points, the other kind of baseline */
  controls?: InputFile;
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
  /** the property of the baseline polygons that holds the counts */
  baselineField?: string;
}

/** Polygons of a GeoJSON or GeoPackage file (read-polygon-file.ts), every feature's parts in one list. */
function readPolygons(file: InputFile, system: CoordinateSystem, role: string, pointsFile: string): LabelledRings[] {
  return readPolygonFeatures(file, system, role, pointsFile).flatMap((feature) => feature.polygons);
}

/** The baseline polygons or the controls, if given (load-baseline.ts); both at once or a field without polygons is refused. */
function loadAnyBaseline(
  input: DatasetInput,
  options: DatasetOptions,
  system: CoordinateSystem,
  projector: Projector,
  valid: number[][][][],
  region: Region,
  pointsFile: string,
): LoadedBaseline | undefined {
  if (input.baseline !== undefined && input.controls !== undefined) {
    throw baselineError(`give either baseline polygons (${input.baseline.name}) or control points (${input.controls.name}), not both`);
  }
  if (input.baseline !== undefined) {
    if (options.baselineField === undefined) {
      throw baselineError(`${input.baseline.name}: give the baseline field that holds the counts (${twoWays('--baseline-field NAME', 'the "Baseline field" choice')})`);
    }
    return loadBaselinePolygons(input.baseline, options.baselineField, system, projector, valid, region, pointsFile);
  }
  if (options.baselineField !== undefined) {
    throw baselineError(`a baseline field (${options.baselineField}) was given without baseline polygons`);
  }
  return input.controls === undefined ? undefined : loadControls(input.controls, system, projector, region);
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
  const baseline = loadAnyBaseline(input, options, system, projected.projector, geometry.valid, region, input.points.name);
  if (baseline !== undefined) warnings.push(...baseline.warnings);
  const duplicates = findDuplicates(projected.xy);
  if (duplicates.length > 0) warnings.push(duplicateWarning(duplicates.length, duplicates.map((k) => raw.ids[k])));
  const everyPointInside = inside.length === n;
  let outsideIds: string[] = [];
  if (!everyPointInside) {
    const isInside = new Uint8Array(n);
    for (const k of inside) isInside[k] = 1;
    outsideIds = raw.ids.filter((_, k) => isInside[k] === 0);
    warnings.push(outsideWarning(outsideIds.length, n, outsideIds));
  }

  const dataset: Omit<Dataset, 'inside'> = {
    name: options.name ?? baseName(input.points.name),
    crs: system.crs,
    projection: projected.projector.info,
    xy: projected.xy,
    ids: raw.ids,
    outsideIds,
    studyArea: geometry.studyArea,
    noDataZones: geometry.noDataZones,
    areaIsDefault: projected.area.length === 0,
    region,
    origin: { x: studyRegion.bbox.minX, y: studyRegion.bbox.minY },
    warnings,
    ...(baseline === undefined ? {} : { baseline: { engine: baseline.baseline, info: baseline.info } }),
  };
  // the usual case keeps no index of the inside points (server/inputs/inside-points.ts)
  return everyPointInside ? withEveryPointInside(dataset) : { ...dataset, inside };
}
