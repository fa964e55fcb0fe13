/**
 * Every stable area of a stability surface (stable-areas.ts) as summary.json and the areas' GeoJSON write it: kind,
 * largest share, area in km^2 (6 significant digits) and the planar rings rounded to the centimetre. summary.json keeps
 * a capped list of these (stability-summary.ts); the GeoJSON files all of them. Cost O(pixels + ring vertices) the first
 * time per surface; both callers of a sweep (the summary, then the files) get the same list, traced once.
 */
import type { StableAreaSummary } from '../../shared/contracts.js';
import type { StabilitySurface } from './stability-accumulator.js';
import { stableAreas } from './stable-areas.js';

const round = (value: number): number => Math.round(value * 100) / 100;

const traced = new WeakMap<StabilitySurface, readonly StableAreaSummary[]>();

export function areaSummaries(surface: StabilitySurface): readonly StableAreaSummary[] {
  let summaries = traced.get(surface);
  if (summaries === undefined) {
    // frozen, rings included: the summary and the files share these objects, so none may change them
    summaries = Object.freeze(traceAreas(surface).map((area) => Object.freeze({ ...area, rings: Object.freeze(area.rings.map((ring) => Object.freeze(ring))) as [number, number][][] })));
    traced.set(surface, summaries);
  }
  return summaries;
}

function traceAreas(surface: StabilitySurface): StableAreaSummary[] {
  return stableAreas(surface).map((area) => ({
    kind: area.kind,
    maxShare: area.maxShare,
    areaKm2: Number(area.areaKm2.toPrecision(6)),
    rings: [area.outer, ...area.holes].map((ring) => ring.map(([x, y]) => [round(x), round(y)] as [number, number])),
  }));
}
