/**
 * The stability files of a server sweep, written to the store when the sweep is done: the GeoTIFFs (they need the
 * raster, which summary.json does not hold) and the areas' GeoJSON with every area's full outline (summary.json's
 * list is capped, stability-summary.ts). Sweeps stored before the GeoJSON was stored get it from summary.stability.
 */
import type { ProjectionInfo, SweepSummary } from '../../shared/contracts.js';
import type { GridshakeStore } from '../store/store.js';
import type { StabilitySurface } from './stability-accumulator.js';
import { areasGeoJson } from './areas-geojson.js';
import { stabilityGeoTiff } from './stability-geotiff.js';
import { areaSummaries } from './area-summaries.js';

export function storeStabilityFiles(
  store: GridshakeStore,
  sweepId: string,
  result: { summary: SweepSummary; stability?: StabilitySurface[] },
  projection: ProjectionInfo,
  datasetName: string,
): void {
  const surfaces = result.stability ?? [];
  const entries = result.summary.stability ?? [];
  surfaces.forEach((surface, k) => {
    const entry = entries[k];
    if (entry === undefined) return;
    store.stability.write(sweepId, entry.files.tif, stabilityGeoTiff(surface, projection));
    const geojson = `${JSON.stringify(areasGeoJson(entry, projection, datasetName, areaSummaries(surface)))}\n`;
    store.stability.write(sweepId, entry.files.geojson, new TextEncoder().encode(geojson));
  });
}
