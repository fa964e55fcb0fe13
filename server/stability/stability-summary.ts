/**
 * The stability surface's part of summary.json: per (shape, cell size) the raster, the calibration, the observed
 * largest shares and the stable areas with their planar rings (rounded to the centimetre), enough for the report's
 * table and map and for the areas' GeoJSON without the raster.
 */
import type { StabilitySizeSummary } from '../../shared/contracts.js';
import type { StabilitySurface } from './stability-accumulator.js';
import { stableAreas } from './stable-areas.js';
import { calibrationNote } from './stability-notes.js';
import { stabilityFileNames } from './stability-files.js';

const round = (value: number): number => Math.round(value * 100) / 100;

function largest(share: Float32Array, assessed: Uint8Array): number {
  let best = 0;
  for (let p = 0; p < share.length; p++) if (assessed[p] === 1 && share[p]! > best) best = share[p]!;
  return Number(best.toFixed(6));
}

export function stabilitySummary(surface: StabilitySurface, sizeIndex: number, bothShapes: boolean): StabilitySizeSummary {
  const calibration = surface.calibration;
  const finite = (value: number | undefined): number | null => (value === undefined || !Number.isFinite(value) ? null : value);
  const [tif, geojson] = stabilityFileNames(surface.cellSize, surface.shape, bothShapes);
  return {
    sizeIndex,
    shape: surface.shape,
    cellSize: surface.cellSize,
    placements: surface.placements,
    raster: { ...surface.raster },
    sims: calibration?.sims ?? 0,
    level: calibration?.level ?? null,
    excessThreshold: finite(calibration?.excessThreshold),
    deficitThreshold: finite(calibration?.deficitThreshold),
    maxExcessShare: largest(surface.excessShare, surface.assessed),
    maxDeficitShare: largest(surface.deficitShare, surface.assessed),
    areas: stableAreas(surface).map((area) => ({
      kind: area.kind,
      maxShare: area.maxShare,
      areaKm2: Number(area.areaKm2.toPrecision(6)),
      rings: [area.outer, ...area.holes].map((ring) => ring.map(([x, y]) => [round(x), round(y)] as [number, number])),
    })),
    note: calibrationNote(surface),
    files: { tif, geojson },
  };
}
