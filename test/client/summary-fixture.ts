/**
 * Test-only builders of placement rows and size summaries with hand-chosen numbers. Invented values for checking
 * the chart data shaping against hand computation; not output of the engine.
 */
import type { MonteCarloResult, PlacementRow, Quantiles, SizeSummary, SweepSummary } from '../../shared/contracts.js';

export function makeRow(fields: Partial<PlacementRow>): PlacementRow {
  return {
    sizeIndex: 0,
    cellSize: 250,
    placementIndex: 0,
    u: 0,
    v: 0,
    angle: 0,
    cells: 16,
    points: 32,
    mean: 2,
    variance: 2,
    vmr: 1,
    chi2: 15,
    df: 15,
    chi2PerDf: 1,
    pClustered: 0.45,
    pRegular: 0.55,
    verdict: 'csr',
    expectedPerCell: 2,
    meetsRuleOf5: false,
    meetsRuleOf1_6: true,
    morisita: 1,
    morisitaStandardized: 0,
    meanCrowding: 2,
    patchiness: 1,
    green: 0,
    negativeBinomialK: null,
    poissonChi2: null,
    poissonDf: null,
    poissonP: null,
    ...fields,
  };
}

export function quantiles(p5: number, p25: number, p50: number, p75: number, p95: number): Quantiles {
  return { min: p5 - 0.1, p5, p25, p50, p75, p95, max: p95 + 0.1 };
}

export function makeMonteCarlo(fields: Partial<MonteCarloResult>): MonteCarloResult {
  return {
    sims: 4,
    pMedianClustered: 0.2,
    pMedianRegular: 1,
    pMaxClustered: 0.2,
    pMinRegular: 1,
    observedMedian: 2,
    observedMax: 3,
    observedMin: 1,
    simulatedMedians: [1, 1.1, 0.9, 1.0],
    simulatedMaxima: [1.5, 1.6, 1.4, 1.5],
    envelope: { lo: 0.9, hi: 1.1 },
    observedShareSignificant: 0.75,
    simulatedShareSignificant: [0, 0.25, 0, 0],
    ...fields,
  };
}

export function makeSize(fields: Partial<SizeSummary>): SizeSummary {
  const reference = makeRow({ vmr: 1.9, chi2PerDf: 1.8 });
  return {
    sizeIndex: 0,
    cellSize: 250,
    expectedPerCell: 2,
    placements: 4,
    vmr: quantiles(1.1, 1.4, 1.7, 2.0, 2.4),
    chi2PerDf: quantiles(1.0, 1.3, 1.6, 1.9, 2.3),
    verdictShares: { clustered: 0.75, csr: 0.25, regular: 0 },
    mostCommon: 'clustered',
    agreement: 0.75,
    reference,
    referenceRank: 0.5,
    referenceInTail: false,
    lowestVmr: reference,
    highestVmr: reference,
    monteCarlo: null,
    conclusion: 'Clustered at this cell size on most placements.',
    ...fields,
  };
}

export function makeSummary(sizes: SizeSummary[]): SweepSummary {
  return {
    plan: { cells: sizes.map((size) => size.cellSize), placements: 4, rotation: true, design: 'halton', minCoverage: 0.5, alpha: 0.05, sims: 4, seed: 7 },
    dataset: {
      id: 'd1',
      name: 'Invented town',
      crs: 'planar',
      n: 100,
      nInside: 98,
      nOutside: 2,
      validArea: 1e6,
      studyAreaArea: 1.1e6,
      bbox: { minX: 0, minY: 0, maxX: 1000, maxY: 1100 },
      areaIsDefault: false,
      warnings: [],
      suggestedCellSizes: [],
    },
    sizes,
    conclusion: 'Clustered across sizes.',
    warnings: [],
    versions: { gridshake: '0.1.0', node: 'v20' },
    timings: { startedAt: '2024-01-01T00:00:00Z', finishedAt: '2024-01-01T00:00:05Z', seconds: 5 },
  };
}
