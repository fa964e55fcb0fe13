/**
 * Folds the stability parts of a cell size's chunk results (workers/stability/stability-chunk.ts) into the
 * stability surface: per valid pixel the number of placements in which it lies in a kept cell, in an excess cell and
 * in a deficit cell; per simulated pattern the same counts, sparse (the pairs as they arrive, tallied at the end).
 * Chunks may arrive in any order.
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
  /**
   * the simulated patterns' (2 r + kind, pixel position) pairs as they arrive, one per placement in which the pixel
   * lies in a flagged cell of pattern r; tallied per pattern by finish()
   */
  private simulatedPairs = new Uint32Array(1024);
  private simulatedCount = 0;

  constructor(
    readonly raster: StabilityRaster,
    /** valid pixels (workers/stability/stability-raster.ts validPixels), the positions the chunks refer to */
    readonly pixels: Uint32Array,
    private readonly sims: number,
  ) {
    this.notKept = new Float64Array(pixels.length);
    this.excess = new Float64Array(pixels.length);
    this.deficit = new Float64Array(pixels.length);
  }

  /** Adds a chunk result's stability part, found at `offset`. Cost O(listed pixels + simulated pairs). */
  addChunk(result: Float64Array, offset: number): void {
    const part = decodeStability(result, offset);
    this.placementsSeen += part.placements;
    addPairs(part.notKept, this.notKept);
    addPairs(part.excess, this.excess);
    addPairs(part.deficit, this.deficit);
    const pairs = part.simulated;
    if (this.simulatedCount + pairs.length > this.simulatedPairs.length) {
      const grown = new Uint32Array(Math.max(2 * this.simulatedPairs.length, this.simulatedCount + pairs.length));
      grown.set(this.simulatedPairs.subarray(0, this.simulatedCount));
      this.simulatedPairs = grown;
    }
    const codes = 2 * this.sims;
    const positions = this.pixels.length;
    for (let t = 0; t < pairs.length; t += 2) {
      const code = pairs[t]!;
      const q = pairs[t + 1]!;
      if (!(code >= 0 && code < codes && q >= 0 && q < positions)) {
        throw new Error(`a chunk result lists simulated pair (${code}, ${q}) outside ${codes} patterns x kinds and ${positions} pixels`);
      }
      this.simulatedPairs[this.simulatedCount++] = code;
      this.simulatedPairs[this.simulatedCount++] = q;
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
      const largest = this.largestShares(least);
      const excessMaxima = new Float64Array(this.sims);
      const deficitMaxima = new Float64Array(this.sims);
      for (let r = 0; r < this.sims; r++) {
        excessMaxima[r] = largest[2 * r]!;
        deficitMaxima[r] = largest[2 * r + DEFICIT]!;
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

  /**
   * Per code 2 r + kind, the largest share of simulated pattern r over the assessed pixels (0 when it has no flagged
   * pixel): share = placements in which the pixel lies in a flagged cell / placements in which it lies in a kept one.
   * The pairs are grouped by code (a counting sort), then each group is tallied in one pixel-sized array and read
   * back at each pixel's first pair (the tally is zeroed there, so a pixel counts once). Cost O(pairs + codes),
   * memory 4 bytes per pair and per valid pixel.
   */
  private largestShares(least: number): Float64Array {
    const codes = 2 * this.sims;
    const pairs = this.simulatedPairs;
    const count = this.simulatedCount;
    const starts = new Uint32Array(codes + 1);
    for (let t = 0; t < count; t += 2) starts[pairs[t]! + 1]!++;
    for (let c = 0; c < codes; c++) starts[c + 1]! += starts[c]!;
    const grouped = new Uint32Array(count / 2);
    const cursor = starts.slice(0, codes);
    for (let t = 0; t < count; t += 2) grouped[cursor[pairs[t]!]!++] = pairs[t + 1]!;
    const tally = new Uint32Array(this.pixels.length);
    const largest = new Float64Array(codes);
    for (let c = 0; c < codes; c++) {
      const end = starts[c + 1]!;
      for (let k = starts[c]!; k < end; k++) tally[grouped[k]!]!++;
      let max = 0;
      for (let k = starts[c]!; k < end; k++) {
        const q = grouped[k]!;
        const flagged = tally[q]!;
        if (flagged === 0) continue;
        tally[q] = 0;
        const kept = this.kept[q]!;
        if (kept >= least && kept > 0) max = Math.max(max, flagged / kept);
      }
      largest[c] = max;
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
