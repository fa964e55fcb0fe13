/**
 * How a (cell size, shape) entry of a sweep is named and ordered wherever entries are listed side by side (page
 * charts and tables, report): "90" for squares (as before shapes existed), "90 hexagons" for hexagons of area 90².
 * Entries are ordered by cell side, squares before hexagons at the same side, so the two shapes of one side stand
 * next to each other.
 */
import type { SizeSummary } from '../contracts.js';
import { CELL_SHAPES } from '../../workers/lattice/cell-shape.js';
import { formatMetres } from '../format.js';

export function sideLabel(size: Pick<SizeSummary, 'cellSize' | 'shape'>): string {
  return `${formatMetres(size.cellSize)}${size.shape === 'hex' ? ' hexagons' : ''}`;
}

/** The entries by cell side, then by shape in the registry's order (entries without a shape are squares). */
export function orderSizes<T extends Pick<SizeSummary, 'cellSize' | 'shape'>>(sizes: readonly T[]): T[] {
  const rank = (size: T) => CELL_SHAPES.indexOf(size.shape ?? 'square');
  return [...sizes].sort((a, b) => a.cellSize - b.cellSize || rank(a) - rank(b));
}
