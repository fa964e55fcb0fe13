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

/** One line per (shape, cell size) for the command line: the stable areas found, or why none can be. */
export function stabilityLines(surfaces: readonly StabilitySurface[]): string[] {
  return surfaces.map((surface) => {
    const side = `${surface.shape === 'hex' ? 'hexagons' : 'cells'} of ${Number(surface.cellSize.toPrecision(6))} m`;
    if (surface.calibration === null || !Number.isFinite(surface.calibration.excessThreshold)) return `Stable areas, ${side}: ${calibrationNote(surface)}`;
    const count = (mask: Uint8Array): number => {
      let pixels = 0;
      for (const value of mask) pixels += value;
      return pixels;
    };
    const pixelKm2 = (surface.raster.side * surface.raster.side) / 1e6;
    const excess = count(surface.stableExcess) * pixelKm2;
    const deficit = count(surface.stableDeficit) * pixelKm2;
    return `Stable areas, ${side}: excess ${Number(excess.toPrecision(4))} km2, deficit ${Number(deficit.toPrecision(4))} km2 (shares above ${surface.calibration.excessThreshold.toFixed(3)} / ${surface.calibration.deficitThreshold.toFixed(3)}, the simulated maximum at ${surface.calibration.level} each).`;
  });
}
