/**
 * The baseline of the counting benchmark: the loop a newcomer writes the obvious way, a function taking typed
 * arrays and numbers, rotating each point into the grid frame, flooring and incrementing (grid contract of
 * shared/design.md): i = floor(x'/s - u), j = floor(y'/s - v). Cost O(n).
 */
export function plainReferenceCount(
  xy: Float64Array,
  originX: number,
  originY: number,
  angleDegrees: number,
  cellSize: number,
  u: number,
  v: number,
  i0: number,
  j0: number,
  nx: number,
  ny: number,
  out: Int32Array,
): void {
  out.fill(0);
  const angle = (angleDegrees * Math.PI) / 180;
  const cos = Math.cos(angle);
  const sin = Math.sin(angle);
  const n = xy.length / 2;
  for (let p = 0; p < n; p++) {
    const dx = xy[2 * p] - originX;
    const dy = xy[2 * p + 1] - originY;
    const i = Math.floor((dx * cos + dy * sin) / cellSize - u) - i0;
    const j = Math.floor((-dx * sin + dy * cos) / cellSize - v) - j0;
    if (i >= 0 && i < nx && j >= 0 && j < ny) out[j * nx + i]++;
  }
}
