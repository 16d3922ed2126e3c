import type { AnalysisReport, ThresholdBound } from '@/lib/psychometrics/report-types';
import type { FloorModel, FloorParams } from '@/lib/psychometrics/promo-floor';
import type { Interval } from '@/lib/psychometrics/types';

// Where a plan puts each item's promo floor (the "floor basis"):
// - 'point': the fitted threshold at the plan's target notice rate (the default);
// - 'cautious': the deeper end of the threshold's 95 % interval, so the floor still reaches the
//   target if the true threshold sits at the unfavourable end. Carried to an item's price as the
//   ratio upper end ÷ estimate at each tested price, interpolated in ln price like the threshold
//   itself (Weber: the Weber fraction's interval; free and power: each tested price's own
//   interval, which is wider than the power model's and so errs on the cautious side). The
//   intervals are those at the study's notice threshold; applying their ratio at another target
//   notice rate is an approximation, and the plan says which basis it used;
// - 'share': the discount that a chosen share of shoppers notices (each shopper at their own
//   mid-point), from the mixed model's `shopperSpread.bases[].shares` (issue 12). Needs shopper
//   ids; without them the option is refused with the reason.
// A tested price whose threshold is only a bound (nobody noticed even the deepest rung, or
// everybody the shallowest) gives no floor to the items priced around it: no number is made up.
// Pure; tests: tests/unit/promo/plan-basis.test.ts.

export const FLOOR_BASES = ['point', 'cautious', 'share'] as const;
export type FloorBasis = (typeof FLOOR_BASES)[number];

export const FLOOR_BASIS_LABELS: Record<FloorBasis, string> = {
  point: 'Point estimate of the threshold',
  cautious: 'Cautious end of the 95 % interval',
  share: 'Discount a chosen share of shoppers notices',
};

/** What the new-plan form knows of a study's bases (lib/server/promotions/basis-options.ts). */
export interface BasisOption {
  /** Shares of shoppers the study reports (e.g. 0.5, 0.75, 0.9); empty when unavailable. */
  shares: number[];
  /** Why the share basis cannot be used, or null. */
  shareUnavailable: string | null;
}

/** What a plan stores beside FloorParams to place floors on any basis (per tested base, ascending as params.lnB). */
export interface BasisData {
  /** ln(upper end ÷ estimate) of the threshold at each tested base; null where there is no interval. */
  cautiousLnRatio: (number | null)[];
  /** Shares of shoppers offered by the study's mixed model, each with its discount per tested base (null: bound only). */
  shares: { share: number; fractions: (number | null)[] }[];
  /** A bound in place of the threshold at a tested base (nobody / everybody noticed), else null. */
  bounds: (ThresholdBound | null)[];
  /** Why the share basis is not available, or null when it is. */
  shareUnavailable: string | null;
}

type MaybeBound = { fraction: number | null; fractionCi: Interval | null; bound?: ThresholdBound | null };

export function basisData(report: AnalysisReport, model: FloorModel, params: FloorParams): BasisData {
  const bases = params.lnB.map((l) => Math.exp(l));
  const at = <T extends { basePrice: number }>(list: readonly T[], b: number) => list.find((x) => Math.abs(x.basePrice - b) < 1e-9 * Math.max(1, b));
  const per = bases.map((b) => at(report.bases, b));
  const bounds = per.map((r) => ((r?.threshold as MaybeBound | undefined)?.bound ?? null));
  let cautiousLnRatio: (number | null)[];
  const w = report.models.weber;
  if (model === 'weber') {
    const ratio = w.weberFractionCi && w.weberFraction > 0 && Number.isFinite(w.weberFractionCi[1]) ? Math.log(Math.max(w.weberFractionCi[1], w.weberFraction) / w.weberFraction) : null;
    cautiousLnRatio = bases.map(() => ratio);
  } else {
    cautiousLnRatio = per.map((r) => {
      const t = r?.threshold as MaybeBound | undefined;
      if (!t || t.fraction === null || !(t.fraction > 0) || !t.fractionCi || !Number.isFinite(t.fractionCi[1])) return null;
      return Math.log(Math.max(t.fractionCi[1], t.fraction) / t.fraction);
    });
  }
  const spread = report.shopperSpread ?? null;
  let shares: BasisData['shares'] = [];
  let shareUnavailable: string | null = null;
  if (!spread) {
    shareUnavailable = report.unit === 'trial'
      ? 'The study’s data carry no shopper ids (e.g. imported cell counts), so how far shoppers differ is unknown.'
      : 'This study’s fit has no shopper-level model yet (how far shoppers differ); use the point estimate or the cautious end.';
  } else {
    const offered = [...new Set(spread.bases.flatMap((b) => b.shares.map((s) => s.share)))].sort((a, b) => a - b);
    shares = offered.map((share) => ({
      share,
      fractions: bases.map((b) => {
        const s = at(spread.bases, b)?.shares.find((x) => x.share === share);
        return s && s.fraction !== null && s.fraction > 0 ? s.fraction : null;
      }),
    }));
    if (!shares.length) shareUnavailable = 'The study’s shopper-level model reports no shares of shoppers.';
  }
  return { cautiousLnRatio, shares, bounds, shareUnavailable };
}

/** The tested bases whose values decide an item's floor: the two around its price, or the nearest end. */
export function bracket(lnB: readonly number[], x: number): { lo: number; hi: number; t: number } {
  const n = lnB.length;
  if (n === 1 || x <= lnB[0]) return { lo: 0, hi: 0, t: 0 };
  if (x >= lnB[n - 1]) return { lo: n - 1, hi: n - 1, t: 0 };
  let lo = 0, hi = n - 1;
  while (hi - lo > 1) { const mid = (lo + hi) >> 1; if (lnB[mid] <= x) lo = mid; else hi = mid; }
  return { lo, hi, t: (x - lnB[lo]) / (lnB[hi] - lnB[lo]) };
}

/** Linear in ln price between the bracketing bases; null when either value is missing. */
export function interpAt(values: readonly (number | null)[], b: { lo: number; hi: number; t: number }): number | null {
  const a = values[b.lo], c = values[b.hi];
  if (a === null || a === undefined || c === null || c === undefined) return null;
  return a + b.t * (c - a);
}
