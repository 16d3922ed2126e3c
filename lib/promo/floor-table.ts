// A plan's rows: each item's promo floor read from the plan's stored FloorParams through the
// engine's `thresholdAt` (no refit), placed on the plan's floor basis (./floor-basis.ts: point
// estimate, cautious end of the interval, or a share of shoppers), then the promo price:
// the floor price rounded down to the price ending only when that deepens the discount by at
// most the plan's tolerance (default 2 percentage points); otherwise the exact floor price (to
// the cent, rounded down) is kept and the row is flagged `endingSkipped`. So a .99 ending never
// turns a 12.8 % floor on 1.99 into 0.99 (50 % off). Flags: outsideRange (an extrapolation
// beyond the tested base prices), deeperThanMargin (promo price below unit cost), noPromoPrice,
// endingSkipped, noThreshold (a tested price around the item has only a bound: no floor number).
// `unreachableTarget` explains a target notice rate the model never reaches (the plan is then
// refused with 422). The calculator reads the model once, so 50,000 items cost little
// (`npm run bench:plan`). Tests: tests/unit/promo/floor-table.test.ts, plan-basis.test.ts.
import { thresholdAt, type FloorParams, type PriceEnding } from '@/lib/psychometrics/promo-floor';
import type { ThresholdBound } from '@/lib/psychometrics/report-types';
import { promoPriceAfterEnding } from './endings';
import { bracket, interpAt, type BasisData, type FloorBasis } from './floor-basis';

export interface PlanItem {
  sku: string;
  name: string;
  regularPrice: number;
  unitCost: number | null;
  category: string | null;
}

export interface FloorRow extends PlanItem {
  /** Smallest discount (fraction of the regular price) reaching the target; null when the study has only a bound here. */
  floorFraction: number | null;
  floorAmount: number | null;
  /** After the price-ending rule (or the exact floor price); null when no such price exists. */
  promoPrice: number | null;
  /** The discount shoppers see at the promo price; never below floorFraction. */
  discountAfterEnding: number | null;
  marginBefore: number | null;
  marginAfter: number | null;
  /** Regular price outside the range of base prices the study tested (an extrapolation). */
  outsideRange: boolean;
  /** Promo price below unit cost: the floor is deeper than the margin allows. */
  deeperThanMargin: boolean;
  /** No promo price reaches the floor (the floor reaches 100 %, or in older plans no price with the ending is low enough). */
  noPromoPrice: boolean;
  /** The ending would have deepened the discount by more than the tolerance: the exact floor price is kept. */
  endingSkipped: boolean;
  /** A tested price around this item has no threshold, only a bound: no floor is given. */
  noThreshold: boolean;
  /** Which bound, when noThreshold: 'above' the deepest rung or 'below' the shallowest. */
  bound: ThresholdBound | null;
}

export interface FloorSettings {
  /** Target notice rate; undefined = the curve's mid-point. Not used by the 'share' basis. */
  target: number | undefined;
  ending: PriceEnding;
  /** Default 'point'. */
  basis?: FloorBasis;
  /** For the 'share' basis: the share of shoppers who should notice (one the study reports). */
  share?: number | null;
  /** How many points (fraction, 0.02 = 2 points) the ending may deepen the discount beyond the floor; null/undefined = no limit (plans made before the limit existed). */
  tolerance?: number | null;
  /** Stored beside FloorParams; needed for 'cautious' and 'share', and for bounds. */
  basisData?: BasisData | null;
}

/** The default ending tolerance of a new plan: 2 percentage points (common practice, no source). */
export const DEFAULT_ENDING_TOLERANCE = 0.02;

const cents = (v: number) => Math.round(v * 100) / 100;

