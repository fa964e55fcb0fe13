/**
 * Checking and projecting points and polygons with one projector: geographic coordinates are range-checked,
 * the LAEA centre is the centre of the bounding box of all input positions (points, study area, zones).
 */
import { inputError } from '../errors.js';
import { makeProjector, type CoordinateSystem, type Projector } from './coordinate-system.js';
import type { LabelledRings } from './valid-region.js';
import { checkLonLat } from './parse-coordinate.js';
import type { RawPoints } from './raw-points.js';

export interface ProjectedInputs {
  projector: Projector;
  xy: Float64Array;
  area: LabelledRings[];
  zones: LabelledRings[];
}

function inputCentre(points: RawPoints, polygons: LabelledRings[]): [number, number] {
  let minX = Infinity;
  let minY = Infinity;
  let maxX = -Infinity;
  let maxY = -Infinity;
  const add = (x: number, y: number): void => {
    minX = Math.min(minX, x);
    maxX = Math.max(maxX, x);
    minY = Math.min(minY, y);
    maxY = Math.max(maxY, y);
  };
  for (let k = 0; k < points.coordinates.length; k += 2) add(points.coordinates[k], points.coordinates[k + 1]);
  for (const polygon of polygons) for (const ring of polygon.rings) for (const [x, y] of ring) add(x, y);
  return [(minX + maxX) / 2, (minY + maxY) / 2];
}

export function projectRings(polygon: LabelledRings, projector: Projector): LabelledRings {
  const rings = polygon.rings.map((ring) =>
    ring.map(([x, y]) => {
      const [px, py] = projector.forward(x, y);
      if (!Number.isFinite(px) || !Number.isFinite(py)) {
        throw inputError(`${polygon.label}: position (${x}, ${y}) cannot be projected`);
      }
      return [px, py];
    }),
  );
  return { label: polygon.label, rings };
}

export function projectInputs(
  system: CoordinateSystem,
  points: RawPoints,
  area: LabelledRings[],
  zones: LabelledRings[],
): ProjectedInputs {
  const n = points.coordinates.length / 2;
  if (system.geographic) {
    for (let k = 0; k < n; k += 1) checkLonLat(points.coordinates[2 * k], points.coordinates[2 * k + 1], points.locate(k));
  }
  const projector = makeProjector(system, inputCentre(points, [...area, ...zones]));
  const xy = new Float64Array(2 * n);
  for (let k = 0; k < n; k += 1) {
    const [x, y] = projector.forward(points.coordinates[2 * k], points.coordinates[2 * k + 1]);
    if (!Number.isFinite(x) || !Number.isFinite(y)) {
      throw inputError(`${points.locate(k)}: the position cannot be projected with ${system.crs}`);
    }
    xy[2 * k] = x;
    xy[2 * k + 1] = y;
  }
  return {
    projector,
    xy,
    area: area.map((p) => projectRings(p, projector)),
    zones: zones.map((p) => projectRings(p, projector)),
  };
}
