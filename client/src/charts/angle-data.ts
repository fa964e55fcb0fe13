import type { PlacementRow } from '../../../server/contracts.js';

export interface AnglePoint {
  x: number;
  y: number;
  placementIndex: number;
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
    .map((row) => ({ x: row.angle, y: row.vmr, placementIndex: row.placementIndex }))
    .sort((a, b) => a.x - b.x || a.placementIndex - b.placementIndex);
  const referenceRow = ofSize.find((row) =>
    referenceIndex === undefined ? row.angle === 0 && row.u === 0 && row.v === 0 : row.placementIndex === referenceIndex,
  );
  const reference = referenceRow
    ? { x: referenceRow.angle, y: referenceRow.vmr, placementIndex: referenceRow.placementIndex }
    : null;
  const singleAngle = points.length > 0 && points.every((point) => point.x === points[0].x);
  return { points, reference, singleAngle };
}
