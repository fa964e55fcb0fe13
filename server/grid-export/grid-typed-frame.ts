/**
 * One placement's grid for the page as a typed frame (shared/binary/page-frames.ts): the lattice parameters and, per
 * cell with coverage > 0, its storage index, count, coverage, expected count and kept flag as typed arrays. The page
 * rebuilds each cell's polygon from the lattice (workers/lattice), so 1e5 cells cost about 2.5 MB instead of about
 * 30 MB of GeoJSON text, and no parsing of coordinates. Expected counts are the exports' own (describe-cells.ts
 * cellAt), so the page and grid.geojson agree.
 */
import { cellAt, type CellGrid } from '../../workers/placement/index.js';
import type { GridFrameMeta } from '../../shared/binary/page-frames.js';
import { encodeTypedFrame } from '../../shared/binary/typed-frame.js';
import type { GridRequest } from './grid-cells.js';

export interface GridFrameInput {
  origin: { x: number; y: number };
  request: GridRequest;
  cells: CellGrid;
  alpha: number;
  /** the stability flags weigh kept cells by the baseline weights (expected from baseline polygons), not by area */
  flagsByWeight: boolean;
}

export function gridTypedFrame(input: GridFrameInput): Uint8Array {
  const { cells, request } = input;
  const { grid } = cells;
  const n = cells.cellCount;
  const cell = new Uint32Array(n);
  const count = new Int32Array(n);
  const coverage = new Float64Array(n);
  const expected = new Float64Array(n);
  const kept = new Uint8Array(n);
  const weighted = input.flagsByWeight && cells.weights !== undefined;
  const flagWeight = new Float64Array(weighted ? n : 0);
  let at = 0;
  for (let k = 0; k < grid.coverage.length; k++) {
    const described = cellAt(cells, k);
    if (described === null) continue;
    cell[at] = k;
    count[at] = described.count;
    coverage[at] = described.coverage;
    expected[at] = described.expected ?? Number.NaN;
    kept[at] = described.kept ? 1 : 0;
    if (weighted) flagWeight[at] = cells.weights![k]!;
    at += 1;
  }
  const meta: GridFrameMeta = {
    sizeIndex: request.sizeIndex,
    placementIndex: request.placementIndex,
    shape: request.shape ?? 'square',
    cellSize: request.cellSize,
    origin: input.origin,
    placement: { u: request.placement.u, v: request.placement.v, angle: request.placement.angle },
    minCoverage: request.minCoverage,
    i0: grid.i0,
    j0: grid.j0,
    nx: grid.nx,
    ny: grid.ny,
    alpha: input.alpha,
  };
  return encodeTypedFrame(meta, weighted ? { cell, count, coverage, expected, kept, flagWeight } : { cell, count, coverage, expected, kept });
}
