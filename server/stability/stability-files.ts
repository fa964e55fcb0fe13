/**
 * The per-size files of the stability surface that `sweep --out` writes: `stability-<side>m.tif` (GeoTIFF, band 1
 * excess share, band 2 deficit share) and `excess-areas-<side>m.geojson` (the stable excess and deficit areas).
 * `<side>m` is the cell side as every per-size file name writes it (server/messages/download-names.ts sideTag:
 * 4 significant digits, e.g. 250m, 111.8m); when a plan has both shapes, the hexagons' files carry `hex-` before the
 * side (stability-hex-250m.tif) so that the two shapes of one side stay apart.
 */
import type { ProjectionInfo, StabilitySizeSummary } from '../../shared/contracts.js';
import { sideTag } from '../../shared/messages/download-names.js';
import type { CellShape } from '../../workers/lattice/cell-shape.js';
import { areasGeoJson } from './areas-geojson.js';
import { areaSummaries } from './area-summaries.js';
import type { StabilitySurface } from './stability-accumulator.js';
import { stabilityGeoTiff } from './stability-geotiff.js';

/** `<side>m`, or `hex-<side>m` for hexagons in a plan with both shapes. */
export function stabilitySizeTag(cellSize: number, shape: CellShape, bothShapes: boolean): string {
  return `${bothShapes && shape === 'hex' ? 'hex-' : ''}${sideTag(cellSize)}`;
}

/** The two file names of one (shape, cell size). */
export function stabilityFileNames(cellSize: number, shape: CellShape, bothShapes: boolean): [tif: string, geojson: string] {
  const tag = stabilitySizeTag(cellSize, shape, bothShapes);
  return [`stability-${tag}.tif`, `excess-areas-${tag}.geojson`];
}

/** Every stability file of a sweep, as (name, content) pairs; `summaries` are summary.stability, in the same order. */
export function stabilityFiles(
  surfaces: readonly StabilitySurface[],
  summaries: readonly StabilitySizeSummary[],
  projection: ProjectionInfo,
  datasetName: string,
): [string, string | Uint8Array][] {
  return surfaces.flatMap((surface, k) => {
    const summary = summaries[k]!;
    return [
      [summary.files.tif, stabilityGeoTiff(surface, projection)],
      [summary.files.geojson, `${JSON.stringify(areasGeoJson(summary, projection, datasetName, areaSummaries(surface)))}\n`],
    ] as [string, string | Uint8Array][];
  });
}