/** The floor on the plan's basis, or a bound; throws nothing for in-range inputs. */
export function makeFloorFinder(params: FloorParams, settings: FloorSettings) {
  const basis = settings.basis ?? 'point';
  const data = settings.basisData ?? null;
  const shareRow = basis === 'share' ? data?.shares.find((s) => s.share === settings.share) ?? null : null;
  const lnShare = shareRow ? shareRow.fractions.map((f) => (f === null ? null : Math.log(f))) : null;
  return (price: number): { fraction: number | null; extrapolated: boolean; bound: ThresholdBound | null } => {
    const x = Math.log(price);
    const br = bracket(params.lnB, x);
    const bound = data ? (data.bounds[br.lo] ?? data.bounds[br.hi] ?? null) : null;
    const point = thresholdAt(params, params.model, price, settings.target);
    if (bound) return { fraction: null, extrapolated: point.extrapolated, bound };
    if (basis === 'point') return { fraction: point.fraction, extrapolated: point.extrapolated, bound: null };
    if (basis === 'cautious') {
      const r = data ? interpAt(data.cautiousLnRatio, br) : null;
      return { fraction: r === null ? null : point.fraction * Math.exp(r), extrapolated: point.extrapolated, bound: null };
    }
    const l = lnShare ? interpAt(lnShare, br) : null;
    return { fraction: l === null ? null : Math.exp(l), extrapolated: point.extrapolated, bound: null };
  };
}

/** Returns a per-item function; the model is read once, each item costs a few operations. */
export function makePlanCalculator(params: FloorParams, settings: FloorSettings) {
  const find = makeFloorFinder(params, settings);
  // null: a plan made before the tolerance existed, computed as it was made (any depth, no fallback).
  const tolerance = settings.tolerance ?? null;
  return (item: PlanItem): FloorRow => {
    const { fraction, extrapolated, bound } = find(item.regularPrice);
    let promoPrice: number | null = null;
    let endingSkipped = false;
    if (fraction !== null) {
      promoPrice = promoPriceAfterEnding(item.regularPrice, fraction, settings.ending);
      if (settings.ending !== 'exact' && tolerance !== null && (promoPrice === null || 1 - promoPrice / item.regularPrice - fraction > tolerance + 1e-12)) {
        const exact = promoPriceAfterEnding(item.regularPrice, fraction, 'exact');
        if (exact !== null) { promoPrice = exact; endingSkipped = true; }
      }
    }
    const hasCost = item.unitCost !== null;
    // Fields written out rather than spread: spreads compile to slow helpers on older targets,
    // which costs seconds over 50,000 rows.
    return {
      sku: item.sku, name: item.name, regularPrice: item.regularPrice, unitCost: item.unitCost, category: item.category,
      floorFraction: fraction,
      floorAmount: fraction === null ? null : fraction * item.regularPrice,
      promoPrice,
      discountAfterEnding: promoPrice === null ? null : 1 - promoPrice / item.regularPrice,
      marginBefore: hasCost ? cents(item.regularPrice - item.unitCost!) : null,
      marginAfter: hasCost && promoPrice !== null ? cents(promoPrice - item.unitCost!) : null,
      outsideRange: extrapolated,
      deeperThanMargin: hasCost && promoPrice !== null && promoPrice < item.unitCost!,
      noPromoPrice: fraction !== null && promoPrice === null,
      endingSkipped,
      noThreshold: fraction === null,
      bound,
    };
  };
}

export function computeFloorTable(params: FloorParams, settings: FloorSettings, items: readonly PlanItem[]): FloorRow[] {
  const calc = makePlanCalculator(params, settings);
  const out = new Array<FloorRow>(items.length);
  for (let i = 0; i < items.length; i++) out[i] = calc(items[i]);
  return out;
}

/**
 * Why a target cannot be used with these parameters, or null. The guess rate is interpolated
 * between tested bases, so a target reachable at every tested base is reachable at every price.
 */
export function unreachableTarget(params: FloorParams, target: number | undefined): string | null {
  if (target === undefined) return null;
  const maxGuess = Math.max(...params.guess);
  if (target <= maxGuess) return `A notice rate of ${pct(target)} is at or below the guess rate of this study (${pct(maxGuess)}): shoppers reach it without any discount. Choose a higher rate or the mid-point.`;
  if (target >= 1 - params.lapse) return `A notice rate of ${pct(target)} is above what the fitted curve ever reaches (${pct(1 - params.lapse)}, because of lapses). Choose a lower rate or the mid-point.`;
  return null;
}

const pct = (v: number) => `${(v * 100).toFixed(1).replace(/\.0$/, '')} %`;
