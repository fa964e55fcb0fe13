/**
 * The stability surface on invented data: a CSR pattern with one planted cluster. The excess area must contain the
 * cluster's centre at the cell sizes that can see it and nothing beyond the cells that can hold the cluster; the
 * same data shifted by whole cells, or turned by 90 degrees with its study area (and the same simulated patterns
 * moved alike), must give the same areas, pixel for pixel. Calibration: R = 39 simulated patterns, level alpha/2 = 0.025
 * per kind, so the threshold is the largest simulated maximum (k = floor(0.025 x 40) = 1; Besag and Diggle 1977).
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { createRandom, haltonPlacements } from '../../workers/random/index.js';
import type { Region } from '../../workers/types.js';
import type { StabilitySurface } from '../../server/stability/stability-accumulator.js';
import { stableAreas } from '../../server/stability/stable-areas.js';
import { csrPatterns, csrPoints, maskCentres, offsetLattice, rectangleRegion, runSurface } from './surface-fixtures.js';

const SIMS = 39;
const CENTRE: [number, number] = [1300, 700];
const RADIUS = 80;
// study area 2000 m x 2000 m with a no-data zone (a lake) away from the cluster
const REGION = rectangleRegion(0, 0, 2000, 2000, [[250, 1250, 750, 1750]]);
const PLACEMENTS = offsetLattice(4);

function plantedPattern(): Float64Array {
  const background = csrPoints(REGION, 400, 1701);
  const random = createRandom(1702);
  const cluster: number[] = [];
  while (cluster.length < 120) {
    const x = (2 * random() - 1) * RADIUS;
    const y = (2 * random() - 1) * RADIUS;
    if (x * x + y * y <= RADIUS * RADIUS) cluster.push(CENTRE[0] + x, CENTRE[1] + y);
  }
  return Float64Array.from([...background, ...cluster]);
}

type Transform = (x: number, y: number) => [number, number];

function transformPoints(xy: Float64Array, f: Transform): Float64Array {
  const out = new Float64Array(xy.length);
  for (let k = 0; k < xy.length; k += 2) [out[k], out[k + 1]] = f(xy[k]!, xy[k + 1]!);
  return out;
}

/** The region moved by f; rings keep their orientation under translations and rotations. */
function transformRegion(region: Region, f: Transform): Region {
  const rings = region.rings.map((ring) => transformPoints(ring, f));
  let minX = Infinity;
  let minY = Infinity;
  let maxX = -Infinity;
  let maxY = -Infinity;
  for (const ring of rings) {
    for (let k = 0; k < ring.length; k += 2) {
      minX = Math.min(minX, ring[k]!);
      maxX = Math.max(maxX, ring[k]!);
      minY = Math.min(minY, ring[k + 1]!);
      maxY = Math.max(maxY, ring[k + 1]!);
    }
  }
  return { rings, area: region.area, bbox: { minX, minY, maxX, maxY } };
}

const observed = plantedPattern();
const simulated = csrPatterns(REGION, observed.length / 2, 1703, SIMS);
const key = ([x, y]: [number, number]): string => `${x.toFixed(3)},${y.toFixed(3)}`;

function surfaceFor(cellSize: number, f?: Transform): StabilitySurface {
  if (f === undefined) return runSurface({ region: REGION, observed, simulated, cellSize, placements: PLACEMENTS });
  return runSurface({
    region: transformRegion(REGION, f),
    observed: transformPoints(observed, f),
    simulated: simulated.map((xy) => transformPoints(xy, f)),
    cellSize,
    placements: PLACEMENTS,
  });
}

