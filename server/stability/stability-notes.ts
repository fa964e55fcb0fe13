/** The sentences that say what a stability surface's calibration allows (GeoJSON member, CLI line, report). */
import type { StabilitySurface } from './stability-accumulator.js';

export function calibrationNote(surface: StabilitySurface): string {
  const calibration = surface.calibration;
  if (calibration === null) {
    return 'No simulations (sims = 0): the share surface is written, but no area is calibrated, so none is reported.';
  }
  if (!Number.isFinite(calibration.excessThreshold) || !Number.isFinite(calibration.deficitThreshold)) {
    const needed = Math.ceil(1 / calibration.level) - 1;
    return `${calibration.sims} simulations are too few to calibrate areas at ${calibration.level} per kind: at least ${needed} are needed; no area is reported.`;
  }
  return (
    `Areas are pixels whose share exceeds the (1 - ${calibration.level}) quantile of the largest share under ${calibration.sims} simulated null patterns ` +
    `(excess > ${calibration.excessThreshold.toFixed(4)}, deficit > ${calibration.deficitThreshold.toFixed(4)}); ` +
    'on null data a map shows any area in at most alpha of data sets.'
  );
}
