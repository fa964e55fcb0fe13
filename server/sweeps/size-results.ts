/**
 * Collects the chunk results of one cell size into placement rows and the observed / simulated chi2/df
 * matrices, then summarises them (server/summary). Chunks may arrive in any order; the result does not depend
 * on it, so it does not depend on the number of threads either.
 */
import type { PlacementRow, SizeSummary } from '../../shared/contracts.js';
import type { CellShape } from '../../workers/lattice/cell-shape.js';
import { placementRobustTest } from '../summary/placement-robust-test.js';
import { summarizeSize } from '../summary/size-summary.js';
import { decodeStatistics, STATISTICS_FIELDS } from '../../workers/sweep/statistics-codec.js';
import { chunkResultLength, simulatedFlagOffset, simulatedValueOffset } from '../../workers/sweep/sweep-task.js';
import { stabilityRaster, validPixels, type StabilityRaster } from '../../workers/stability/stability-raster.js';
import type { Region, Verdict } from '../../workers/types.js';
import { StabilityAccumulator, type StabilitySurface } from '../stability/stability-accumulator.js';

export class SizeResults {
  readonly rows: PlacementRow[];
  private readonly observed: Float64Array;
  private readonly observedSignificant: Uint8Array;
  private readonly simulated: Float64Array;
  private readonly simulatedSignificant: Uint8Array;
  /** the stability surface being folded (null when the sweep computes none), and once finished the surface */
  private stability: StabilityAccumulator | null = null;
  private surface: { alpha: number; surface: StabilitySurface } | null = null;
  /** placements whose chunk results are in */
  private received = 0;

  constructor(
    readonly sizeIndex: number,
    readonly cellSize: number,
    /** u, v, angle triples of this shape's placements */
    readonly placements: Float64Array,
    private readonly sims: number,
    readonly shape: CellShape = 'square',
  ) {
    const count = placements.length / 3;
    this.rows = new Array<PlacementRow>(count);
    this.observed = new Float64Array(count);
    this.observedSignificant = new Uint8Array(count);
    this.simulated = new Float64Array(count * sims);
    this.simulatedSignificant = new Uint8Array(count * sims);
  }

  /** Makes this size compute the stability surface over the region (workers/stability); returns its raster. */
  enableStability(region: Region): StabilityRaster {
    const raster = stabilityRaster(region, this.cellSize);
    this.stability = new StabilityAccumulator(raster, validPixels(region, raster), this.sims);
    return raster;
  }

  /** The stability raster, when enabled. */
  get stabilityRaster(): StabilityRaster | undefined {
    return this.stability?.raster;
  }

  /** Whether every placement's chunk result is in. */
  get complete(): boolean {
    return this.received === this.placements.length / 3;
  }

  /**
   * The stability surface and its calibration at the two-sided level alpha; null when not enabled. Made once, when
   * every chunk is in (the sweep asks as soon as this size is complete, while the workers go on with the next).
   */
  stabilitySurface(alpha: number): StabilitySurface | null {
    if (this.stability === null) return null;
    if (!this.complete) throw new Error(`the stability surface of cell size ${this.cellSize} m was asked for before all its placements were in`);
    if (this.surface === null) {
      this.surface = { alpha, surface: this.stability.finish(this.shape, this.cellSize, this.placements.length / 3, alpha) };
    } else if (this.surface.alpha !== alpha) {
      throw new Error(`the stability surface of cell size ${this.cellSize} m was made at alpha ${this.surface.alpha}, not ${alpha}`);
    }
    return this.surface.surface;
  }

  /** Stores the result of the chunk of placements first .. first + count - 1. Cost O(count (F + R)). */
  addChunk(first: number, count: number, result: Float64Array): void {
    const total = this.placements.length / 3;
    for (let j = 0; j < count; j++) {
      const index = first + j;
      const { areaChi2PerDf, areaVerdict, ...decoded } = decodeStatistics(result, j * STATISTICS_FIELDS);
      // the area-only comparison exists only against a baseline
      const stats = areaVerdict === null ? decoded : { ...decoded, areaChi2PerDf, areaVerdict };
      this.rows[index] = {
        sizeIndex: this.sizeIndex,
        cellSize: this.cellSize,
        shape: this.shape,
        placementIndex: index,
        u: this.placements[3 * index],
        v: this.placements[3 * index + 1],
        angle: this.placements[3 * index + 2],
        ...stats,
      };
      this.observed[index] = stats.chi2PerDf;
      this.observedSignificant[index] = stats.verdict === 'csr' ? 0 : 1;
      for (let r = 0; r < this.sims; r++) {
        this.simulated[r * total + index] = result[simulatedValueOffset(count, this.sims, j, r)];
        this.simulatedSignificant[r * total + index] = result[simulatedFlagOffset(count, this.sims, j, r)];
      }
    }
    this.stability?.addChunk(result, chunkResultLength(count, this.sims));
    this.received += count;
  }

  /** The size summary with the placement-robust Monte Carlo test when sims > 0. */
  summarize(): SizeSummary {
    const monteCarlo =
      this.sims > 0
        ? placementRobustTest({
            observed: this.observed,
            observedSignificant: this.observedSignificant,
            simulated: this.simulated,
            simulatedSignificant: this.simulatedSignificant,
            sims: this.sims,
          })
        : null;
    const summary = summarizeSize(this.rows, monteCarlo);
    const areaOnly = areaOnlySummary(this.rows);
    return areaOnly === undefined ? summary : { ...summary, areaOnly };
  }
}

/** The area-only verdict shares, most common verdict and median chi2/df of rows evaluated against a baseline. */
function areaOnlySummary(rows: readonly PlacementRow[]): SizeSummary['areaOnly'] {
  const verdicts = rows.map((row) => row.areaVerdict).filter((verdict): verdict is Verdict => verdict !== null && verdict !== undefined);
  if (verdicts.length === 0 || verdicts.length !== rows.length) return undefined;
  const shares: Record<Verdict, number> = { clustered: 0, regular: 0, csr: 0 };
  for (const verdict of verdicts) shares[verdict] += 1 / verdicts.length;
  const mostCommon = (['clustered', 'csr', 'regular'] as Verdict[]).reduce((best, v) => (shares[v] > shares[best] ? v : best), 'clustered');
  const values = rows.map((row) => row.areaChi2PerDf ?? Number.NaN).filter(Number.isFinite).sort((a, b) => a - b);
  const middle = values.length / 2;
  const chi2PerDfMedian = values.length === 0 ? Number.NaN : values.length % 2 === 1 ? values[Math.floor(middle)]! : (values[middle - 1]! + values[middle]!) / 2;
  return { verdictShares: shares, mostCommon, chi2PerDfMedian };
}
