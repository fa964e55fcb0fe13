/**
 * The stability chunk's fast square path (a multiplication by 1 / s, the division near cell edges) finds the same cell
 * for every pixel centre as the grid contract's formula (shared/design.md: i = floor((dx cos t + dy sin t) / s - u),
 * through workers/stability/pixel-cells.ts), including centres that lie exactly on cell edges, and the sparse chunk
 * encoding lists exactly the pixels outside every kept cell; results of another layout are refused. Invented geometry.
 */
import { describe, expect, it } from 'vitest';
import { decodeStability, StabilityChunk } from '../../workers/stability/stability-chunk.js';
import { pixelCellLocator, squarePixelFrame } from '../../workers/stability/pixel-cells.js';
import { StabilityAccumulator } from '../../server/stability/stability-accumulator.js';
import type { CoverageGrid, KeptCells, Placement } from '../../workers/types.js';

const raster = { x0: 0, y0: 800, side: 12.5, width: 64, height: 64 };
const pixels = Uint32Array.from({ length: 64 * 64 }, (_, k) => k);
const origin = { x: 0, y: 0 };
const cellSize = 100;
const grid: CoverageGrid = { i0: -2, j0: -2, nx: 14, ny: 14, coverage: new Float64Array(196) };
// every cell whose (i + 2 j) mod 3 is not 0 is kept
const keptIndex = Int32Array.from([...Array(196).keys()].filter((c) => ((c % 14) + 2 * Math.floor(c / 14)) % 3 !== 0));
const kept: KeptCells = { index: keptIndex, coverage: new Float64Array(keptIndex.length).fill(1) };

/** Grid cell 91 (i = 5, j = 4): kept, wholly inside the raster at angle 0. */
const HOT_CELL = 91;

function encoded(placement: Placement, fast: boolean, side = cellSize): Float64Array {
  const chunk = new StabilityChunk({ ...raster, side: side / 8 }, pixels, 0.05);
  const locate = pixelCellLocator('square', origin, side, placement, grid);
  chunk.beginPlacement(locate, grid, kept, fast ? squarePixelFrame('square', origin, side, placement) : null);
  // one kept cell far above the others: an excess cell whose pixels are listed
  const counts = new Float64Array(kept.index.length).fill(3);
  counts[keptIndex.indexOf(HOT_CELL)] = 60;
  chunk.addObserved(counts, kept.coverage);
  const out = new Float64Array(chunk.length);
  chunk.encode(out, 0);
  return out;
}

describe('stability chunk: pixel cells and sparse encoding', () => {
  it.each([
    ['offset 1/16: pixel centres on every eighth column and row lie exactly on cell edges', { u: 1 / 16, v: 1 / 16, angle: 0 }],
    ['rotated and offset', { u: 0.3183, v: 0.7071, angle: 33.3 }],
    ['rotated 45 degrees', { u: 0, v: 0.5, angle: 45 }],
  ])('%s', (_name, placement) => {
    const fast = encoded(placement, true);
    const exact = encoded(placement, false);
    expect(Array.from(fast)).toEqual(Array.from(exact));
    // the pixels outside every kept cell, by the contract's formula one by one
    const locate = pixelCellLocator('square', origin, cellSize, placement, grid);
    const keptCells = new Set(keptIndex);
    const outside: number[] = [];
    for (const q of pixels) {
      const row = Math.floor(q / raster.width);
      const col = q - row * raster.width;
      const cell = locate(raster.x0 + (col + 0.5) * raster.side, raster.y0 - (row + 0.5) * raster.side);
      if (!keptCells.has(cell)) outside.push(q);
    }
    const part = decodeStability(fast, 0);
    expect(part.placements).toBe(1);
    const listed = Array.from(part.notKept).filter((_, t) => t % 2 === 0);
    expect(listed).toEqual(outside);
    // the excess cell's pixels: 8 x 8 at angle 0 (pixel side s / 8), about as many when rotated
    if (placement.angle === 0) expect(part.excess.length).toBe(2 * 64);
    else expect(part.excess.length / 2).toBeGreaterThan(40);
  });

  it('200 cell sides with a pixel centre exactly on a cell edge by the contract (x / s - u an integer)', () => {
    let differs = 0;
    for (let trial = 0; trial < 200; trial++) {
      const side = 50 + trial * 0.4973;
      // pixel column 17's centre: x / s - u is exactly floor(x / s) by the contract's division
      const x = (17 + 0.5) * (side / 8);
      const u = x / side - Math.floor(x / side);
      const placement = { u, v: 0.25, angle: 0 };
      expect(Array.from(encoded(placement, true, side))).toEqual(Array.from(encoded(placement, false, side)));
      if (x * (1 / side) - u !== x / side - u) differs += 1;
    }
    // the multiplication alone would disagree with the division at some of these edges: the band decides them
    expect(differs).toBeGreaterThan(0);
  });
});

describe('stability chunk: refusals', () => {
  it('a chunk result of another layout (the dense one of earlier versions) is refused with a message, not misread', () => {
    // the earlier layout: three values per valid pixel, then E and the pairs
    const dense = new Float64Array(3 * 10 + 1).fill(1);
    expect(() => decodeStability(dense, 0)).toThrow(/update gridshake on every machine/);
    const truncated = encoded({ u: 0.1, v: 0.2, angle: 0 }, true).slice(0, -1);
    expect(() => decodeStability(truncated, 0)).toThrow(/stability layout/);
  });

  it('a pixel position outside the raster is refused by the accumulator', () => {
    const accumulator = new StabilityAccumulator(raster, pixels, 0);
    const part = Float64Array.of(1, 1, 0, 0, 0, pixels.length + 3, 1);
    expect(() => accumulator.addChunk(part, 0)).toThrow(/valid pixel 4099 of 4096/);
  });

  it('two chunks at once in one thread: the first one refuses to go on (they share the thread\'s counters)', () => {
    const placement = { u: 0.1, v: 0.2, angle: 0 };
    const first = new StabilityChunk(raster, pixels, 0.05);
    const second = new StabilityChunk(raster, pixels, 0.05);
    const locate = pixelCellLocator('square', origin, cellSize, placement, grid);
    expect(() => first.beginPlacement(locate, grid, kept, null)).toThrow(/two stability chunks were used at once/);
    second.beginPlacement(locate, grid, kept, null);
    const out = new Float64Array(second.length);
    second.encode(out, 0);
    expect(decodeStability(out, 0).placements).toBe(1);
  });
});
