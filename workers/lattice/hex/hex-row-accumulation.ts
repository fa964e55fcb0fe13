/**
 * Exact area of the valid region in every hexagon of a grid, one row of hexagons at a time (the hexagon analogue of
 * the square grid's signed-area accumulation, geometry/edge-accumulation.ts).
 *
 * Coordinates are the grid frame in units of the side a, relative to the centre of hexagon (0, 0): hexagon (i, j)
 * has its centre at (sqrt3 i + sqrt3/2 j, 1.5 j) and, at height y above its centre, the cross-section
 * [cx - h(y), cx + h(y)] with h(y) = sqrt3/2 for |y| <= 1/2 and sqrt3 (1 - |y|) for 1/2 <= |y| <= 1.
 * Winding numbers by the rightward ray: a point P of hexagon H lies inside the region (counted with the rings'
 * orientation: holes run clockwise) as many times as the signed number of ring edges that cross the ray from P to
 * +x, an edge counting +1 going up and -1 going down. Integrating over H,
 *   |H ∩ region| = Σ_edges sign(e) ∫ |{x in H_y : x < x_e(y)}| dy        (y over the edge's span within H),
 * which is exact: no inside/outside decision is taken anywhere, every term is a continuous function of the vertices,
 * so rounding moves the result by a few units in the last place and never by a piece of a hexagon.
 * For one edge and one row of hexagons (the band of heights |y - 1.5 j| <= 1), the hexagons wholly left of the
 * edge's span in the band all receive the same term sign(e) ∫ 2 h(y) dy (added once to a difference array, summed
 * from the right end of the row afterwards), the hexagons wholly right of it receive nothing, and only the few whose
 * columns the edge passes get the integral of the piecewise-linear clamp(x_e(y) - cx + h(y), 0, 2 h(y)), integrated
 * exactly by the trapezoid rule between its breakpoints (|y| = 1/2 and where the edge meets a side's line).
 * So interior hexagons come out at exactly their area (coverage 1 after the 1e-12 noise clamp) with no test of their
 * own, and hexagons the boundary passes are clipped exactly against every ring edge that crosses their row.
 * Cost O(hexagons + Σ_edges (rows spanned + hexagons crossed)); memory: the output only.
 */

const ROOT3 = Math.sqrt(3);
const HALF_ROOT3 = ROOT3 / 2;

/** Half-width h(y) of a hexagon's cross-section at height y (|y| <= 1) above its centre, units of a. */
function halfWidth(y: number): number {
  const above = y < 0 ? -y : y;
  return above <= 0.5 ? HALF_ROOT3 : ROOT3 * (1 - above);
}

/** ∫ 2 h(y) dy over [lo, hi] within [-1, 1]: the area of a hexagon between two heights (exact, piecewise linear). */
function bandArea(lo: number, hi: number): number {
  let area = 0;
  const pieces = [-1, -0.5, 0.5, 1];
  for (let k = 0; k < 3; k++) {
    const a = lo > pieces[k]! ? lo : pieces[k]!;
    const b = hi < pieces[k + 1]! ? hi : pieces[k + 1]!;
    if (b > a) area += (halfWidth(a) + halfWidth(b)) * (b - a);
  }
  return area;
}

/** The three pieces of h(y) = c + d y: heights [lo, hi], c and d. */
const PIECE_LO = [-1, -0.5, 0.5];
const PIECE_HI = [-0.5, 0.5, 1];
const PIECE_C = [ROOT3, HALF_ROOT3, ROOT3];
const PIECE_D = [ROOT3, 0, -ROOT3];

/** Breakpoints buffer of partialArea (at most 2 ends + 2 kinks + 2 roots per piece x 3 pieces). */
const breaks = new Float64Array(16);

/**
 * ∫ clamp(x(y) + h(y), 0, 2 h(y)) dy over [lo, hi] within [-1, 1], x(y) = x0 + slope (y - y0) measured from the
 * hexagon's centre: the area of the hexagon left of the line x(y) between the two heights. Exact: the integrand is
 * linear between the breakpoints collected here, where the trapezoid rule is exact.
 */
function partialArea(x0: number, y0: number, slope: number, lo: number, hi: number): number {
  let count = 0;
  breaks[count++] = lo;
  breaks[count++] = hi;
  if (lo < -0.5 && hi > -0.5) breaks[count++] = -0.5;
  if (lo < 0.5 && hi > 0.5) breaks[count++] = 0.5;
  // in each piece h(y) = c + d y; the edge meets the left side (x = -h) and the right side (x = h) where
  // x0 + slope (y - y0) = side (c + d y), side = -1 or 1
  const base = x0 - slope * y0;
  for (let k = 0; k < 3; k++) {
    const a = lo > PIECE_LO[k]! ? lo : PIECE_LO[k]!;
    const b = hi < PIECE_HI[k]! ? hi : PIECE_HI[k]!;
    if (!(b > a)) continue;
    for (let side = -1; side <= 1; side += 2) {
      // base + slope y = side (c + d y)  =>  y (slope - side d) = side c - base
      const denominator = slope - side * PIECE_D[k]!;
      if (denominator === 0) continue;
      const y = (side * PIECE_C[k]! - base) / denominator;
      if (y > a && y < b) breaks[count++] = y;
    }
  }
  // insertion sort of the few breakpoints, in place (no allocation in this inner loop)
  for (let k = 1; k < count; k++) {
    const value = breaks[k]!;
    let m = k - 1;
    while (m >= 0 && breaks[m]! > value) {
      breaks[m + 1] = breaks[m]!;
      m--;
    }
    breaks[m + 1] = value;
  }
  let area = 0;
  let previousY = breaks[0]!;
  let previousValue = clampedWidth(x0 + slope * (previousY - y0), halfWidth(previousY));
  for (let k = 1; k < count; k++) {
    const y = breaks[k]!;
    const value = clampedWidth(x0 + slope * (y - y0), halfWidth(y));
    area += ((previousValue + value) / 2) * (y - previousY);
    previousY = y;
    previousValue = value;
  }
  return area;
}

