/**
 * The stability files of a server sweep: the GeoTIFFs are written to the store when the sweep is done (they need the
 * raster, which summary.json does not hold); the areas' GeoJSON is made from summary.stability on request.
 */
import type { ProjectionInfo, SweepSummary } from '../../shared/contracts.js';
import type { GridshakeStore } from '../store/store.js';
import type { StabilitySurface } from './stability-accumulator.js';
import { stabilityGeoTiff } from './stability-geotiff.js';

export function storeStabilityFiles(
  store: GridshakeStore,
  sweepId: string,
  result: { summary: SweepSummary; stability?: StabilitySurface[] },
  projection: ProjectionInfo,
): void {
  const surfaces = result.stability ?? [];
  const entries = result.summary.stability ?? [];
  surfaces.forEach((surface, k) => {
    const entry = entries[k];
    if (entry !== undefined) store.stability.write(sweepId, entry.files.tif, stabilityGeoTiff(surface, projection));
  });
}
