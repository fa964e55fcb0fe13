/** The cell shapes a placement may use (shared/design.md, "lattice / shape"); the list drives validation. */
export const CELL_SHAPES = ['square', 'hex'] as const;

export type CellShape = (typeof CELL_SHAPES)[number];

/** The shape of a placement that names none. */
export const DEFAULT_CELL_SHAPE: CellShape = 'square';

/** The shapes named by a plan's `shape` field (a name, a list, or absent: squares only), in its order. */
export function shapeList(shape: CellShape | readonly CellShape[] | undefined): CellShape[] {
  if (shape === undefined) return [DEFAULT_CELL_SHAPE];
  return typeof shape === 'string' ? [shape] : [...shape];
}

export function isCellShape(value: unknown): value is CellShape {
  return typeof value === 'string' && (CELL_SHAPES as readonly string[]).includes(value);
}
