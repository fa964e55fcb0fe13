/**
 * The valid pixels of a stability raster (stability-raster.ts validPixels: positions row * width + col, increasing)
 * as runs of consecutive columns per row, so that the position q of pixel (col, row) in that list is found without
 * a raster-sized table: run t of row r covers columns col0[t] .. col1[t] - 1, its first pixel being q0[t]; row r's
 * runs are rowFirst[r] .. rowFirst[r + 1] - 1. Memory: 12 bytes per run (a row crossing the region's rings k times
 * has about k / 2 runs). Cost O(valid pixels).
 */
export interface PixelRuns {
  rowFirst: Int32Array;
  col0: Int32Array;
  col1: Int32Array;
  q0: Int32Array;
}

/** Whether valid pixel q starts a run: the first, after a gap, or at the start of a row. */
function startsRun(pixels: Uint32Array, q: number, width: number): boolean {
  return q === 0 || pixels[q]! !== pixels[q - 1]! + 1 || pixels[q]! % width === 0;
}

export function pixelRuns(pixels: Uint32Array, width: number, height: number): PixelRuns {
  let runs = 0;
  for (let q = 0; q < pixels.length; q++) if (startsRun(pixels, q, width)) runs++;
  const rowFirst = new Int32Array(height + 1);
  const col0 = new Int32Array(runs);
  const col1 = new Int32Array(runs);
  const q0 = new Int32Array(runs);
  let t = -1;
  for (let q = 0; q < pixels.length; q++) {
    const pixel = pixels[q]!;
    const col = pixel % width;
    if (startsRun(pixels, q, width)) {
      t++;
      const row = (pixel - col) / width;
      col0[t] = col;
      q0[t] = q;
      rowFirst[row + 1] = t + 1;
    }
    col1[t] = col + 1;
  }
  // rows without pixels start where the row before them ends
  for (let row = 1; row <= height; row++) if (rowFirst[row]! < rowFirst[row - 1]!) rowFirst[row] = rowFirst[row - 1]!;
  return { rowFirst, col0, col1, q0 };
}
