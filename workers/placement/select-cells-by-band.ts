/**
 * The kept cells of a placement without the whole grid's coverage in memory: the coverage is accumulated, summed
 * and selected one band of grid rows at a time (geometry/coverage.ts, the same edges' pieces per row), so a thread
 * holds one band (at most BAND_CELLS values) instead of nx x ny. The kept cells are exactly those of
 * selectCells(placementCoverage(...)): the same coverages (each row's values come from the same numbers in the same
 * order) in the same grid storage order. At 1e7 points (3.3 million grid cells, 2 million kept) a thread holds 2 MB of
 * coverage instead of 27.
 * Cost O(cells + edge crossings + E x bands) for E ring edges: every band visits every edge, and the grids that have
 * more than one band are those with more than BAND_CELLS cells.
 */
import { accumulateRing, assertGridSize, extentOf, ringsInCellUnits, settledCoverage } from '../geometry/coverage.js';
import type { BandBuffers, GridExtent, KeptCells, Origin, Placement, Region } from '../types.js';
import { forEachRingEdge } from '../geometry/ring-edges.js';
import { keepThreshold } from './select-cells.js';

/** Cells per band: 2 MB of float64. */
export const BAND_CELLS = 1 << 18;

export function createBandBuffers(): BandBuffers {
  return { band: new Float64Array(0), kept: { index: new Int32Array(0), coverage: new Float64Array(0) } };
}

/**
 * An upper bound of the cells with positive coverage, the same at every angle (so that a thread's kept arrays, sized
 * by it, serve every placement of a cell size): a cell no ring edge crosses is wholly inside the region or wholly
 * outside, so they are at most the region's area in cells (its rings' signed area, holes negative) plus the cells
 * the edges pass through, at most ceil|dx| + ceil|dy| + 1 <= sqrt(2) L + 3 per edge of length L (one more cell per
 * grid line crossed); 8 more absorb float noise in the lengths.
 */
export function keptCellBound(rings: Float64Array[]): number {
  let twiceArea = 0;
  let crossed = 0;
  forEachRingEdge(rings, (x0, y0, x1, y1) => {
    twiceArea += x0 * y1 - x1 * y0;
    crossed += Math.SQRT2 * Math.hypot(x1 - x0, y1 - y0) + 3;
  });
  return Math.ceil(Math.abs(twiceArea) / 2 + crossed) + 8;
}

/** A larger copy of the kept arrays (safety net: keptCellBound holds, so this is not expected to run). */
function grow(kept: KeptCells, used: number, capacity: number): KeptCells {
  const index = new Int32Array(capacity);
  const coverage = new Float64Array(capacity);
  index.set(kept.index.subarray(0, used));
  coverage.set(kept.coverage.subarray(0, used));
  return { index, coverage };
}

/**
 * The grid extent and the kept cells (coverage >= keepThreshold(minCoverage) and > 0, grid storage order) of
 * the square lattice's placement. `buffers`: reused and updated (the kept cells are views of buffers.kept, valid until
 * the next call). `bandCells`: cells per band (tests use small bands).
 */
export function selectCellsByBand(
  region: Region,
  origin: Origin,
  cellSize: number,
  placement: Placement,
  minCoverage: number,
  buffers: BandBuffers,
  bandCells = BAND_CELLS,
): { grid: GridExtent; kept: KeptCells } {
  const threshold = keepThreshold(minCoverage);
  const rings = ringsInCellUnits(region, origin, cellSize, placement);
  const grid = extentOf(rings);
  const { i0, j0, nx, ny } = grid;
  assertGridSize(nx, ny, `cell size ${cellSize} m`);
  const bandRows = Math.max(1, Math.min(ny, Math.floor(bandCells / nx)));
  // a full band's room at once: grids of other angles then fit without a new array (why: evaluate-chunk.ts THREAD_BUFFERS)
  if (buffers.band.length < bandRows * nx) buffers.band = new Float64Array(Math.max(bandRows * nx, Math.min(nx * ny, bandCells)));
  const bound = Math.min(nx * ny, keptCellBound(rings));
  if (buffers.kept.index.length < bound) buffers.kept = { index: new Int32Array(bound), coverage: new Float64Array(bound) };
  let m = 0;
  // locals, not buffers.kept's fields, in the loop, and the prefix sums fused with the selection: 1.4 ms per placement
  // at 200,000 cells against 1.8 (CPU profile of a 1e6-point sweep)
  let index = buffers.kept.index;
  let coverage = buffers.kept.coverage;
  for (let rowFrom = 0; rowFrom < ny; rowFrom += bandRows) {
    const rows = Math.min(bandRows, ny - rowFrom);
    const band = buffers.band.subarray(0, rows * nx).fill(0);
    for (const ring of rings) accumulateRing(band, ring, i0, j0, nx, rows, rowFrom);
    // each row's prefix sum (coverage.ts prefixSumRows) and the selection in one pass
    for (let row = 0; row < rows; row++) {
      const start = row * nx;
      let running = 0;
      for (let column = 0; column < nx; column++) {
        running += band[start + column]!;
        const c = settledCoverage(running);
        if (c > 0 && c >= threshold) {
          if (m === index.length) {
            buffers.kept = grow(buffers.kept, m, Math.min(nx * ny, 2 * m + 1));
            ({ index, coverage } = buffers.kept);
          }
          index[m] = rowFrom * nx + start + column;
          coverage[m++] = c;
        }
      }
    }
  }
  return { grid, kept: { index: buffers.kept.index.subarray(0, m), coverage: buffers.kept.coverage.subarray(0, m) } };
}
