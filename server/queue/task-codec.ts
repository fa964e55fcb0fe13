/**
 * The data of one queued task (a BullMQ job) and of its result. A task carries parameters only: which dataset
 * (content hash and the server's key prefix), the simulation seed and count, the cell size, minCoverage, alpha and
 * its placements (float64, base64, so that they arrive bit for bit). The result is the chunk's Float64Array
 * (workers/sweep/sweep-task.ts layout), stored as raw bytes under the task's result key.
 */
import { isCellShape, type CellShape } from '../../workers/lattice/cell-shape.js';
import type { StabilityRaster } from '../../workers/stability/stability-raster.js';

/**
 * The task and result format; a worker refuses tasks of another. 2: the chunk result's stability part is sparse
 * (workers/stability/stability-chunk.ts), where format 1 carried three values per valid pixel.
 */
export const TASK_FORMAT = 2;

export interface QueueTaskData {
  format: number;
  prefix: string;
  dataset: string;
  pointCount: number;
  seed: number;
  sims: number;
  cellSize: number;
  /** the cells' shape (absent: square, as in tasks of versions before shapes) */
  shape?: CellShape;
  minCoverage: number;
  alpha: number;
  /** base64 of the placements' float64 bytes (u, v, angle triples) */
  placements: string;
  /** the stability surface's raster (absent: no surface) */
  stability?: StabilityRaster;
}

export function encodePlacements(placements: Float64Array): string {
  return Buffer.from(placements.buffer, placements.byteOffset, placements.byteLength).toString('base64');
}

/** Decodes and checks a job's data. @throws Error naming what is wrong */
export function decodeTask(data: unknown): QueueTaskData & { placementValues: Float64Array } {
  const task = data as Partial<QueueTaskData> | null;
  if (task === null || typeof task !== 'object' || task.format !== TASK_FORMAT) {
    throw new Error(`the task has format ${String(task?.format)}; this worker reads format ${TASK_FORMAT} (update gridshake on every machine)`);
  }
  if (task.shape !== undefined && !isCellShape(task.shape)) throw new Error(`the task names cell shape ${JSON.stringify(task.shape)}, which this worker does not know (update gridshake on every machine)`);
  const bytes = Buffer.from(String(task.placements), 'base64');
  if (bytes.byteLength % 24 !== 0) throw new Error('the task placements are damaged');
  const placementValues = new Float64Array(bytes.byteLength / 8);
  new Uint8Array(placementValues.buffer).set(bytes);
  return { ...(task as QueueTaskData), placementValues };
}

/** A result's bytes as they are stored. */
export function encodeResult(result: Float64Array): Buffer {
  return Buffer.from(result.buffer, result.byteOffset, result.byteLength);
}

export function decodeResult(bytes: Buffer): Float64Array {
  if (bytes.byteLength % 8 !== 0) throw new Error('a task result in Redis is damaged');
  const result = new Float64Array(bytes.byteLength / 8);
  new Uint8Array(result.buffer).set(bytes);
  return result;
}
