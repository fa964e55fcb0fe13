import { describe, it, expect } from 'vitest';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { Worker } from 'node:worker_threads';
import { placementCoverage } from '../../../workers/geometry/coverage.js';
import { createCellCounter } from '../../../workers/placement/cell-counter.js';
import { createWasmSquareCounter, wasmFallbackCount } from '../../../workers/lattice/square/wasm-square-counter.js';
import { WASM_BASE64 } from '../../../workers/lattice/square/count-kernel-wasm.js';
import { createPointBuffer, WASM_PAGE, type WasmMemory } from '../../../workers/wasm/wasm-memory.js';
import { PACKAGE_ROOT } from '../../../server/services/project-paths.js';
import { regionFromRings } from '../geometry/region-fixtures.js';
import { pointsInMemory } from '../placement/counter-kinds.js';

const origin = { x: 120, y: -40 };
const region = regionFromRings([[[120, -40], [2120, -40], [2120, 1460], [120, 1460]]]);

/** n points spread over the region by two irrational rotations, every 13th exactly on a vertical line of the 25 m grid at angle 0. */
function spread(n: number): Float64Array {
  const xy = new Float64Array(2 * n);
  for (let p = 0; p < n; p++) {
    xy[2 * p] = p % 13 === 0 ? 120 + 25 * (p % 80) : 120 + ((p * 0.7548776662466927) % 1) * 2000;
    xy[2 * p + 1] = -40 + ((p * 0.5698402909980532) % 1) * 1500;
  }
  return xy;
}

const PLACEMENTS = [{ u: 0, v: 0, angle: 0 }, { u: 0.37, v: 0.81, angle: 23.5 }, { u: 0.9, v: 0.05, angle: 71 }];

