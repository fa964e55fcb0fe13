/**
 * The two square counting kernels the engine has, as makers of a counter over given points: the JavaScript kernel
 * (workers/lattice/square/square-counter.ts) and the WebAssembly SIMD kernel (wasm-square-counter.ts) over a copy of
 * the points in a shared WebAssembly memory. Tests run the same contract checks on both.
 */
import { createCellCounter, type CellCounter } from '../../../workers/placement/cell-counter.js';
import { createWasmSquareCounter, wasmFallbackCount } from '../../../workers/lattice/square/wasm-square-counter.js';
import { createPointBuffer, type WasmMemory } from '../../../workers/wasm/wasm-memory.js';
import type { Origin } from '../../../workers/types.js';

/**
 * A copy of xy in a new shared WebAssembly memory, 8 bytes from its start (so that the kernel's 16-byte loads are
 * not aligned), and that memory. Throws where the runtime cannot make one: a test must not pass on the fallback.
 */
export function pointsInMemory(xy: Float64Array, spareBytes = 0): { xy: Float64Array; memory: WasmMemory } {
  const { buffer, memory } = createPointBuffer(8 + xy.byteLength + spareBytes);
  if (memory === null) throw new Error('this runtime made no shared WebAssembly memory');
  const view = new Float64Array(buffer, 8, xy.length);
  view.set(xy);
  return { xy: view, memory };
}

/**
 * A counter of xy by the WebAssembly kernel; throws where the runtime cannot run it, and from `count` when a count
 * fell back to the JavaScript kernel (so a test of this kind cannot pass on the fallback).
 */
export function wasmCounter(xy: Float64Array, origin: Origin): CellCounter {
  const copy = pointsInMemory(xy);
  if (createWasmSquareCounter(copy.memory, copy.xy, origin) === null) throw new Error('this runtime cannot run the WebAssembly kernel');
  const counter = createCellCounter(copy.xy, origin, copy.memory);
  return {
    pointCount: counter.pointCount,
    count(grid, cellSize, placement, out) {
      const before = wasmFallbackCount();
      counter.count(grid, cellSize, placement, out);
      if (wasmFallbackCount() !== before) throw new Error('the count fell back to the JavaScript kernel');
    },
  };
}

export const counterKinds: [string, (xy: Float64Array, origin: Origin) => CellCounter][] = [
  ['JavaScript', (xy, origin) => createCellCounter(xy, origin)],
  ['WebAssembly', wasmCounter],
];
