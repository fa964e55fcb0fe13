import type { PlacementRow } from '../contracts.js';
import type { Verdict } from '../../workers/types.js';
import { formatNumber } from '../format.js';
import { verdictWords } from '../verdict-words.js';

export interface AnglePoint {
  x: number;
  y: number;
  placementIndex: number;
  u: number;
  v: number;
  verdict: Verdict;
  /** the tooltip: which placement the dot is (number, offset, angle, VMR, verdict) */
  tip: string;
}

/** "Placement 12: offset (0.25, 0.5) cells, angle 33.8°, VMR 1.42, clustered". */
export function placementTip(row: Pick<PlacementRow, 'placementIndex' | 'u' | 'v' | 'angle' | 'vmr' | 'verdict'>): string {
  return (
    `Placement ${row.placementIndex}: offset (${formatNumber(row.u, 3)}, ${formatNumber(row.v, 3)}) cells, ` +
    `angle ${formatNumber(row.angle, 4)}°, VMR ${formatNumber(row.vmr, 4)}, ${verdictWords(row.verdict)}`
  );
}

function anglePoint(row: PlacementRow): AnglePoint {
  return { x: row.angle, y: row.vmr, placementIndex: row.placementIndex, u: row.u, v: row.v, verdict: row.verdict, tip: placementTip(row) };
}

/** VMR of every placement of one cell size against the grid angle, sorted by angle, and the reference point. */
export interface AngleSeries {
  points: AnglePoint[];
  reference: AnglePoint | null;
  /** true when every placement has the same angle (rotation off) */
  singleAngle: boolean;
}

/**
 * Picks the rows of one cell size and maps each placement to (angle in degrees, VMR). The reference placement is
 * the one with angle 0 and offset (0, 0) (shared/design.md, vocabulary), or `referenceIndex` when given.
 */
export function angleSeries(rows: readonly PlacementRow[], sizeIndex: number, referenceIndex?: number): AngleSeries {
  const ofSize = rows.filter((row) => row.sizeIndex === sizeIndex && Number.isFinite(row.vmr));
  const points = ofSize
    .map(anglePoint)
    .sort((a, b) => a.x - b.x || a.placementIndex - b.placementIndex);
  const referenceRow = ofSize.find((row) =>
    referenceIndex === undefined ? row.angle === 0 && row.u === 0 && row.v === 0 : row.placementIndex === referenceIndex,
  );
  const reference = referenceRow ? { ...anglePoint(referenceRow), tip: `Reference grid. ${placementTip(referenceRow)}` } : null;
  const singleAngle = points.length > 0 && points.every((point) => point.x === points[0].x);
  return { points, reference, singleAngle };
}
