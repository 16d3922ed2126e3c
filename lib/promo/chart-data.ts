// The promo-floor chart's data (components/charts/promo-floor-chart.tsx): the model's floor as
// a curve over the list's price range, on a log grid because base prices span 0.89 to 899, and
// the items' discounts after the price ending as points. A 50,000-item list is sampled
// (every k-th item, in list order) so the browser draws a few thousand points, not all of them.
// Pure, like the rest of lib/promo.
import type { FloorParams } from '@/lib/psychometrics/promo-floor';
import { makeFloorFinder, type FloorRow, type FloorSettings } from './floor-table';

export interface ChartPoint { price: number; discount: number; flagged: boolean }

export interface PromoChartData {
  /** The model's promo floor (% off, on the plan's basis) along the list's price range, on a log grid; gaps where the study has only a bound. */
  curve: { price: number; floor: number }[];
  /** Items' discount after the ending rule (a deterministic sample on big lists). */
  items: ChartPoint[];
  testedBasePrices: number[];
  /** Every step-th item is drawn (1 = all); items without a promo price are left out. */
  step: number;
  itemsTotal: number;
}

const MAX_POINTS = 800;
const GRID = 80;

export function promoChartData(params: FloorParams, settings: FloorSettings, rows: readonly FloorRow[], testedBasePrices: number[]): PromoChartData {
  const find = makeFloorFinder(params, settings);
  let lo = Math.min(...testedBasePrices), hi = Math.max(...testedBasePrices);
  for (const r of rows) { if (r.regularPrice < lo) lo = r.regularPrice; if (r.regularPrice > hi) hi = r.regularPrice; }
  const curve: PromoChartData['curve'] = [];
  const a = Math.log(lo), b = Math.log(hi);
  for (let i = 0; i <= GRID; i++) {
    const price = Math.exp(a + ((b - a) * i) / GRID);
    const f = find(price).fraction;
    if (f !== null) curve.push({ price, floor: Math.min(1, f) });
  }
  // Every k-th item keeps the sample spread over the whole list in list order.
  const step = Math.max(1, Math.ceil(rows.length / MAX_POINTS));
  const items: ChartPoint[] = [];
  for (let i = 0; i < rows.length; i += step) {
    const r = rows[i];
    if (r.discountAfterEnding !== null) items.push({ price: r.regularPrice, discount: r.discountAfterEnding, flagged: r.outsideRange || r.deeperThanMargin || r.endingSkipped });
  }
  return { curve, items, testedBasePrices: [...testedBasePrices].sort((x, y) => x - y), step, itemsTotal: rows.length };
}