describe('the WebAssembly counting kernel', () => {
  it('its committed binary is the assembly of count-kernel.wat by wabt 1.0.37, the WebAssembly text format reference toolkit', async () => {
    const tool = pathToFileURL(join(PACKAGE_ROOT, 'tools', 'assemble-wasm.mjs')).href;
    const { assembleWat } = (await import(tool)) as { assembleWat: (path: string) => Promise<Uint8Array> };
    const assembled = await assembleWat(join(PACKAGE_ROOT, 'workers', 'lattice', 'square', 'count-kernel.wat'));
    expect(Buffer.from(WASM_BASE64, 'base64').equals(Buffer.from(assembled))).toBe(true);
  });

  it('counts into float64 output exactly what it counts into int32 output, and what the JavaScript kernel counts (odd point counts too)', () => {
    for (const n of [1, 2, 3, 8191, 8193, 20001]) {
      const xy = spread(n);
      const inMemory = pointsInMemory(xy);
      const wasm = createWasmSquareCounter(inMemory.memory, inMemory.xy, origin);
      expect(wasm).not.toBeNull();
      for (const placement of PLACEMENTS) {
        const grid = placementCoverage(region, origin, 25, placement);
        const expected = new Int32Array(grid.nx * grid.ny);
        createCellCounter(xy, origin).count(grid, 25, placement, expected);
        const asInt = new Int32Array(grid.nx * grid.ny).fill(3);
        const asFloat = new Float64Array(grid.nx * grid.ny).fill(3);
        wasm!.count(grid, 25, placement, asInt);
        wasm!.count(grid, 25, placement, asFloat);
        expect(Array.from(asInt)).toEqual(Array.from(expected));
        expect(Array.from(asFloat)).toEqual(Array.from(expected));
        expect(asInt.reduce((a, b) => a + b, 0)).toBe(n);
      }
    }
  });

  it('counts in place into its own count arrays (countBuffer), and the counts are the JavaScript kernel\'s', () => {
    const xy = spread(12345);
    const inMemory = pointsInMemory(xy);
    const counter = createCellCounter(inMemory.xy, origin, inMemory.memory);
    for (const placement of PLACEMENTS) {
      const grid = placementCoverage(region, origin, 20, placement);
      const own = counter.countBuffer!(grid.nx * grid.ny);
      expect(own).not.toBeNull();
      expect(own!.buffer.byteLength).toBeGreaterThan(inMemory.xy.byteLength);
      own!.fill(9);
      counter.count(grid, 20, placement, own!);
      const expected = new Int32Array(grid.nx * grid.ny);
      createCellCounter(xy, origin).count(grid, 20, placement, expected);
      expect(Array.from(own!.subarray(0, grid.nx * grid.ny))).toEqual(Array.from(expected));
    }
    // a counter of points outside WebAssembly memory has none to give
    expect(createCellCounter(xy, origin).countBuffer).toBeUndefined();
  });

  it('grows its scratch region when a larger grid comes, and counts with the JavaScript kernel when the memory has no room left', () => {
    const xy = spread(5000);
    // a memory without spare pages: no scratch region can be had
    const full = new (globalThis as unknown as { WebAssembly: { Memory: new (d: object) => WasmMemory } }).WebAssembly.Memory({ initial: 2, maximum: 2, shared: true });
    const view = new Float64Array(full.buffer, 0, xy.length);
    view.set(xy);
    const roomless = createCellCounter(view, origin, full);
    const roomy = pointsInMemory(xy);
    const grower = createCellCounter(roomy.xy, origin, roomy.memory);
    const pages = (): number => roomy.memory.buffer.byteLength / WASM_PAGE;
    const grownBy: number[] = [];
    for (const side of [200, 50, 10, 50]) {
      const grid = placementCoverage(region, origin, side, PLACEMENTS[1]!);
      const expected = new Int32Array(grid.nx * grid.ny);
      createCellCounter(xy, origin).count(grid, side, PLACEMENTS[1]!, expected);
      const fellBack = wasmFallbackCount();
      const out = new Int32Array(grid.nx * grid.ny);
      roomless.count(grid, side, PLACEMENTS[1]!, out);
      expect(Array.from(out)).toEqual(Array.from(expected));
      expect(wasmFallbackCount()).toBe(fellBack + 1);
      const before = pages();
      grower.count(grid, side, PLACEMENTS[1]!, out.fill(0));
      expect(Array.from(out)).toEqual(Array.from(expected));
      expect(wasmFallbackCount()).toBe(fellBack + 1);
      grownBy.push(pages() - before);
    }
    expect(full.buffer.byteLength).toBe(2 * WASM_PAGE);
    // 200 m and 50 m cells fit the first region (one page); 10 m cells (about 45,000 of them) need a larger one;
    // back to 50 m, the larger region is reused
    expect(grownBy[0]).toBe(1);
    expect(grownBy[1]).toBe(0);
    expect(grownBy[2]).toBeGreaterThan(1);
    expect(grownBy[3]).toBe(0);
  });

  it('gives one count array per memory and thread, the same while large enough', () => {
    const inMemory = pointsInMemory(spread(100));
    const counter = createCellCounter(inMemory.xy, origin, inMemory.memory);
    const first = counter.countBuffer!(1000)!;
    expect(counter.countBuffer!(500)).toBe(first);
    expect(counter.ownsCountBuffer!(first)).toBe(true);
    expect(counter.ownsCountBuffer!(new Int32Array(1000))).toBe(false);
    const larger = counter.countBuffer!(first.length + 1)!;
    expect(larger).not.toBe(first);
    expect(counter.ownsCountBuffer!(first)).toBe(false);
  });

  // the threads load the built engine from dist/ (npm test builds first, as for every test that starts threads)
  it('two threads counting the same shared memory at once get the contract counts (each its own scratch region)', async () => {
    const n = 30000;
    const xy = spread(n);
    const { buffer, memory } = createPointBuffer(xy.byteLength);
    expect(memory).not.toBeNull();
    new Float64Array(buffer, 0, xy.length).set(xy);
    const placement = PLACEMENTS[2]!;
    const grid = placementCoverage(region, origin, 10, placement);
    const expected = new Int32Array(grid.nx * grid.ny);
    createCellCounter(xy, origin).count(grid, 10, placement, expected);
    const counterUrl = pathToFileURL(join(PACKAGE_ROOT, 'dist', 'workers', 'placement', 'cell-counter.js')).href;
    const script = `
      const { parentPort, workerData } = require('node:worker_threads');
      import(workerData.counterUrl).then(({ createCellCounter }) => {
        const { memory, n, origin, grid, placement, gate } = workerData;
        const counter = createCellCounter(new Float64Array(memory.buffer, 0, 2 * n), origin, memory);
        const out = new Int32Array(grid.nx * grid.ny);
        // a barrier: both threads start counting together, then each takes its scratch region and counts 20 times
        const arrived = Atomics.add(gate, 0, 1) + 1;
        if (arrived === 2) Atomics.notify(gate, 0);
        else while (Atomics.load(gate, 0) < 2) Atomics.wait(gate, 0, arrived, 50);
        for (let round = 0; round < 20; round++) counter.count(grid, 10, placement, out);
        parentPort.postMessage(out);
      });`;
    const gridExtent = { i0: grid.i0, j0: grid.j0, nx: grid.nx, ny: grid.ny };
    const gate = new Int32Array(new SharedArrayBuffer(4));
    const runs = [0, 1].map(
      () =>
        new Promise<Int32Array>((resolve, reject) => {
          const worker = new Worker(script, { eval: true, workerData: { counterUrl, memory, n, origin, grid: gridExtent, placement, gate } });
          worker.once('message', (out: Int32Array) => void worker.terminate().then(() => resolve(out)));
          worker.once('error', reject);
        }),
    );
    for (const out of await Promise.all(runs)) expect(Array.from(out)).toEqual(Array.from(expected));
  });
});
