/**
 * What the map says about the stability surface at a spot: the cell's own flag in the placement shown (excess,
 * deficit or neither: workers/stability/cell-flags.ts, the test behind the surface), the excess and deficit shares of
 * the pixel under the spot, and the stable area holding it (kind, largest share, area).
 */
import type { StableAreaSummary } from '../../../shared/contracts.js';
import { formatNumber } from '../../../shared/format.js';
import type { CellLine } from './cell-readout.js';
import { shareAt, type StabilitySurfaceData } from './surface-layer.js';

export type CellFlag = 'excess' | 'deficit' | 'neither';

export function flagWords(flag: CellFlag, alpha: number): string {
  if (flag === 'neither') return `neither (no excess or deficit at alpha ${alpha}, Benjamini-Hochberg across the placement's kept cells)`;
  return `${flag} cell (one-sided Poisson test, Benjamini-Hochberg at alpha ${alpha} across the placement's kept cells)`;
}

export function stabilityLines(
  flag: { flag: CellFlag; alpha: number } | null,
  surface: StabilitySurfaceData | null,
  area: StableAreaSummary | null,
  x: number,
  y: number,
): CellLine[] {
  const lines: CellLine[] = [];
  if (flag !== null) lines.push({ name: 'stability verdict of the cell', value: flagWords(flag.flag, flag.alpha) });
  if (surface !== null) {
    const excess = shareAt(surface, 'excess', x, y);
    const deficit = shareAt(surface, 'deficit', x, y);
    const of = `of ${surface.meta.placements} placements`;
    lines.push({ name: 'excess share here', value: Number.isFinite(excess) ? `${formatNumber(excess)} ${of}` : 'no value (outside the valid region)' });
    lines.push({ name: 'deficit share here', value: Number.isFinite(deficit) ? `${formatNumber(deficit)} ${of}` : 'no value (outside the valid region)' });
  }
  if (area !== null) {
    lines.push({ name: 'stable area', value: `${area.kind}, largest share ${formatNumber(area.maxShare)}, ${formatNumber(area.areaKm2)} km²` });
  }
  return lines;
}
