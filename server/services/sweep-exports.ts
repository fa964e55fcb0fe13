/**
 * Exports of a finished sweep: the per-placement rows (CSV and JSON, exactly as computed), one placement's grid as
 * GeoJSON (streamed) or GeoPackage (a temporary file, streamed and removed), and the single-file HTML report.
 * Only a `done` sweep has rows: others get 409. Grid exports are bounded in cells (grid-export/grid-cells.ts) and
 * one GeoPackage is written at a time.
 */
import { createReadStream } from 'node:fs';
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Readable } from 'node:stream';
import type { PlacementRow } from '../../shared/contracts.js';
import { conflictError, exportBusyError, notFoundError } from '../errors.js';
import { boundedCellGrid, type GridFormat, type GridRequest } from '../grid-export/grid-cells.js';
import { effectiveCoordinates, gridGeoJsonChunks, type GridCoordinates } from '../grid-export/grid-geojson.js';
import { writeGridGeoPackage } from '../grid-export/grid-geopackage.js';
import { renderReport } from '../report/render-report.js';
import { reportMap } from '../report/report-map.js';
import type { GridshakeStore } from '../store/store.js';
import { ROWS_PER_CHUNK } from '../store/placement-store.js';
import type { SweepRecord } from '../store/sweep-store.js';
import { placementsToCsv } from '../sweeps/placements-csv.js';
import { downloadName } from '../../shared/messages/download-names.js';
import type { DatasetService } from './dataset-service.js';
import { areasGeoJson } from '../stability/areas-geojson.js';
import { stabilitySurfaceFrame } from '../stability/surface-frame.js';
import { gridTypedFrame } from '../grid-export/grid-typed-frame.js';
import type { SweepService } from './sweep-service.js';

export class SweepExports {
  constructor(
    private readonly store: GridshakeStore,
    private readonly datasets: DatasetService,
    private readonly sweeps: SweepService,
  ) {}

  private finished(id: string): SweepRecord {
    const record = this.sweeps.record(id);
    if (record.status !== 'done' || record.summary === null) {
      throw conflictError(`sweep ${id} is ${record.status}; its results exist only once it is done`);
    }
    return record;
  }

  rows(id: string): PlacementRow[] {
    this.finished(id);
    return this.store.placements.read(id);
  }

  csv(id: string): string {
    const record = this.finished(id);
    return placementsToCsv(this.store.placements.read(id), { sweepId: id, summary: record.summary! });
  }

  /** The download name of an export of sweep `id`: dataset name and cell sides, e.g. gridshake-heath-250m-report.html. */
  downloadName(id: string, what: string, extension: string): string {
    const summary = this.finished(id).summary!;
    return downloadName(summary.dataset.name, summary.sizes.map((size) => size.cellSize), what, extension);
  }

  /**
   * A stability file of a done sweep by its name: `stability-<side>m.tif` (the stored GeoTIFF) or
   * `excess-areas-<side>m.geojson` (stored with the full outlines; made from summary.stability for sweeps stored before
   * it was). 404 naming the files the sweep has.
   */
  stabilityFile(id: string, name: string): { type: string; body: Buffer | string } {
    const record = this.finished(id);
    const entries = record.summary!.stability ?? [];
    const known = entries.flatMap((entry) => [entry.files.tif, entry.files.geojson]);
    const entry = entries.find((candidate) => candidate.files.tif === name || candidate.files.geojson === name);
    if (entry === undefined) {
      throw notFoundError(
        known.length === 0
          ? `sweep ${id} has no stability surface (it ran before surfaces were computed)`
          : `sweep ${id} has no file ${name}; it has ${known.join(', ')}`,
      );
    }
    if (name === entry.files.tif) {
      const bytes = this.store.stability.read(id, name);
      if (bytes === undefined) throw notFoundError(`sweep ${id} has no stored ${name}`);
      return { type: 'image/tiff; application=geotiff', body: bytes };
    }
    // stored with every area's outline when the sweep finished (stored-stability.ts); older sweeps: from the summary
    const stored = this.store.stability.read(id, name);
    if (stored !== undefined) return { type: 'application/geo+json; charset=utf-8', body: stored.toString('utf8') };
    const dataset = this.datasets.load(record.datasetId);
    return { type: 'application/geo+json; charset=utf-8', body: `${JSON.stringify(areasGeoJson(entry, dataset.projection, dataset.name))}\n` };
  }

  /**
   * The stability surface of cell size `sizeIndex` for the page, as a typed frame read from the stored GeoTIFF
   * (server/stability/surface-frame.ts). 404 when the sweep or the size has no surface.
   */
  async stabilitySurface(id: string, sizeIndex: number): Promise<Uint8Array> {
    const record = this.finished(id);
    const entries = record.summary!.stability ?? [];
    const entry = entries.find((candidate) => candidate.sizeIndex === sizeIndex);
    if (entry === undefined) {
      throw notFoundError(
        entries.length === 0
          ? `sweep ${id} has no stability surface (it ran before surfaces were computed)`
          : `sweep ${id} has no stability surface for size=${sizeIndex}; it has sizes ${entries.map((candidate) => candidate.sizeIndex).join(', ')}`,
      );
    }
    const bytes = this.store.stability.read(id, entry.files.tif);
    if (bytes === undefined) throw notFoundError(`sweep ${id} has no stored ${entry.files.tif}`);
    return stabilitySurfaceFrame(bytes, entry);
  }

