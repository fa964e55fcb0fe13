/**
 * The placement's grid from the server's compact frame (GET /api/sweeps/:id/grid-frame, shared/binary/page-frames.ts):
 * each cell's polygon is rebuilt from the lattice parameters by the engine's own lattice (workers/lattice: the same
 * corners grid.geojson writes), and each kept cell's stability flag in this placement (excess, deficit or neither)
 * comes from the engine's per-cell test (workers/stability/cell-flags.ts) on the kept counts with the weights the
 * sweep used (coverage, or the population at risk when expected counts follow baseline polygons), at the sweep's alpha.
 */
import type { TypedFrame } from '../../../shared/binary/typed-frame.js';
import type { GridFrameMeta } from '../../../shared/binary/page-frames.js';
import { latticeOf } from '../../../workers/lattice/registry.js';
import { createCellFlagScratch, flagCells } from '../../../workers/stability/cell-flags.js';
import type { GridCollection, GridFeature } from '../api/api-client.js';

export function gridFromFrame(frame: TypedFrame<GridFrameMeta>): GridCollection {
  const { meta, arrays } = frame;
  const cell = arrays.cell as Uint32Array;
  const count = arrays.count as Int32Array;
  const coverage = arrays.coverage as Float64Array;
  const expected = arrays.expected as Float64Array;
  const kept = arrays.kept as Uint8Array;
  const flagWeight = arrays.flagWeight as Float64Array | undefined;
  const lattice = latticeOf(meta.shape).frame(meta.origin, meta.cellSize, meta.placement);
  const features: GridFeature[] = new Array<GridFeature>(cell.length);
  const keptFeatures: number[] = [];
  for (let k = 0; k < cell.length; k++) {
    const i = meta.i0 + (cell[k]! % meta.nx);
    const j = meta.j0 + Math.floor(cell[k]! / meta.nx);
    const isKept = kept[k] === 1;
    if (isKept) keptFeatures.push(k);
    features[k] = {
      type: 'Feature',
      properties: { i, j, count: count[k]!, coverage: coverage[k]!, expected: expected[k]!, kept: isKept, ...(isKept ? { stability: 'neither' as const } : {}) },
      geometry: { type: 'Polygon', coordinates: [lattice.cellPolygon(i, j)] },
    };
  }
  // the engine's flags: kept cells in storage order, as the sweep evaluated them
  const m = keptFeatures.length;
  const keptCounts = new Float64Array(m);
  const keptWeights = new Float64Array(m);
  keptFeatures.forEach((feature, index) => {
    keptCounts[index] = count[feature]!;
    keptWeights[index] = flagWeight !== undefined && flagWeight.length > 0 ? flagWeight[feature]! : coverage[feature]!;
  });
  const scratch = createCellFlagScratch();
  const found = flagCells(keptCounts, keptWeights, meta.alpha, scratch);
  for (let t = 0; t < found.excess; t++) features[keptFeatures[scratch.excess[t]!]!]!.properties.stability = 'excess';
  for (let t = 0; t < found.deficit; t++) features[keptFeatures[scratch.deficit[t]!]!]!.properties.stability = 'deficit';
  return {
    type: 'FeatureCollection',
    features,
    gridshake: { cellSize: meta.cellSize, u: meta.placement.u, v: meta.placement.v, angle: meta.placement.angle, sizeIndex: meta.sizeIndex, placementIndex: meta.placementIndex, alpha: meta.alpha },
  };
}
