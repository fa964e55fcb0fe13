/**
 * The square counting kernel in WebAssembly SIMD (count-kernel.wat) over points held in a shared WebAssembly memory
 * (workers/wasm/wasm-memory.ts): the same contract and the same float64 operations as square-counter.ts, two points
 * per step. Fast pass per block of BLOCK points, then the exact pass (division, floor) over the points it deferred,
 * both in WebAssembly. The counts go straight to `out` when it is this thread's array from countBuffer (in the memory:
 * in a sweep, the observed pattern's counts, and the simulated patterns' without the stability surface), else to the
 * thread's scratch region of the memory and are copied to `out` (an int32 or float64 array: the copy converts; in a
 * sweep, the simulated patterns' float64 counts with the surface).
 * Measured on the 2-core test machine, 1e5 Morton-sorted points, 5 per cell, 64 rotated placements, one thread:
 * about 3.1 ns per point-placement against 4.1 (clustered) to 6.0 (uniform) for the JavaScript kernel.
 * A thread whose memory has no room left for its scratch region, or a runtime without WebAssembly SIMD, counts with
 * the JavaScript kernel: the counts are the same either way.
 * Cost O(n + cells) per placement; memory, in the shared memory, per thread and memory: a scratch region of 32 KB plus
 * 4 bytes per grid cell for copied counts (at least one 64 KiB page), and the countBuffer array. Regions are reused
 * while large enough; a larger grid takes a new one (the old one stays reserved in the memory: regions are never
 * given back).
 */
import type { CountArray, GridExtent, Origin, Placement } from '../../types.js';
import { cosSinDegrees } from '../../geometry/grid-frame.js';
import type { CellCounter } from '../lattice.js';
import { pagesFor, WASM_PAGE, wasmApi, type WasmMemory } from '../../wasm/wasm-memory.js';
import { WASM_BASE64 } from './count-kernel-wasm.js';
import { BLOCK, checkCountArguments, createSquareCounter, nearLineBand } from './square-counter.js';

type FastPass = (pts: number, pairs: number, out: number, deferred: number, ox: number, oy: number, cosOverSize: number, sinOverSize: number, shiftX: number, shiftY: number, nx: number, ny: number, near: number) => number;
type ExactPass = (pts: number, deferred: number, count: number, out: number, ox: number, oy: number, cos: number, sin: number, s: number, u: number, v: number, i0: number, j0: number, nx: number, ny: number) => void;

/** The kernel instantiated on one memory in this thread, with the thread's scratch region of that memory. */
interface Kernel {
  fastPass: FastPass;
  exactPass: ExactPass;
  memory: WasmMemory;
  /** byte address and size of the scratch region: deferred point indices (BLOCK int32), then the cell counts */
  scratch: number;
  scratchBytes: number;
  deferred: Int32Array;
  counts: Int32Array;
  /** the count array this thread took from the memory (countBuffer), reused while large enough: counted into in place */
  owned: Int32Array | null;
}

/** Counts this thread made with the JavaScript kernel because a memory had no room left (tests check it stays 0). */
let fallbacks = 0;

/** How many counts of this thread fell back to the JavaScript kernel for want of room in the memory. */
export function wasmFallbackCount(): number {
  return fallbacks;
}

let compiled: object | null | undefined;

/** The compiled kernel module, or null where the runtime cannot run it (no WebAssembly, no SIMD or threads). */
function kernelModule(): object | null {
  if (compiled === undefined) {
    compiled = null;
    const bytes = Uint8Array.from(Buffer.from(WASM_BASE64, 'base64'));
    try {
      if (wasmApi !== undefined && wasmApi.validate(bytes)) compiled = new wasmApi.Module(bytes);
    } catch {
      compiled = null;
    }
  }
  return compiled;
}

// one instance per memory in this thread; it goes with the memory
const kernels = new WeakMap<WasmMemory, Kernel>();

function kernelFor(memory: WasmMemory): Kernel | null {
  let kernel = kernels.get(memory);
  if (kernel === undefined) {
    const module = kernelModule();
    if (module === null || wasmApi === undefined) return null;
    const { exports } = new wasmApi.Instance(module, { env: { memory } });
    kernel = {
      fastPass: exports.fastPass as FastPass,
      exactPass: exports.exactPass as ExactPass,
      memory,
      scratch: 0,
      scratchBytes: 0,
      deferred: new Int32Array(0),
      counts: new Int32Array(0),
      owned: null,
    };
    kernels.set(memory, kernel);
  }
  return kernel;
}

