import { chiSquareLogLowerTail, chiSquareLogUpperTail } from '../../workers/stats/chi-square.js';

/**
 * Natural logs of a placement's two p-values, computed in log space from its chi2 and df:
 * logPClustered = log P(chi2_df >= chi2), logPRegular = log P(chi2_df <= chi2). They stay finite where the
 * p-values underflow to 0 (below about 1e-308), so extreme results still rank in JSON outputs. NaN chi2 gives NaN.
 * Cost O(1). Reference: workers/stats/incomplete-gamma.ts.
 */
export function logPValues(row: { chi2: number; df: number }): { logPClustered: number; logPRegular: number } {
  return { logPClustered: chiSquareLogUpperTail(row.chi2, row.df), logPRegular: chiSquareLogLowerTail(row.chi2, row.df) };
}

/** A placement row with logPClustered and logPRegular added (summary.json rows: reference, lowest and highest vmr). */
export function withLogPValues<T extends { chi2: number; df: number }>(row: T): T & { logPClustered: number; logPRegular: number } {
  return { ...row, ...logPValues(row) };
}
