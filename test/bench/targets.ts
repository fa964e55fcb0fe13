/**
 * The five performance targets of `npm run bench`, each a ratio of our measured figure to a reference measured in
 * the same run (the C counting loop's time for the same point-placements, a memory limit, or the CLI's time).
 * `npm run bench -- --json` prints them as one JSON object, one key per target. Besides the five of issue 13,
 * `hexVsSquare` (issue 16): counting with hexagons against counting with squares on the same placements, <= 1.5;
 * `surfaceWeight` (issue 17): the stability surface's measured weight (time per pixel-placement over the sweep's time
 * per point-placement) against SURFACE_PIXEL_WEIGHT of the work budget, <= 1.
 */
export interface TargetFigure {
  /** ours / reference; NaN when the reference could not be measured */
  ratio: number;
  /** our measured figure (seconds, or bytes for memory) */
  ours: number;
  /** the reference figure in the same unit */
  reference: number;
  /** the largest ratio that meets the target */
  target: number;
  met: boolean;
  /** 'met', 'NOT met' or 'no reference' */
  status: string;
}

export type TargetKey = 'wholeSweep' | 'defaultPlanCli' | 'monteCarlo' | 'peakMemory' | 'serverVsCli' | 'hexVsSquare' | 'surfaceWeight';

export function ratioFigure(ours: number, reference: number, target: number): TargetFigure {
  const ratio = ours / reference;
  const measured = Number.isFinite(ratio);
  const met = measured && ratio <= target;
  return { ratio, ours, reference, target, met, status: measured ? (met ? 'met' : 'NOT met') : 'no reference' };
}
