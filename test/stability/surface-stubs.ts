/**
 * Made-up stability surfaces for the tests of what is built from a finished surface (areas, summary, files), and the
 * planar shoelace area of a ring (S. Gauss's area formula; its sign gives the orientation, RFC 7946 section 3.1.6).
 */
import type { StabilitySurface } from '../../server/stability/stability-accumulator.js';
import type { StabilityRaster } from '../../workers/stability/stability-raster.js';

/** Signed area of a closed ring (positive counter-clockwise). */
export function shoelace(ring: [number, number][]): number {
  let sum = 0;
  for (let k = 0; k + 1 < ring.length; k++) sum += ring[k]![0] * ring[k + 1]![1] - ring[k + 1]![0] * ring[k]![1];
  return sum / 2;
}

/**
 * A calibrated square-cell surface (cells of 80 m, 16 placements, 39 sims, thresholds 0.3) whose stable excess
 * pixels are `mask`; those pixels get the excess share `shareOf(p)`, the others 0.1.
 */
export function calibratedSurface(raster: StabilityRaster, mask: Uint8Array, shareOf: (p: number) => number): StabilitySurface {
  const size = raster.width * raster.height;
  const share = new Float32Array(size).fill(0.1);
  mask.forEach((value, p) => {
    if (value === 1) share[p] = shareOf(p);
  });
  return {
    shape: 'square',
    cellSize: 80,
    placements: 16,
    raster,
    excessShare: share,
    deficitShare: new Float32Array(size),
    assessed: new Uint8Array(size).fill(1),
    calibration: { sims: 39, level: 0.025, excessMaxima: new Float64Array(39), deficitMaxima: new Float64Array(39), excessThreshold: 0.3, deficitThreshold: 0.3 },
    stableExcess: mask,
    stableDeficit: new Uint8Array(size),
  };
}
