/**
 * The rule every hostile input must obey: loadDataset either returns a valid Dataset or throws a GridshakeError with
 * a GS_ERR_ code, a 4xx status and a short message that says what is wrong. Anything else (another exception, an
 * invalid dataset, a run past its time bound) is a failure, described in one line for the report.
 */
import type { Dataset } from '../../shared/contracts.js';
import { GridshakeError } from '../../server/errors.js';
import { loadDataset, type DatasetInput, type DatasetOptions } from '../../server/inputs/index.js';

/** Longest acceptable error message: enough for file, line, feature and reason, never an echo of a huge field. */
export const MAX_MESSAGE_LENGTH = 4096;

export type HostileOutcome = { kind: 'dataset'; dataset: Dataset } | { kind: 'refused'; error: GridshakeError };

const finite = (values: ArrayLike<number>): boolean => Array.from(values).every(Number.isFinite);

/** Why `dataset` breaks the Dataset contract (shared/contracts.ts), or null when it is valid. */
export function datasetProblem(dataset: Dataset): string | null {
  const n = dataset.ids.length;
  if (dataset.xy.length !== 2 * n) return `xy holds ${dataset.xy.length} numbers for ${n} ids`;
  if (n === 0) return 'a dataset without points';
  if (!finite(dataset.xy)) return 'a non-finite point coordinate';
  let previous = -1;
  for (const index of dataset.inside) {
    if (index <= previous || index >= n) return `inside index ${index} out of order or range`;
    previous = index;
  }
  if (dataset.inside.length === 0) return 'no point inside the valid region';
  if (dataset.inside.length + dataset.outsideIds.length !== n) return 'inside and outside do not add up to n';
  const { region } = dataset;
  if (!(Number.isFinite(region.area) && region.area > 0)) return `valid area ${region.area}`;
  if (region.rings.length === 0) return 'a region without rings';
  for (const ring of region.rings) {
    if (ring.length < 6 || ring.length % 2 !== 0 || !finite(ring)) return 'a malformed region ring';
  }
  const { bbox } = region;
  if (!finite([bbox.minX, bbox.minY, bbox.maxX, bbox.maxY]) || bbox.minX >= bbox.maxX || bbox.minY >= bbox.maxY) {
    return 'a degenerate or non-finite region bounding box';
  }
  if (!finite([dataset.origin.x, dataset.origin.y])) return 'a non-finite grid origin';
  if (!dataset.warnings.every((w) => typeof w.code === 'string' && typeof w.message === 'string')) return 'a bad warning';
  return null;
}

/** Why `error` is not an acceptable refusal, or null when it is one. */
export function refusalProblem(error: unknown): string | null {
  if (!(error instanceof GridshakeError)) {
    const name = error instanceof Error ? error.name : typeof error;
    const message = error instanceof Error ? error.message : String(error);
    return `uncoded ${name}: ${message.slice(0, 200)}`;
  }
  if (!/^GS_ERR_[A-Z_]+$/.test(error.code)) return `bad code ${error.code}`;
  if (error.statusCode < 400 || error.statusCode > 499) return `status ${error.statusCode} for ${error.code}`;
  if (error.message.trim() === '') return `empty message for ${error.code}`;
  if (error.message.length > MAX_MESSAGE_LENGTH) return `message of ${error.message.length} characters`;
  return null;
}

export interface HostileCase {
  label: string;
  input: DatasetInput;
  options: DatasetOptions;
}

export interface HostileResult {
  outcome: HostileOutcome | null;
  failure: string | null;
  milliseconds: number;
}

/** Run one case with a time bound (checked after the call: the inputs are synchronous). */
export function runHostileCase(testCase: HostileCase, boundMs: number): HostileResult {
  const started = performance.now();
  let outcome: HostileOutcome | null = null;
  let failure: string | null = null;
  try {
    const dataset = loadDataset(testCase.input, testCase.options);
    outcome = { kind: 'dataset', dataset };
    failure = datasetProblem(dataset);
  } catch (error) {
    failure = refusalProblem(error);
    if (failure === null) outcome = { kind: 'refused', error: error as GridshakeError };
  }
  const milliseconds = performance.now() - started;
  if (failure === null && milliseconds > boundMs) failure = `took ${milliseconds.toFixed(0)} ms, bound ${boundMs} ms`;
  return { outcome, failure: failure === null ? null : `${testCase.label}: ${failure}`, milliseconds };
}

/** Tally of a batch: cases run, refusals, datasets, and the failures described. */
export interface HostileTally {
  cases: number;
  datasets: number;
  refused: number;
  failures: string[];
  codes: Map<string, number>;
}

export function runHostileBatch(cases: HostileCase[], boundMs: number): HostileTally {
  const tally: HostileTally = { cases: 0, datasets: 0, refused: 0, failures: [], codes: new Map() };
  for (const testCase of cases) {
    const result = runHostileCase(testCase, boundMs);
    tally.cases += 1;
    if (result.failure !== null) tally.failures.push(result.failure);
    else if (result.outcome?.kind === 'dataset') tally.datasets += 1;
    else if (result.outcome?.kind === 'refused') {
      tally.refused += 1;
      tally.codes.set(result.outcome.error.code, (tally.codes.get(result.outcome.error.code) ?? 0) + 1);
    }
  }
  return tally;
}
