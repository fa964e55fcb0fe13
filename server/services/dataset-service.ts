/**
 * Datasets: build one from uploaded files (server/inputs does the parsing and checks), store it, list, read, draw
 * and delete. A dataset is stored only after it loaded completely, in one transaction, so a bad upload changes nothing.
 * Uploads and demo scenarios are parsed and stored in a worker thread (createFromUpload, DatasetParser), so the
 * server's thread never loads the input libraries (a faster start) nor parses on the event loop.
 */
import type { Dataset, DatasetGeometry } from '../../shared/contracts.js';
import { notFoundError } from '../errors.js';
import type { DatasetOptions } from '../inputs/index.js';
import type { StoredDatasetSummary } from '../store/dataset-store.js';
import type { GridshakeStore } from '../store/store.js';
import type { DatasetParser, UploadedDataset, UploadedFile } from './dataset-parser.js';
import { datasetGeometry } from './dataset-geometry.js';
import type { SweepQueue } from './sweep-queue.js';

export class DatasetService {
  constructor(
    private readonly store: GridshakeStore,
    private readonly queue: SweepQueue,
    private readonly maxPoints: number,
    private readonly parser: DatasetParser | null = null,
  ) {}

  /** Parse, validate and store uploaded files off the event loop; the same refusals as `create`. */
  async createFromUpload(files: UploadedDataset, options: DatasetOptions, sampleId: string | null = null): Promise<StoredDatasetSummary> {
    if (this.parser === null) throw new Error('this DatasetService has no upload parser');
    return this.parser.create(files, { ...options, maxPoints: Math.min(options.maxPoints ?? Infinity, this.maxPoints) }, sampleId);
  }


  /** The numeric properties of an uploaded baseline polygon file, for the page's field picker (issue 15). */
  async baselineFields(file: UploadedFile): Promise<string[]> {
    if (this.parser === null) throw new Error('this DatasetService has no upload parser');
    return this.parser.baselineFields(file);
  }

  list(): StoredDatasetSummary[] {
    return this.store.datasets.list();
  }

  get(id: string): StoredDatasetSummary {
    const summary = this.store.datasets.summary(id);
    if (summary === undefined) throw notFoundError(`no dataset with id ${id}`);
    return summary;
  }

  load(id: string): Dataset {
    const dataset = this.store.datasets.load(id);
    if (dataset === undefined) throw notFoundError(`no dataset with id ${id}`);
    return dataset;
  }

  geometry(id: string, maxPoints?: number): DatasetGeometry {
    return datasetGeometry(this.load(id), maxPoints);
  }

  /** Delete a dataset with its sweeps; a queued or running sweep of it is cancelled first. */
  delete(id: string): void {
    this.get(id);
    for (const sweep of this.store.sweeps.list(id)) {
      if (this.queue.isActive(sweep.id)) this.queue.cancel(sweep.id);
    }
    this.store.datasets.delete(id);
  }
}
