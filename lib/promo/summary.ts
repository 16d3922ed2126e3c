// A plan's summary figures, from its computed rows, for the plan page and the JSON export: the
// average floor and the average discount actually given side by side (so an ending that deepens
// discounts shows at once), the total margin cost per unit (regular − promo price, summed over
// items with a promo price) and how much of it the price ending added beyond the floors, and
// the flag counts. Pure; the table cache on the server (lib/server/promotions/plan-table.ts)
// computes it once per plan.
import type { FloorRow } from './floor-table';

export interface PlanSummary {
  items: number;
  withUnitCost: number;
  outsideRange: number;
  deeperThanMargin: number;
  noPromoPrice: number;
  endingSkipped: number;
  noThreshold: number;
  /** Mean promo floor (fraction off) over items that have a floor. */
  averageFloor: number | null;
  /** Mean discount actually given (at the promo price) over items that have a promo price. */
  averageDiscountAfterEnding: number | null;
  /** Σ (regular − promo price) over items with a promo price: what one unit of each costs in margin. */
  totalMarginCost: number;
  /** The part of totalMarginCost that the price ending adds beyond the exact floors. */
  endingMarginCost: number;
  minRegularPrice: number;
  maxRegularPrice: number;
}

export function summarisePlan(rows: readonly FloorRow[]): PlanSummary {
  let withUnitCost = 0, outsideRange = 0, deeper = 0, none = 0, skipped = 0, noThreshold = 0;
  let floorSum = 0, floorN = 0, afterSum = 0, afterN = 0, cost = 0, endingCost = 0;
  let min = Infinity, max = -Infinity;
  for (const r of rows) {
    if (r.unitCost !== null) withUnitCost++;
    if (r.outsideRange) outsideRange++;
    if (r.deeperThanMargin) deeper++;
    if (r.noPromoPrice) none++;
    if (r.endingSkipped) skipped++;
    if (r.noThreshold) noThreshold++;
    if (r.floorFraction !== null) { floorSum += r.floorFraction; floorN++; }
    if (r.discountAfterEnding !== null && r.promoPrice !== null) {
      afterSum += r.discountAfterEnding; afterN++;
      cost += r.regularPrice - r.promoPrice;
      if (r.floorAmount !== null) endingCost += Math.max(0, r.regularPrice - r.promoPrice - r.floorAmount);
    }
    if (r.regularPrice < min) min = r.regularPrice;
    if (r.regularPrice > max) max = r.regularPrice;
  }
  return {
    items: rows.length, withUnitCost, outsideRange, deeperThanMargin: deeper, noPromoPrice: none, endingSkipped: skipped, noThreshold,
    averageFloor: floorN ? floorSum / floorN : null,
    averageDiscountAfterEnding: afterN ? afterSum / afterN : null,
    totalMarginCost: Math.round(cost * 100) / 100,
    endingMarginCost: Math.round(endingCost * 100) / 100,
    minRegularPrice: rows.length ? min : 0,
    maxRegularPrice: rows.length ? max : 0,
  };
}
