/**
 * Could this input text declare a distribution (CONTRACT §8.1)? A cheap first test, so the sheet page loads the
 * full parse (`parseDistributionText` in ./distribution-density.ts) and its quantile code only for a field that
 * might need them. Every text the full parse accepts passes it (tests/plot/declares-distribution.test.ts).
 */
export function mayDeclareDistribution(text: string): boolean {
  return /^\s*(normal|lognormal|uniform|triangular)\s*\(/.test(text);
}
