/**
 * DatasetParser: uploads are parsed, validated, projected and stored in a worker thread (dataset-parser-task.ts),
 * never on the event loop, so that reads and event streams stay prompt while the largest allowed upload
 * (2,000,000 points, 64 MB) is processed. The route streams the uploaded files to a temporary folder; the worker
 * reads them from there. One thread, started on the first upload and kept while the server runs; uploads wait
 * their turn. It runs below the request thread's priority (dataset-parser-entry.cts). It is not ended when idle:
 * tearing down a thread whose heap held a 2,000,000-point parse stalled the request thread for 1-5 s on a busy
 * machine (the thread's memory is unmapped while the process's other threads wait), so its heap shrinks by garbage
 * collection instead. A worker that runs out of memory fails that upload only (413); the pool replaces it.
 */
import { join } from 'node:path';
import { Piscina } from 'piscina';
import { GridshakeError, tooLargeError } from '../errors.js';
import type { DatasetOptions } from '../inputs/index.js';
import type { StoredDatasetSummary } from '../store/dataset-store.js';
import type { GridshakeStore } from '../store/store.js';
import type { FieldNamesOutcome, FieldNamesTask, ParseOutcome, ParseTask, UploadedFile } from './dataset-parser-task.js';
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
      // never ended for being idle (setTimeout's largest delay, about 24.8 days; Infinity would mean 1 ms)
      idleTimeout: 2 ** 31 - 1,
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

  /** The numeric properties of a baseline polygon file (GeoJSON or GeoPackage), read in the worker; coded refusals. */
  async baselineFields(file: UploadedFile): Promise<string[]> {
    const task: FieldNamesTask = { fieldsOf: file };
    let outcome: FieldNamesOutcome;
    try {
      outcome = (await this.pool.run(task)) as FieldNamesOutcome;
    } catch (error) {
      if ((error as NodeJS.ErrnoException).code === 'ERR_WORKER_OUT_OF_MEMORY') {
        throw tooLargeError(`${file.name}: the file needs more memory than the parser may use (${PARSER_HEAP_MB} MB)`);
      }
      throw error;
    }
    if (!outcome.ok) throw new GridshakeError(outcome.error.code, outcome.error.message);
    return outcome.fields;
  }

  async destroy(): Promise<void> {
    await this.pool.destroy();
  }
}
