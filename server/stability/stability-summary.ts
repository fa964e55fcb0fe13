/**
 * The stability surface's part of summary.json: per (shape, cell size) the raster, the calibration, the observed
 * largest shares and the stable areas with their planar rings (rounded to the centimetre), enough for the report's
 * table and map without the raster.
 * summary.json stays small: at most MAX_SUMMARY_AREAS areas per size (excess first, each kind largest share first),
 * and rings only while the size's vertices stay within MAX_SUMMARY_VERTICES (an area whose rings would pass it keeps
 * its properties and an empty ring list). A capped size says so (`truncated`, `areasTotal`, and its note); the full
 * geometry is in excess-areas-<side>m.geojson, written from the surface itself (area-summaries.ts).
 */
import type { StabilitySizeSummary, StableAreaSummary } from '../../shared/contracts.js';
import type { StabilitySurface } from './stability-accumulator.js';
import { areaSummaries } from './area-summaries.js';
import { calibrationNote } from './stability-notes.js';
import { stabilityFileNames } from './stability-files.js';

/** Most stable areas listed per (shape, cell size) in summary.json. */
export const MAX_SUMMARY_AREAS = 500;
/** Most ring vertices per (shape, cell size) in summary.json (about 40 bytes each as JSON). */
export const MAX_SUMMARY_VERTICES = 20_000;

/** The areas as summary.json keeps them (the caps above), and whether anything was left out. Cost O(vertices). */
export function cappedAreas(areas: readonly StableAreaSummary[]): { areas: StableAreaSummary[]; truncated: boolean } {
  const listed = areas.slice(0, MAX_SUMMARY_AREAS);
  let truncated = listed.length < areas.length;
  let vertices = 0;
  const kept = listed.map((area) => {
    const count = area.rings.reduce((sum, ring) => sum + ring.length, 0);
    if (vertices + count > MAX_SUMMARY_VERTICES) {
      truncated = true;
      // later areas may still fit: the budget is spent in order, an area's rings all or none
      return { ...area, rings: [] };
    }
    vertices += count;
    return area;
  });
  return { areas: kept, truncated };
}

function largest(share: Float32Array, assessed: Uint8Array): number {
  let best = 0;
  for (let p = 0; p < share.length; p++) if (assessed[p] === 1 && share[p]! > best) best = share[p]!;
  return Number(best.toFixed(6));
}

export function stabilitySummary(surface: StabilitySurface, sizeIndex: number, bothShapes: boolean): StabilitySizeSummary {
  const calibration = surface.calibration;
  const all = areaSummaries(surface);
  const { areas, truncated } = cappedAreas(all);
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
    areas,
    note: truncated
      ? `${calibrationNote(surface)} summary.json lists ${areas.length} of the ${all.length} areas and the outlines of ` +
        `${areas.filter((area) => area.rings.length > 0).length} (at most ${MAX_SUMMARY_AREAS} areas and ${MAX_SUMMARY_VERTICES} ` +
        `vertices per cell size); ${geojson} holds them all.`
      : calibrationNote(surface),
    files: { tif, geojson },
    ...(truncated ? { truncated: true, areasTotal: all.length } : {}),
  };
}
