/**
 * Exports of a finished sweep: the per-placement rows (CSV and JSON, exactly as computed), one placement's grid as
 * GeoJSON, and the single-file HTML report. Only a `done` sweep has rows: others get 409.
 */
import type { PlacementRow } from '../contracts.js';
import { conflictError, notFoundError } from '../errors.js';
import { renderReport } from '../report/render-report.js';
import type { GridshakeStore } from '../store/store.js';
import { ROWS_PER_CHUNK } from '../store/placement-store.js';
import type { SweepRecord } from '../store/sweep-store.js';
import { placementsToCsv } from '../sweeps/placements-csv.js';
import { downloadName } from '../messages/download-names.js';
import type { DatasetService } from './dataset-service.js';
import { placementGrid } from './placement-grid.js';
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

  report(id: string): string {
    const record = this.finished(id);
    return renderReport(record.summary!, this.store.placements.read(id));
  }

  /** GeoJSON of placement `placementIndex` at cell size `sizeIndex`. */
  grid(id: string, sizeIndex: number, placementIndex: number): Record<string, unknown> {
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
    return placementGrid(this.datasets.load(record.datasetId), {
      cellSize: row.cellSize,
      placement: { u: row.u, v: row.v, angle: row.angle },
      minCoverage: record.plan.minCoverage,
      sizeIndex,
      placementIndex,
    });
  }

  /** Rows are stored size by size, placement by placement; look in the expected chunk, else scan all rows. */
  private findRow(id: string, sizeIndex: number, placementIndex: number, placements: number): PlacementRow | undefined {
    const matches = (row: PlacementRow): boolean => row.sizeIndex === sizeIndex && row.placementIndex === placementIndex;
    const position = sizeIndex * placements + placementIndex;
    const guess = this.store.placements.readChunk(id, Math.floor(position / ROWS_PER_CHUNK));
    return guess.find(matches) ?? this.store.placements.read(id).find(matches);
  }
}
