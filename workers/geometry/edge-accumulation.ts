/**
 * Signed-area accumulation of one polygon edge into a cell grid, the method of anti-aliasing font rasterizers
 * (area coverage accumulation as in FreeType's "smooth" rasterizer and Levien 2016, "font-rs: the fastest font
 * renderer in the world", with exact area instead of sampling).
 *
 * Coordinates are local cell units: cell (c, r) is [c, c+1) x [r, r+1), 0 <= c < nx, 0 <= r < ny, stored at
 * r*nx + c. The edge is split at every integer y line (rows) and every integer x line (columns). A piece of
 * signed height dy (y_end - y_start) whose mean x inside its cell c is c + f adds
 *   -dy * (1 - f) to cell c and -dy * f to cell c + 1,
 * which is minus the area of the cell strip to the right of the piece. After a prefix sum along each row, a
 * closed counter-clockwise ring leaves its exact area inside every cell, a clockwise ring (a hole) subtracts it.
 * Cost O(1 + rows crossed + columns crossed) per edge.
 */

/**
 * Add one directed edge (x0, y0) -> (x1, y1) in local cell units to the accumulator. The accumulator holds the
 * band of rows [rowFrom, rowFrom + ny), row r at (r - rowFrom) * nx (rowFrom 0: the whole grid, length nx * ny);
 * the edge's pieces in other rows are skipped. Each row's pieces are computed from the same numbers whatever the
 * band, so a grid accumulated band by band holds exactly the values of the grid accumulated at once.
 */
export function accumulateEdge(
  accumulator: Float64Array,
  nx: number,
  ny: number,
  x0: number,
  y0: number,
  x1: number,
  y1: number,
  rowFrom = 0,
): void {
  if (y0 === y1) return;
  // Walk from the lower to the upper endpoint; the sign restores the edge's direction.
  const sign = y1 > y0 ? 1 : -1;
  const xLow = sign > 0 ? x0 : x1;
  const yLow = sign > 0 ? y0 : y1;
  const xHigh = sign > 0 ? x1 : x0;
  const yHigh = sign > 0 ? y1 : y0;
  const slope = (xHigh - xLow) / (yHigh - yLow);
  const firstRow = Math.max(rowFrom, Math.floor(yLow));
  const lastRow = Math.min(rowFrom + ny - 1, Math.ceil(yHigh) - 1);
  for (let row = firstRow; row <= lastRow; row++) {
    const yStart = yLow > row ? yLow : row;
    const yEnd = yHigh < row + 1 ? yHigh : row + 1;
    if (!(yEnd > yStart)) continue;
    const xStart = yStart === yLow ? xLow : xLow + (yStart - yLow) * slope;
    const xEnd = yEnd === yHigh ? xHigh : xLow + (yEnd - yLow) * slope;
    accumulateRowPiece(accumulator, (row - rowFrom) * nx, nx, xStart, xEnd, sign * (yEnd - yStart));
  }
}

/** One piece inside a row: x from xStart to xEnd, signed height dy; split at integer x lines. */
function accumulateRowPiece(
  accumulator: Float64Array,
  rowOffset: number,
  nx: number,
  xStart: number,
  xEnd: number,
  dy: number,
): void {
  const xMin = xStart < xEnd ? xStart : xEnd;
  const xMax = xStart < xEnd ? xEnd : xStart;
  const firstColumn = Math.floor(xMin);
  const lastColumn = Math.max(firstColumn, Math.ceil(xMax) - 1);
  if (firstColumn === lastColumn) {
    addPiece(accumulator, rowOffset, nx, firstColumn, (xMin + xMax) / 2 - firstColumn, dy);
    return;
  }
  const heightPerX = dy / (xMax - xMin);
  for (let column = firstColumn; column <= lastColumn; column++) {
    const a = xMin > column ? xMin : column;
    const b = xMax < column + 1 ? xMax : column + 1;
    if (!(b > a)) continue;
    addPiece(accumulator, rowOffset, nx, column, (a + b) / 2 - column, (b - a) * heightPerX);
  }
}

function addPiece(
  accumulator: Float64Array,
  rowOffset: number,
  nx: number,
  column: number,
  meanFraction: number,
  dy: number,
): void {
  // Clamp float noise at the grid's sides: a piece left of column 0 or right of column nx-1.
  if (column < 0) {
    accumulator[rowOffset] -= dy;
    return;
  }
  if (column >= nx) return;
  const fraction = meanFraction < 0 ? 0 : meanFraction > 1 ? 1 : meanFraction;
  accumulator[rowOffset + column] -= dy * (1 - fraction);
  if (column + 1 < nx) accumulator[rowOffset + column + 1] -= dy * fraction;
}
