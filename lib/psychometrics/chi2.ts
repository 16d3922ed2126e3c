import { jStat } from 'jstat';

/** Upper-tail probability P(χ²_df ≥ x); null when df ≤ 0 (nothing to test). */
export function chiSquareP(x: number, df: number): number | null {
  if (!(df > 0)) return null;
  if (!(x > 0)) return 1;
  return Math.min(1, Math.max(0, 1 - jStat.chisquare.cdf(x, df)));
}

/** Critical value c with P(χ²_df ≥ c) = alpha. */
export function chiSquareCritical(alpha: number, df: number): number {
  return jStat.chisquare.inv(1 - alpha, df);
}
