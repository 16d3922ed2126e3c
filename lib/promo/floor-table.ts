// A plan's rows: each item's promo floor read from the plan's stored FloorParams through the
// engine's `thresholdAt` (no refit), the promo price after the price ending (./endings.ts), and
// the flags — outsideRange (an extrapolation beyond the tested base prices), deeperThanMargin
// (promo price below unit cost), noPromoPrice. `unreachableTarget` explains a target notice rate
// the model never reaches (the plan is then refused with 422). The calculator reads the model
// once, so 50,000 items cost little (`npm run bench:plan`). Tests: tests/unit/promo/floor-table.test.ts.
import { thresholdAt, type FloorParams, type PriceEnding } from '@/lib/psychometrics/promo-floor';
import { promoPriceAfterEnding } from './endings';

export interface PlanItem {
  sku: string;
  name: string;
  regularPrice: number;
  unitCost: number | null;
  category: string | null;
}

export interface FloorRow extends PlanItem {
  /** Smallest discount (fraction of the regular price) reaching the target notice rate. */
  floorFraction: number;
  floorAmount: number;
  /** After the price-ending rule; null when no such price exists (see endings.ts). */
  promoPrice: number | null;
  /** The discount shoppers see at the promo price; never below floorFraction. */
  discountAfterEnding: number | null;
  marginBefore: number | null;
  marginAfter: number | null;
  /** Regular price outside the range of base prices the study tested (an extrapolation). */
  outsideRange: boolean;
  /** Promo price below unit cost: the floor is deeper than the margin allows. */
  deeperThanMargin: boolean;
  /** No promo price with the ending rule reaches the floor. */
  noPromoPrice: boolean;
}

export interface FloorSettings {
  /** Target notice rate; undefined = the curve's mid-point. */
  target: number | undefined;
  ending: PriceEnding;
}

const cents = (v: number) => Math.round(v * 100) / 100;

/** Returns a per-item function; the model is read once, each item costs a few operations. */
export function makePlanCalculator(params: FloorParams, settings: FloorSettings) {
  return (item: PlanItem): FloorRow => {
    const { fraction, extrapolated } = thresholdAt(params, params.model, item.regularPrice, settings.target);
    const promoPrice = promoPriceAfterEnding(item.regularPrice, fraction, settings.ending);
    const hasCost = item.unitCost !== null;
    // Fields written out rather than spread: spreads compile to slow helpers on older targets,
    // which costs seconds over 50,000 rows.
    return {
      sku: item.sku, name: item.name, regularPrice: item.regularPrice, unitCost: item.unitCost, category: item.category,
      floorFraction: fraction,
      floorAmount: fraction * item.regularPrice,
      promoPrice,
      discountAfterEnding: promoPrice === null ? null : 1 - promoPrice / item.regularPrice,
      marginBefore: hasCost ? cents(item.regularPrice - item.unitCost!) : null,
      marginAfter: hasCost && promoPrice !== null ? cents(promoPrice - item.unitCost!) : null,
      outsideRange: extrapolated,
      deeperThanMargin: hasCost && promoPrice !== null && promoPrice < item.unitCost!,
      noPromoPrice: promoPrice === null,
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
