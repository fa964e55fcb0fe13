import type { PlacementRow } from '../../shared/contracts.js';
import type { Verdict } from '../../workers/types.js';

/** A placement row with the fields a summary reads; the rest filled consistently for m = 21 whole cells. */
export function placementRow(placementIndex: number, vmr: number, verdict: Verdict, sizeIndex = 0, cellSize = 100): PlacementRow {
  const cells = 21;
  const df = cells - 1;
  return {
    sizeIndex,
    cellSize,
    placementIndex,
    u: placementIndex === 0 ? 0 : 0.5,
    v: placementIndex === 0 ? 0 : 0.5,
    angle: 0,
    cells,
    points: 105,
    mean: 5,
    variance: 5 * vmr,
    vmr,
    chi2: df * vmr,
    df,
    chi2PerDf: vmr,
    pClustered: Number.NaN,
    pRegular: Number.NaN,
    verdict,
    expectedPerCell: 5,
    meetsRuleOf5: true,
    meetsRuleOf1_6: true,
    morisita: Number.NaN,
    morisitaStandardized: Number.NaN,
    meanCrowding: Number.NaN,
    patchiness: Number.NaN,
    green: Number.NaN,
    negativeBinomialK: null,
    poissonChi2: null,
    poissonDf: null,
    poissonP: null,
  };
}
