/**
 * Shared WebAssembly memories that hold point sets, so that the WebAssembly counting kernel
 * (workers/lattice/square/wasm-square-counter.ts) reads the points where they are instead of a copy per thread.
 * The memory's buffer is an ordinary SharedArrayBuffer: everything else reads the points through typed arrays as
 * before. Each thread that counts takes its own scratch region (cell counts, deferred points) by growing the memory:
 * growing a shared memory is atomic and returns the old size, so two threads never get the same region, and it
 * never moves or detaches what other threads see. Pages beyond the points are reserved address space only until a
 * thread grows into them.
 */

/** A WebAssembly memory as the engine uses it (the project's TypeScript libraries do not declare WebAssembly). */
export interface WasmMemory {
  readonly buffer: ArrayBufferLike;
  /** Grows by `pages` pages of WASM_PAGE bytes and returns the old size in pages; throws RangeError past the maximum. */
  grow(pages: number): number;
}

/** The parts of the WebAssembly global the engine calls. */
export interface WasmApi {
  Memory: new (descriptor: { initial: number; maximum: number; shared: boolean }) => WasmMemory;
  Module: new (bytes: Uint8Array) => object;
  Instance: new (module: object, imports: object) => { exports: Record<string, unknown> };
  validate(bytes: Uint8Array): boolean;
}

/** The WebAssembly global, or undefined where the runtime has none. */
export const wasmApi: WasmApi | undefined = (globalThis as unknown as { WebAssembly?: WasmApi }).WebAssembly;

/** Bytes per WebAssembly page. */
export const WASM_PAGE = 65536;

/** Largest 32-bit WebAssembly memory, in pages (4 GiB). */
const MAX_PAGES = 65536;

/**
 * Pages reserved beyond the points for the threads' scratch regions (address space, not memory, until used): 256 MB,
 * enough for several threads' counts of grids of millions of cells. A thread that finds no room left counts with the
 * JavaScript kernel instead.
 */
export const SCRATCH_RESERVE_PAGES = 4096;

/** Pages holding `bytes` bytes. */
export function pagesFor(bytes: number): number {
  return Math.ceil(bytes / WASM_PAGE);
}

/**
 * A zeroed shared buffer of `bytes` bytes for point sets: the buffer of a shared WebAssembly memory with room for the
 * threads' scratch regions when the runtime can make one, else a plain SharedArrayBuffer (memory null).
 */
export function createPointBuffer(bytes: number): { buffer: SharedArrayBuffer; memory: WasmMemory | null } {
  const initial = Math.max(1, pagesFor(bytes));
  if (wasmApi !== undefined && initial < MAX_PAGES) {
    try {
      const memory = new wasmApi.Memory({ initial, maximum: Math.min(MAX_PAGES, initial + SCRATCH_RESERVE_PAGES), shared: true });
      return { buffer: memory.buffer as SharedArrayBuffer, memory };
    } catch {
      // no shared WebAssembly memory here (or no address space for it): plain shared memory, JavaScript kernel
    }
  }
  return { buffer: new SharedArrayBuffer(bytes), memory: null };
}