/** |[-h, h] ∩ (-inf, x)| */
function clampedWidth(x: number, h: number): number {
  const width = x + h;
  return width <= 0 ? 0 : width >= 2 * h ? 2 * h : width;
}

/**
 * Adds the signed area (units of a²) of every ring inside every hexagon of the grid (i0.., j0.., nx x ny) to
 * `areas` (row-major, row j - j0). Rings are flat (x, y) arrays in the coordinates of the header comment.
 */
export function accumulateHexAreas(rings: readonly Float64Array[], i0: number, j0: number, nx: number, ny: number, areas: Float64Array): void {
  // difference terms: a hexagon's area is the sum of the row's terms at its column and to its right
  for (const ring of rings) {
    const vertexCount = ring.length >> 1;
    let previous = vertexCount - 1;
    for (let k = 0; k < vertexCount; k++) {
      addEdge(ring[2 * previous]!, ring[2 * previous + 1]!, ring[2 * k]!, ring[2 * k + 1]!, i0, j0, nx, ny, areas);
      previous = k;
    }
  }
  for (let row = 0; row < ny; row++) {
    let running = 0;
    const offset = row * nx;
    for (let column = nx - 1; column >= 0; column--) {
      running += areas[offset + column]!;
      areas[offset + column] = running;
    }
  }
}

// The walk of geometry/edge-accumulation.ts, apart on purpose (other geometry): hexagon rows overlap (1.5 j ± 1)
function addEdge(xa: number, ya: number, xb: number, yb: number, i0: number, j0: number, nx: number, ny: number, areas: Float64Array): void {
  if (ya === yb) return;
  const sign = yb > ya ? 1 : -1;
  const xLow = sign > 0 ? xa : xb;
  const yLow = sign > 0 ? ya : yb;
  const xHigh = sign > 0 ? xb : xa;
  const yHigh = sign > 0 ? yb : ya;
  const slope = (xHigh - xLow) / (yHigh - yLow);
  // rows whose band [1.5 j - 1, 1.5 j + 1] meets the edge's span
  const firstRow = Math.max(j0, Math.ceil((yLow - 1) / 1.5));
  const lastRow = Math.min(j0 + ny - 1, Math.floor((yHigh + 1) / 1.5));
  for (let j = firstRow; j <= lastRow; j++) {
    const centreY = 1.5 * j;
    const lo = Math.max(yLow - centreY, -1);
    const hi = Math.min(yHigh - centreY, 1);
    if (!(hi > lo)) continue;
    // the edge's span of x within the band, and the hexagon columns it may pass
    const xAtLo = xLow + (lo + centreY - yLow) * slope;
    const xAtHi = xLow + (hi + centreY - yLow) * slope;
    const xMin = xAtLo < xAtHi ? xAtLo : xAtHi;
    const xMax = xAtLo < xAtHi ? xAtHi : xAtLo;
    const rowShift = HALF_ROOT3 * j;
    // hexagon i spans x in [sqrt3 i + rowShift - sqrt3/2, sqrt3 i + rowShift + sqrt3/2]: wholly left of the edge
    // when i <= (xMin - rowShift) / sqrt3 - 1/2, wholly right when i >= (xMax - rowShift) / sqrt3 + 1/2. The integral
    // is exact for any hexagon, so the rounding of these bounds only decides which of two equal formulas is used;
    // the one hexagon at each bound goes to the integral.
    const firstPartial = Math.floor((xMin - rowShift) / ROOT3 - 0.5);
    const lastPartial = Math.ceil((xMax - rowShift) / ROOT3 + 0.5);
    const offset = (j - j0) * nx;
    // hexagons left of firstPartial: the whole band between lo and hi, once, summed from the right later
    const leftEnd = firstPartial - 1 - i0;
    if (leftEnd >= 0) areas[offset + Math.min(leftEnd, nx - 1)] += sign * bandArea(lo, hi);
    const from = Math.max(firstPartial, i0);
    const to = Math.min(lastPartial, i0 + nx - 1);
    for (let i = from; i <= to; i++) {
      const centreX = ROOT3 * i + rowShift;
      const area = sign * partialArea(xAtLo - centreX, lo, slope, lo, hi);
      // a term that belongs to column c alone: +area at c, -area at c - 1 (the sum from the right cancels it there)
      const column = i - i0;
      areas[offset + column] += area;
      if (column > 0) areas[offset + column - 1] -= area;
    }
  }
}
