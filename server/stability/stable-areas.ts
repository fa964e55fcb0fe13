/**
 * The stable areas of a stability surface as polygons with their properties: for each kind (excess, deficit) the
 * 4-connected components of the stable pixels (pixel-polygons.ts), each with its largest share (`maxShare`) and its
 * area (`areaKm2`, pixels x pixel area in the working system's planar metres: true areas for longitude/latitude input,
 * which is worked in a local equal-area projection).
 */
import type { StabilitySurface } from './stability-accumulator.js';
import { pixelPolygons } from './pixel-polygons.js';

export type AreaKind = 'excess' | 'deficit';

export interface StableArea {
  kind: AreaKind;
  /** largest share over the area's pixels */
  maxShare: number;
  areaKm2: number;
  pixels: number;
  /** planar metres, closed; outer counter-clockwise, holes clockwise */
  outer: [number, number][];
  holes: [number, number][][];
}

/** Every stable area of the surface, excess first, each kind largest share first. Empty without calibration. */
export function stableAreas(surface: StabilitySurface): StableArea[] {
  const pixelArea = surface.raster.side * surface.raster.side;
  const areas: StableArea[] = [];
  for (const kind of ['excess', 'deficit'] as const) {
    const mask = kind === 'excess' ? surface.stableExcess : surface.stableDeficit;
    const share = kind === 'excess' ? surface.excessShare : surface.deficitShare;
    const found = pixelPolygons(mask, surface.raster).map((polygon) => {
      let maxShare = 0;
      for (const pixel of polygon.pixels) maxShare = Math.max(maxShare, share[pixel]!);
      return {
        kind,
        maxShare: Number(maxShare.toFixed(6)),
        areaKm2: (polygon.pixels.length * pixelArea) / 1e6,
        pixels: polygon.pixels.length,
        outer: polygon.outer,
        holes: polygon.holes,
      };
    });
    found.sort((a, b) => b.maxShare - a.maxShare || b.areaKm2 - a.areaKm2);
    areas.push(...found);
  }
  return areas;
}
