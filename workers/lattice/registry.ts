/** Every lattice the engine knows, by shape: the one place where a new cell shape is registered. */
import type { CellShape } from './cell-shape.js';
import { hexLattice } from './hex/hex-lattice.js';
import type { Lattice } from './lattice.js';
import { squareLattice } from './square/square-lattice.js';

const LATTICES: Readonly<Record<CellShape, Lattice>> = Object.freeze({ square: squareLattice, hex: hexLattice });

/** The lattice of a shape; an absent shape is the square lattice. */
export function latticeOf(shape: CellShape | undefined): Lattice {
  const lattice = LATTICES[shape ?? 'square'];
  if (lattice === undefined) throw new RangeError(`unknown cell shape '${String(shape)}'`);
  return lattice;
}
