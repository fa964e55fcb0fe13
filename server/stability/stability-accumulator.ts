/**
 * Folds the stability parts of a cell size's chunk results (workers/stability/stability-chunk.ts) into the
 * stability surface: per valid pixel the number of placements in which it lies in a kept cell, in an excess cell and
 * in a deficit cell; per simulated pattern the same counts, sparse. Chunks may arrive in any order.
 *
 * Shares: excess share = excess placements / kept placements (likewise deficit). A pixel is assessed (enters the
 * calibration maximum and may belong to a stable area) when it lies in a kept cell in at least MIN_KEPT_FRACTION of
 * the placements; every pixel kept at least once gets a share in the raster.
 */
import { decodeStability, DEFICIT } from '../../workers/stability/stability-chunk.js';
import type { StabilityRaster } from '../../workers/stability/stability-raster.js';
import type { CellShape } from '../../workers/lattice/cell-shape.js';
import { shareThreshold } from './share-calibration.js';

/** Least share of placements in which a pixel lies in a kept cell for it to be assessed. */
export const MIN_KEPT_FRACTION = 0.5;

export interface StabilityCalibration {
  sims: number;
  /** the level of each kind: alpha / 2, so that excess and deficit areas together appear with probability <= alpha */
  level: number;
  /** largest simulated share per pattern */
  excessMaxima: Float64Array;
  deficitMaxima: Float64Array;
  /** a pixel's share must exceed these (Infinity: too few simulations for the level) */
  excessThreshold: number;
  deficitThreshold: number;
}

export interface StabilitySurface {
  shape: CellShape;
  cellSize: number;
  placements: number;
  raster: StabilityRaster;
  /** raster-sized, row-major from the top row; NaN outside the valid region and where no placement keeps the pixel */
  excessShare: Float32Array;
  deficitShare: Float32Array;
  /** raster-sized: 1 for pixels assessed (kept in >= MIN_KEPT_FRACTION of the placements) */
  assessed: Uint8Array;
  /** null without simulations: the surface has no areas */
  calibration: StabilityCalibration | null;
  /** raster-sized masks of the stable pixels (all 0 without calibration) */
  stableExcess: Uint8Array;
  stableDeficit: Uint8Array;
}

export class StabilityAccumulator {
  /** placements folded so far, and per valid pixel those in which it lies in no kept cell */
  private placementsSeen = 0;
  private readonly notKept: Float64Array;
  /** per valid pixel: placements in which it lies in a kept cell (placementsSeen − notKept), made by finish() */
  private kept: Float64Array = new Float64Array(0);
  private readonly excess: Float64Array;
  private readonly deficit: Float64Array;
  /** per (2 r + kind): pixel position -> placements */
  private readonly simulated: Map<number, number>[];

  constructor(
    readonly raster: StabilityRaster,
    /** valid pixels (workers/stability/stability-raster.ts validPixels), the positions the chunks refer to */
    readonly pixels: Uint32Array,
    private readonly sims: number,
  ) {
    this.notKept = new Float64Array(pixels.length);
    this.excess = new Float64Array(pixels.length);
    this.deficit = new Float64Array(pixels.length);
    this.simulated = Array.from({ length: 2 * sims }, () => new Map<number, number>());
  }

  /** Adds a chunk result's stability part, found at `offset`. Cost O(listed pixels + simulated pairs). */
  addChunk(result: Float64Array, offset: number): void {
    const part = decodeStability(result, offset);
    this.placementsSeen += part.placements;
    addPairs(part.notKept, this.notKept);
    addPairs(part.excess, this.excess);
    addPairs(part.deficit, this.deficit);
    const pairs = part.simulated;
    for (let t = 0; t < pairs.length; t += 2) {
      const map = this.simulated[pairs[t]!]!;
      const q = pairs[t + 1]!;
      map.set(q, (map.get(q) ?? 0) + 1);
    }
  }

  /** The surface, its calibration (when sims > 0) and the stable pixels at the two-sided level alpha. */
  finish(shape: CellShape, cellSize: number, placements: number, alpha: number): StabilitySurface {
    const size = this.raster.width * this.raster.height;
    const excessShare = new Float32Array(size).fill(Number.NaN);
    const deficitShare = new Float32Array(size).fill(Number.NaN);
    const assessed = new Uint8Array(size);
    const stableExcess = new Uint8Array(size);
    const stableDeficit = new Uint8Array(size);
    const least = MIN_KEPT_FRACTION * placements;
    this.kept = new Float64Array(this.pixels.length);
    for (let q = 0; q < this.pixels.length; q++) this.kept[q] = this.placementsSeen - this.notKept[q]!;
    let calibration: StabilityCalibration | null = null;
    if (this.sims > 0) {
      const excessMaxima = new Float64Array(this.sims);
      const deficitMaxima = new Float64Array(this.sims);
      for (let r = 0; r < this.sims; r++) {
        excessMaxima[r] = this.largestShare(this.simulated[2 * r]!, least);
        deficitMaxima[r] = this.largestShare(this.simulated[2 * r + DEFICIT]!, least);
      }
      const level = alpha / 2;
      calibration = {
        sims: this.sims,
        level,
        excessMaxima,
        deficitMaxima,
        excessThreshold: shareThreshold(excessMaxima, level),
        deficitThreshold: shareThreshold(deficitMaxima, level),
      };
    }
    for (let q = 0; q < this.pixels.length; q++) {
      const kept = this.kept[q]!;
      if (kept === 0) continue;
      const pixel = this.pixels[q]!;
      // shares compared in float64, exactly as the simulated maxima were formed (the raster stores float32)
      const excess = this.excess[q]! / kept;
      const deficit = this.deficit[q]! / kept;
      excessShare[pixel] = excess;
      deficitShare[pixel] = deficit;
      if (kept < least) continue;
      assessed[pixel] = 1;
      if (calibration !== null && excess > calibration.excessThreshold) stableExcess[pixel] = 1;
      if (calibration !== null && deficit > calibration.deficitThreshold) stableDeficit[pixel] = 1;
    }
    return { shape, cellSize, placements, raster: this.raster, excessShare, deficitShare, assessed, calibration, stableExcess, stableDeficit };
  }

  /** The largest share of one simulated pattern over the assessed pixels (0 when it has no flagged pixel). */
  private largestShare(counts: Map<number, number>, least: number): number {
    let largest = 0;
    for (const [q, count] of counts) {
      const kept = this.kept[q]!;
      if (kept >= least && kept > 0) largest = Math.max(largest, count / kept);
    }
    return largest;
  }
}

/** Adds sparse (q, count) pairs into per-pixel totals. @throws Error for a pixel position outside the raster's */
function addPairs(pairs: Float64Array, into: Float64Array): void {
  for (let t = 0; t < pairs.length; t += 2) {
    const q = pairs[t]!;
    if (!(q >= 0 && q < into.length && Number.isInteger(q))) {
      throw new Error(`a chunk result names valid pixel ${q} of ${into.length} (update gridshake on every machine)`);
    }
    into[q]! += pairs[t + 1]!;
  }
}
