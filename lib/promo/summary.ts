// A plan's summary figures (mean promo floor, mean discount after the ending, flag counts), from
// its computed rows, for the plan page and the JSON export. Pure; the table cache on the
// server (lib/server/promotions/plan-table.ts) computes it once per plan.
import type { FloorRow } from './floor-table';

export interface PlanSummary {
  items: number;
  withUnitCost: number;
  outsideRange: number;
  deeperThanMargin: number;
  noPromoPrice: number;
  /** Mean promo floor (fraction off) over all items. */
  averageFloor: number;
  /** Mean discount after the ending rule over items that have a promo price. */
  averageDiscountAfterEnding: number | null;
  minRegularPrice: number;
  maxRegularPrice: number;
}

export function summarisePlan(rows: readonly FloorRow[]): PlanSummary {
  let withUnitCost = 0, outsideRange = 0, deeper = 0, none = 0, floorSum = 0, afterSum = 0, afterN = 0;
  let min = Infinity, max = -Infinity;
  for (const r of rows) {
    if (r.unitCost !== null) withUnitCost++;
    if (r.outsideRange) outsideRange++;
    if (r.deeperThanMargin) deeper++;
    if (r.noPromoPrice) none++;
    floorSum += r.floorFraction;
    if (r.discountAfterEnding !== null) { afterSum += r.discountAfterEnding; afterN++; }
    if (r.regularPrice < min) min = r.regularPrice;
    if (r.regularPrice > max) max = r.regularPrice;
  }
  return {
    items: rows.length, withUnitCost, outsideRange, deeperThanMargin: deeper, noPromoPrice: none,
    averageFloor: rows.length ? floorSum / rows.length : 0,
    averageDiscountAfterEnding: afterN ? afterSum / afterN : null,
    minRegularPrice: rows.length ? min : 0,
    maxRegularPrice: rows.length ? max : 0,
  };
}
