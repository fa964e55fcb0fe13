/** The cell shapes a placement may use (shared/design.md, "lattice / shape"); the list drives validation. */
export const CELL_SHAPES = ['square', 'hex'] as const;

export type CellShape = (typeof CELL_SHAPES)[number];

/** The shape of a placement that names none. */
export const DEFAULT_CELL_SHAPE: CellShape = 'square';

export function isCellShape(value: unknown): value is CellShape {
  return typeof value === 'string' && (CELL_SHAPES as readonly string[]).includes(value);
}
