/**
 * DatasetParser: uploads are parsed, validated, projected and stored in a worker thread (dataset-parser-task.ts),
 * never on the event loop, so that reads and event streams stay prompt while the largest allowed upload
 * (2,000,000 points, 64 MB) is processed. The route streams the uploaded files to a temporary folder; the worker
 * reads them from there. One thread, started on the first upload and ended after a minute without one; uploads wait
 * their turn. A worker that runs out of memory fails that upload only (413); the pool replaces it.
 */
import { join } from 'node:path';
import { Piscina } from 'piscina';
import { GridshakeError, tooLargeError } from '../errors.js';
import type { DatasetOptions } from '../inputs/index.js';
import type { StoredDatasetSummary } from '../store/dataset-store.js';
import type { GridshakeStore } from '../store/store.js';
import type { ParseOutcome, ParseTask, UploadedFile } from './dataset-parser-task.js';
import { PACKAGE_ROOT } from './project-paths.js';

export type { UploadedFile };

/** The compiled CommonJS entry piscina loads (npm run build); it import()s the ES task module. */
export const PARSER_TASK_FILE = join(PACKAGE_ROOT, 'dist', 'server', 'services', 'dataset-parser-entry.cjs');

/** Heap of the parser thread (MB): room for 2,000,000 points with their ids and checks. */
const PARSER_HEAP_MB = 3072;

export interface UploadedDataset {
  points: UploadedFile;
  area?: UploadedFile;
  noData: UploadedFile[];
  /** population at risk: polygons (with options.baselineField) or control points */
  baseline?: UploadedFile;
  controls?: UploadedFile;
}

export class DatasetParser {
  private readonly pool: Piscina;

  constructor(private readonly store: GridshakeStore) {
    this.pool = new Piscina({
      filename: PARSER_TASK_FILE,
      minThreads: 0,
      maxThreads: 1,
      idleTimeout: 60_000,
      resourceLimits: { maxOldGenerationSizeMb: PARSER_HEAP_MB },
    });
  }

  /** Parse and store an upload in the worker; throws the inputs' coded errors (400, 413), nothing stored then. */
  async create(files: UploadedDataset, options: DatasetOptions, sampleId: string | null = null): Promise<StoredDatasetSummary> {
    const task: ParseTask = { ...files, options, databasePath: this.store.path === ':memory:' ? null : this.store.path, sampleId };
    let outcome: ParseOutcome;
    try {
      outcome = (await this.pool.run(task)) as ParseOutcome;
    } catch (error) {
      if ((error as NodeJS.ErrnoException).code === 'ERR_WORKER_OUT_OF_MEMORY') {
        throw tooLargeError(`${files.points.name}: the upload needs more memory than the parser may use (${PARSER_HEAP_MB} MB); split the file`);
      }
      throw error;
    }
    if (!outcome.ok) throw new GridshakeError(outcome.error.code, outcome.error.message);
    if (outcome.summary !== null) return outcome.summary;
    return this.store.datasets.insert(outcome.dataset, outcome.datasetSummary, sampleId);
  }

  async destroy(): Promise<void> {
    await this.pool.destroy();
  }
}
