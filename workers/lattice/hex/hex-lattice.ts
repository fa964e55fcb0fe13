/**
 * The hexagonal lattice (issue 16 contract, hex-frame.ts): pointy-top hexagons of area s^2, angle period 60 degrees,
 * exact coverage by rows of hexagons (hex-coverage.ts, hex-row-accumulation.ts), counting by the rounding rule with a fast path
 * (hex-counter.ts).
 */
import { frameFromRules, type Lattice } from '../lattice.js';
import { createHexCounter } from './hex-counter.js';
import { hexCoverage } from './hex-coverage.js';
import { createHexFrame, hexCellOfPoint, hexCellOfPointInto, hexCorners } from './hex-frame.js';

export const hexLattice: Lattice = {
  shape: 'hex',
  anglePeriod: 60,
  coverage: hexCoverage,
  createCounter: createHexCounter,
  frame: frameFromRules(createHexFrame, hexCellOfPoint, hexCellOfPointInto, hexCorners),
};
