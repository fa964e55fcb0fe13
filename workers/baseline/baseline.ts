/**
 * The population at risk (shared/design.md "baseline"): what expected counts are proportional to instead of area.
 *
 * - polygons: each piece is one baseline polygon clipped to the valid region, p ∩ V (a Region whose `area` is
 *   |p ∩ V| > 0), with its count P_p >= 0 (residents, households, visits). Polygons with |p ∩ V| = 0 never get here.
 * - controls: the control points inside V, flat x0, y0, x1, y1, ... (planar metres).
 * Plain data only (typed arrays), built once per dataset by server/inputs.
 */
import type { Region } from '../types.js';

export interface PolygonBaseline {
  kind: 'polygons';
  /** p ∩ V for each polygon with |p ∩ V| > 0; Region.area = |p ∩ V| (m^2) */
  pieces: Region[];
  /** P_p of each piece, same order, each >= 0 */
  counts: Float64Array;
}

export interface ControlBaseline {
  kind: 'controls';
  /** control points inside the valid region, flat x, y (planar metres) */
  controls: Float64Array;
}

export type Baseline = PolygonBaseline | ControlBaseline;

/** Where a placement's expected counts come from (count --json `expectedFrom`). */
export type ExpectedFrom = 'area' | 'baseline' | 'controls';

export function expectedFromOf(baseline: Baseline | undefined): ExpectedFrom {
  if (baseline === undefined) return 'area';
  return baseline.kind === 'polygons' ? 'baseline' : 'controls';
}

/**
 * A share below this fraction of its own area is clipping noise along shared edges and counts as zero
 * (issue 15: "a polygon or cell whose share is below 1e-9 of its own area is treated as zero").
 */
export const BASELINE_SHARE_NOISE = 1e-9;

/** What the work budget counts of a baseline (shared/plan-rules.ts baselineWork). */
export interface BaselineSize {
  kind: Baseline['kind'];
  /** polygons: the pieces p ∩ V; controls: 0 */
  pieces: number;
  /** polygons: the pieces' ring vertices (each ring's closing vertex not repeated); controls: 0 */
  vertices: number;
  /** controls: the control points inside V; polygons: 0 */
  controls: number;
}

/** The size of a baseline's engine data. Cost O(pieces + rings). */
export function baselineSize(baseline: Baseline): BaselineSize {
  if (baseline.kind === 'controls') return { kind: 'controls', pieces: 0, vertices: 0, controls: baseline.controls.length / 2 };
  let vertices = 0;
  for (const piece of baseline.pieces) for (const ring of piece.rings) vertices += ring.length / 2;
  return { kind: 'polygons', pieces: baseline.pieces.length, vertices, controls: 0 };
}
