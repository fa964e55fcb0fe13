/**
 * Minimal type declarations for the parts of jStat (jstat on the npm registry, no bundled types) that the tests use as
 * a reference. jStat: Trevor Norris et al., "jStat: a JavaScript statistical library".
 */
declare module 'jstat' {
  interface ChiSquareDistribution {
    /** Quantile: x such that P(chi2_df <= x) = p. */
    inv(p: number, df: number): number;
    /** Probability density at x. */
    pdf(x: number, df: number): number;
    /** Cumulative distribution P(chi2_df <= x). */
    cdf(x: number, df: number): number;
  }
  interface JStatStatic {
    chisquare: ChiSquareDistribution;
    /** Natural logarithm of the gamma function. */
    gammaln(x: number): number;
  }
  const jStat: JStatStatic;
  export default jStat;
}