  /** Placement `placementIndex` at size `sizeIndex` as the page's compact grid (server/grid-export/grid-typed-frame.ts). */
  gridFrame(id: string, sizeIndex: number, placementIndex: number): Uint8Array {
    const { dataset, request, cells } = this.boundedGrid(id, sizeIndex, placementIndex, 'geojson');
    const record = this.finished(id);
    return gridTypedFrame({ origin: dataset.origin, request, cells, alpha: record.plan.alpha, flagsByWeight: record.summary!.expectedFrom === 'baseline' });
  }

  report(id: string): string {
    const record = this.finished(id);
    const summary = record.summary!;
    return renderReport(summary, this.store.placements.read(id), reportMap(this.datasets.load(record.datasetId), summary));
  }

  private gridRequest(id: string, sizeIndex: number, placementIndex: number): { request: GridRequest; datasetId: string } {
    const record = this.finished(id);
    const sizes = record.summary!.sizes.length;
    if (sizeIndex >= sizes) throw notFoundError(`sweep ${id} has ${sizes} cell sizes; size=${sizeIndex} does not exist (0 to ${sizes - 1})`);
    if (placementIndex >= record.plan.placements) {
      throw notFoundError(
        `sweep ${id} has ${record.plan.placements} placements per size; placement=${placementIndex} does not exist (0 to ${record.plan.placements - 1})`,
      );
    }
    const row = this.findRow(id, sizeIndex, placementIndex, record.plan.placements);
    if (row === undefined) throw notFoundError(`sweep ${id} has no row for size ${sizeIndex}, placement ${placementIndex}`);
    return {
      datasetId: record.datasetId,
      request: {
        cellSize: row.cellSize,
        shape: row.shape ?? 'square',
        placement: { u: row.u, v: row.v, angle: row.angle },
        minCoverage: record.plan.minCoverage,
        sizeIndex,
        placementIndex,
      },
    };
  }

  private boundedGrid(id: string, sizeIndex: number, placementIndex: number, format: GridFormat) {
    const { request, datasetId } = this.gridRequest(id, sizeIndex, placementIndex);
    const dataset = this.datasets.load(datasetId);
    return { dataset, request, cells: boundedCellGrid(dataset, request, format) };
  }

  /**
   * GeoJSON of placement `placementIndex` at cell size `sizeIndex` as a stream of text: longitude/latitude where the
   * system is known, unless `coordinates` is 'planar'. Refused (422) above MAX_GEOJSON_GRID_CELLS before any text.
   */
  gridGeoJson(id: string, sizeIndex: number, placementIndex: number, coordinates?: GridCoordinates): Readable {
    const { dataset, request, cells } = this.boundedGrid(id, sizeIndex, placementIndex, 'geojson');
    return Readable.from(
      gridGeoJsonChunks({
        datasetName: dataset.name,
        projection: dataset.projection,
        origin: dataset.origin,
        request,
        cells,
        coordinates: effectiveCoordinates(dataset.projection, coordinates),
      }),
    );
  }

  /** The whole grid GeoJSON as text (tests, small grids). */
  async gridGeoJsonText(id: string, sizeIndex: number, placementIndex: number, coordinates?: GridCoordinates): Promise<string> {
    let text = '';
    for await (const chunk of this.gridGeoJson(id, sizeIndex, placementIndex, coordinates)) text += chunk as string;
    return text;
  }

  private geoPackageBusy = false;

  /**
   * The grid as a GeoPackage file, streamed from a temporary folder that is removed once sent (or on error).
   * Refused (422) above MAX_GEOPACKAGE_GRID_CELLS; one at a time (429 while another is written).
   */
  async gridGeoPackage(id: string, sizeIndex: number, placementIndex: number): Promise<Readable> {
    if (this.geoPackageBusy) {
      throw exportBusyError( 'another grid GeoPackage is being written; try again when it is done');
    }
    this.geoPackageBusy = true;
    let folder: string | undefined;
    try {
      const { dataset, request, cells } = this.boundedGrid(id, sizeIndex, placementIndex, 'gpkg');
      folder = await mkdtemp(join(tmpdir(), 'gridshake-gpkg-'));
      const path = join(folder, 'grid.gpkg');
      await writeGridGeoPackage({ path, datasetName: dataset.name, projection: dataset.projection, request, cells });
      const stream = createReadStream(path);
      const remove = folder;
      folder = undefined;
      stream.once('close', () => void rm(remove, { recursive: true, force: true }));
      return stream;
    } finally {
      this.geoPackageBusy = false;
      if (folder !== undefined) await rm(folder, { recursive: true, force: true });
    }
  }

  /** Rows are stored size by size, placement by placement; look in the expected chunk, else scan all rows. */
  private findRow(id: string, sizeIndex: number, placementIndex: number, placements: number): PlacementRow | undefined {
    const matches = (row: PlacementRow): boolean => row.sizeIndex === sizeIndex && row.placementIndex === placementIndex;
    const position = sizeIndex * placements + placementIndex;
    const guess = this.store.placements.readChunk(id, Math.floor(position / ROWS_PER_CHUNK));
    return guess.find(matches) ?? this.store.placements.read(id).find(matches);
  }
}