describe.each([250, 500])('planted cluster, cells of %d m', (cellSize) => {
  let surface: StabilitySurface;
  beforeAll(() => {
    surface = surfaceFor(cellSize);
  });

  it('one excess area, containing the cluster centre, within the cells that can hold the cluster', () => {
    const areas = stableAreas(surface).filter((area) => area.kind === 'excess');
    expect(areas).toHaveLength(1);
    const centres = maskCentres(surface, surface.stableExcess);
    const { raster } = surface;
    const centrePixel = Math.floor((raster.y0 - CENTRE[1]) / raster.side) * raster.width + Math.floor((CENTRE[0] - raster.x0) / raster.side);
    expect(surface.stableExcess[centrePixel]).toBe(1);
    // a pixel can share a cell with cluster points only within a cell diagonal of the cluster's disk
    const reach = RADIUS + cellSize * Math.SQRT2;
    for (const [x, y] of centres) expect(Math.hypot(x - CENTRE[0], y - CENTRE[1])).toBeLessThanOrEqual(reach);
    expect(areas[0]!.maxShare).toBeGreaterThan(surface.calibration!.excessThreshold);
    expect(areas[0]!.areaKm2).toBeCloseTo((centres.length * raster.side * raster.side) / 1e6, 9);
  });

  it('no deficit area on a pattern with no planted gap', () => {
    expect(stableAreas(surface).filter((area) => area.kind === 'deficit')).toHaveLength(0);
  });

  it('the same areas when the data are shifted by whole cells', () => {
    const dx = 3 * cellSize;
    const dy = -2 * cellSize;
    const shifted = surfaceFor(cellSize, (x, y) => [x + dx, y + dy]);
    const expected = maskCentres(surface, surface.stableExcess).map(([x, y]) => key([x + dx, y + dy])).sort();
    expect(maskCentres(shifted, shifted.stableExcess).map(key).sort()).toEqual(expected);
    expect(maskCentres(shifted, shifted.stableDeficit)).toEqual([]);
    expect(shifted.calibration!.excessThreshold).toBe(surface.calibration!.excessThreshold);
  });

  it('the same areas when the data and study area are turned by 90 degrees', () => {
    // counter-clockwise about the study area's centre (1000, 1000): (x, y) -> (2000 - y, x)
    const turn: Transform = (x, y) => [2000 - y, x];
    const turned = surfaceFor(cellSize, turn);
    const expected = maskCentres(surface, surface.stableExcess).map(([x, y]) => key(turn(x, y))).sort();
    expect(maskCentres(turned, turned.stableExcess).map(key).sort()).toEqual(expected);
    expect(turned.calibration!.excessThreshold).toBe(surface.calibration!.excessThreshold);
    const areas = stableAreas(turned).filter((area) => area.kind === 'excess');
    expect(areas.map((area) => area.areaKm2)).toEqual(stableAreas(surface).filter((area) => area.kind === 'excess').map((area) => area.areaKm2));
  });

  it('does not depend on how the placements are split into chunks', () => {
    const split = runSurface({ region: REGION, observed, simulated, cellSize, placements: PLACEMENTS, chunk: 3 });
    expect(Array.from(split.stableExcess)).toEqual(Array.from(surface.stableExcess));
    expect(Array.from(split.excessShare)).toEqual(Array.from(surface.excessShare));
    expect(Array.from(split.calibration!.excessMaxima)).toEqual(Array.from(surface.calibration!.excessMaxima));
  });
});

describe('planted cluster, hexagons of area 250 m x 250 m (Halton placements with rotation)', () => {
  it('one excess area holding the cluster centre, within reach of the cluster, no deficit area', () => {
    const placements = Float64Array.from(haltonPlacements(24, true, 60).flatMap((p) => [p.u, p.v, p.angle]));
    const surface = runSurface({ region: REGION, observed, simulated, cellSize: 250, shape: 'hex', placements });
    const areas = stableAreas(surface);
    expect(areas.filter((area) => area.kind === 'excess')).toHaveLength(1);
    expect(areas.filter((area) => area.kind === 'deficit')).toHaveLength(0);
    const { raster } = surface;
    const centrePixel = Math.floor((raster.y0 - CENTRE[1]) / raster.side) * raster.width + Math.floor((CENTRE[0] - raster.x0) / raster.side);
    expect(surface.stableExcess[centrePixel]).toBe(1);
    // a hexagon of area s^2 has circumradius s sqrt(2 / (3 sqrt 3)) = 0.62 s: a pixel shares a cell with the cluster
    // only within a cell diameter of the disk
    const reach = RADIUS + 2 * 0.6204 * 250;
    for (const [x, y] of maskCentres(surface, surface.stableExcess)) expect(Math.hypot(x - CENTRE[0], y - CENTRE[1])).toBeLessThanOrEqual(reach);
  });
});