/** A fresh region of at least `bytes` bytes of the memory for this thread: its byte address and size, or null when the memory has no room left. */
function takeRegion(memory: WasmMemory, bytes: number): { at: number; bytes: number } | null {
  const pages = pagesFor(bytes);
  try {
    return { at: memory.grow(pages) * WASM_PAGE, bytes: pages * WASM_PAGE };
  } catch {
    return null;
  }
}

/**
 * Makes the thread's scratch region hold the deferred list and `cells` counts, growing the memory by a fresh region
 * (a quarter more than asked, so that a sweep's sizes rarely grow it twice). False when the memory has no room left.
 */
function reserveScratch(kernel: Kernel, cells: number): boolean {
  const bytes = 4 * BLOCK + 4 * cells;
  if (bytes <= kernel.scratchBytes) return true;
  const region = takeRegion(kernel.memory, Math.ceil(bytes * 1.25));
  if (region === null) return false;
  kernel.scratch = region.at;
  kernel.scratchBytes = region.bytes;
  const buffer = kernel.memory.buffer;
  kernel.deferred = new Int32Array(buffer, kernel.scratch, BLOCK);
  kernel.counts = new Int32Array(buffer, kernel.scratch + 4 * BLOCK, (kernel.scratchBytes - 4 * BLOCK) / 4);
  return true;
}

/**
 * A counter over the points xy (x0, y0, x1, y1, ...; planar metres), a view of `memory`'s buffer, against grid origin
 * `origin`; null where the runtime cannot run the WebAssembly kernel.
 */
export function createWasmSquareCounter(memory: WasmMemory, xy: Float64Array, origin: Origin): CellCounter | null {
  const kernel = kernelFor(memory);
  if (kernel === null) return null;
  const pointCount = xy.length >> 1;
  const points = xy.byteOffset;
  let fallback: CellCounter | null = null;
  return {
    pointCount,
    count(grid: GridExtent, cellSize: number, placement: Placement, out: CountArray): void {
      checkCountArguments(grid, cellSize, out);
      const cells = grid.nx * grid.ny;
      // the array of countBuffer's is counted into where it is; any other gets a copy of the scratch region's counts
      const inPlace = out === kernel.owned;
      if (!reserveScratch(kernel, inPlace ? 0 : cells)) {
        fallbacks += 1;
        fallback ??= createSquareCounter(xy, origin);
        fallback.count(grid, cellSize, placement, out);
        return;
      }
      const { cos, sin } = cosSinDegrees(placement.angle);
      const inverse = 1 / cellSize;
      const cosOverSize = cos * inverse;
      const sinOverSize = sin * inverse;
      const shiftX = placement.u + grid.i0;
      const shiftY = placement.v + grid.j0;
      const near = nearLineBand(grid);
      const { fastPass, exactPass, deferred } = kernel;
      const counts = inPlace ? out : kernel.counts;
      const listed = kernel.scratch;
      const cellsAt = inPlace ? out.byteOffset : listed + 4 * BLOCK;
      counts.fill(0, 0, cells);
      for (let start = 0; start < pointCount; start += BLOCK) {
        const length = Math.min(BLOCK, pointCount - start);
        const at = points + 16 * start;
        let deferredCount = fastPass(at, length >> 1, cellsAt, listed, origin.x, origin.y, cosOverSize, sinOverSize, shiftX, shiftY, grid.nx, grid.ny, near);
        // an odd block's last point takes the exact pass
        if ((length & 1) === 1) deferred[deferredCount++] = length - 1;
        if (deferredCount > 0) {
          exactPass(at, listed, deferredCount, cellsAt, origin.x, origin.y, cos, sin, cellSize, placement.u, placement.v, grid.i0, grid.j0, grid.nx, grid.ny);
        }
      }
      if (!inPlace) out.set(kernel.counts.subarray(0, cells));
    },
    countBuffer(cells: number): Int32Array | null {
      if (kernel.owned !== null && kernel.owned.length >= cells) return kernel.owned;
      const region = takeRegion(kernel.memory, 4 * cells);
      if (region === null) return null;
      kernel.owned = new Int32Array(kernel.memory.buffer, region.at, region.bytes / 4);
      return kernel.owned;
    },
    ownsCountBuffer(array: Int32Array): boolean {
      return array === kernel.owned;
    },
  };
}
