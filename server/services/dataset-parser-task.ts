/**
 * The upload parser's task, run in a worker thread (see dataset-parser.ts): read the uploaded files from their
 * temporary paths, parse, validate and project them (loadDataset), summarise, and store the dataset in one
 * transaction through the worker's own connection to the data folder's database. The main thread receives only the
 * stored summary, so neither the parsing nor the copy of a 2,000,000-point dataset runs on the event loop.
 * With an in-memory store (tests) there is no file to share: the dataset comes back (copied) and the main thread
 * stores it.
 * Refusals come back as values ({ ok: false, error }), since a thrown error loses its code crossing threads.
 * The same thread also lists the numeric properties of a baseline polygon file (FieldNamesTask, the page's field
 * picker for GeoPackage layers), so reading that file never runs on the event loop either.
 */
import { readFileSync } from 'node:fs';
import { dirname } from 'node:path';
import type { Dataset } from '../../shared/contracts.js';
import { isGridshakeError } from '../errors.js';
import type { ErrorCode } from '../../shared/error-codes.js';
import { loadDataset, summarizeDataset, type DatasetOptions } from '../inputs/index.js';
import { baselineFieldNames } from '../inputs/baseline-field-names.js';
import type { InputFile } from '../inputs/index.js';
import type { StoredDatasetSummary } from '../store/dataset-store.js';
import { GridshakeStore } from '../store/store.js';
import { storageWriteError } from '../store/write-failure.js';

export interface UploadedFile {
  /** the name the client gave (used in every message) */
  name: string;
  /** where the bytes were streamed to */
  path: string;
}

export interface ParseTask {
  points: UploadedFile;
  area?: UploadedFile;
  noData: UploadedFile[];
  baseline?: UploadedFile;
  controls?: UploadedFile;
  options: DatasetOptions;
  /** the data folder's database file, or null for an in-memory store (the dataset is returned instead) */
  databasePath: string | null;
  /** the demo scenario's folder name, for a demo dataset */
  sampleId: string | null;
}

/** The numeric properties of one baseline polygon file, for the page's field picker (no dataset is made). */
export interface FieldNamesTask {
  fieldsOf: UploadedFile;
}

export type FieldNamesOutcome = { ok: true; fields: string[] } | { ok: false; error: { code: ErrorCode; message: string } };

export type ParseOutcome =
  | { ok: true; summary: StoredDatasetSummary }
  | { ok: true; summary: null; dataset: Dataset; datasetSummary: ReturnType<typeof summarizeDataset> }
  | { ok: false; error: { code: ErrorCode; message: string } };

let store: { path: string; store: GridshakeStore } | null = null;

function storeFor(databasePath: string): GridshakeStore {
  if (store?.path !== databasePath) {
    store?.store.close();
    store = { path: databasePath, store: GridshakeStore.open(dirname(databasePath)) };
  }
  return store.store;
}

function read(file: UploadedFile): InputFile {
  return { name: file.name, content: new Uint8Array(readFileSync(file.path)) };
}

function fieldNamesOf(file: UploadedFile): FieldNamesOutcome {
  try {
    return { ok: true, fields: baselineFieldNames(read(file)) };
  } catch (error) {
    if (isGridshakeError(error)) return { ok: false, error: { code: error.code, message: error.message } };
    throw error;
  }
}

export default function parseUpload(task: ParseTask | FieldNamesTask): ParseOutcome | FieldNamesOutcome {
  if ('fieldsOf' in task) return fieldNamesOf(task.fieldsOf);
  try {
    const dataset = loadDataset(
      {
        points: read(task.points),
        area: task.area === undefined ? undefined : read(task.area),
        noData: task.noData.map(read),
        baseline: task.baseline === undefined ? undefined : read(task.baseline),
        controls: task.controls === undefined ? undefined : read(task.controls),
      },
      task.options,
    );
    const summary = summarizeDataset(dataset);
    if (task.databasePath !== null) {
      return { ok: true, summary: storeFor(task.databasePath).datasets.insert(dataset, summary, task.sampleId) };
    }
    return { ok: true, summary: null, dataset, datasetSummary: summary };
  } catch (error) {
    // coded errors travel as data: a thrown error's own properties (code) do not survive the worker boundary
    const coded = isGridshakeError(error) ? error : storageWriteError(error);
    if (coded !== null) return { ok: false, error: { code: coded.code, message: coded.message } };
    throw error;
  }
}
