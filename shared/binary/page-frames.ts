/**
 * What the headers of the page's typed frames (typed-frame.ts) hold: the server writes them, the page reads them.
 * - GET /api/sweeps/:id/stability-surface?size=K: SurfaceFrameMeta, arrays `excess` and `deficit` (float32, width x
 *   height, row 0 at the top, NaN outside the valid region: the bands of stability-<side>m.tif);
 * - GET /api/sweeps/:id/grid-frame?size=K&placement=J: GridFrameMeta, arrays `cell` (u32: storage index
 *   (j - j0) nx + (i - i0) of every cell with coverage > 0, increasing), `count` (i32), `coverage` (f64), `expected`
 *   (f64, NaN for left-out cells), `kept` (u8) and, when the stability flags weigh cells by the population at risk,
 *   `flagWeight` (f64). The page draws each cell from the lattice parameters (workers/lattice).
 */
import type { CellShape } from '../../workers/lattice/cell-shape.js';

export interface SurfaceFrameMeta {
  sizeIndex: number;
  shape: CellShape;
  cellSize: number;
  placements: number;
  /** upper-left corner and pixel side in working coordinates, from the GeoTIFF's tiepoint and pixel scale */
  x0: number;
  y0: number;
  side: number;
  width: number;
  height: number;
  excessThreshold: number | null;
  deficitThreshold: number | null;
}

export interface GridFrameMeta {
  sizeIndex: number;
  placementIndex: number;
  shape: CellShape;
  cellSize: number;
  origin: { x: number; y: number };
  placement: { u: number; v: number; angle: number };
  minCoverage: number;
  /** the coverage grid's first indices and columns (storage index k: i = i0 + k mod nx, j = j0 + floor(k / nx)) */
  i0: number;
  j0: number;
  nx: number;
  ny: number;
  /** the sweep's alpha (the stability flags' level) */
  alpha: number;
}
