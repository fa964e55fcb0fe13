/**
 * The point counter the engine uses: one per point set (built once per dataset), able to count on every lattice.
 * It dispatches on the coverage grid's shape tag (absent = square), so counts always come from the lattice that made
 * the grid. The square kernel is built at once; another lattice's kernel on first use. Cost: the lattice kernel's.
 */
import { latticeOf } from '../lattice/registry.js';
import type { CellCounter } from '../lattice/lattice.js';
import type { CellShape } from '../lattice/cell-shape.js';
import type { CountArray, GridExtent, Origin, Placement } from '../types.js';
import { createWasmSquareCounter } from '../lattice/square/wasm-square-counter.js';
import type { WasmMemory } from '../wasm/wasm-memory.js';

export type { CellCounter } from '../lattice/lattice.js';

/**
 * A counter over the flat points xy (x0, y0, x1, y1, ...), planar metres, against grid origin `origin`. When xy is a
 * view of a shared WebAssembly memory (`memory`, workers/wasm/wasm-memory.ts), squares are counted by the WebAssembly
 * kernel where the runtime can run it (the same counts).
 */
export function createCellCounter(xy: Float64Array, origin: Origin, memory: WasmMemory | null = null): CellCounter {
  const square = (memory === null ? null : createWasmSquareCounter(memory, xy, origin)) ?? latticeOf('square').createCounter(xy, origin);
  const others = new Map<CellShape, CellCounter>();
  return {
    pointCount: square.pointCount,
    // every lattice counts into an int32 array: the square kernel's own arrays (if it has them) serve them all
    countBuffer: square.countBuffer,
    ownsCountBuffer: square.ownsCountBuffer,
    count(grid: GridExtent, cellSize: number, placement: Placement, out: CountArray): void {
      const shape = grid.shape;
      if (shape === undefined || shape === 'square') {
        square.count(grid, cellSize, placement, out);
        return;
      }
      let counter = others.get(shape);
      if (counter === undefined) {
        counter = latticeOf(shape).createCounter(xy, origin);
        others.set(shape, counter);
      }
      counter.count(grid, cellSize, placement, out);
    },
  };
}
