import 'server-only';
import { computeFloorTable, type FloorRow, type FloorSettings } from '@/lib/promo/floor-table';
import { promoChartData, type PromoChartData } from '@/lib/promo/chart-data';
import { summarisePlan, type PlanSummary } from '@/lib/promo/summary';
import type { WorkspaceContext } from '@/lib/server/team/membership';
import { loadPriceListItems } from './price-lists';
import { getPromoPlan, type PromoPlanDto } from './plans';

export interface PlanTable {
  plan: PromoPlanDto;
  rows: FloorRow[];
  summary: PlanSummary;
  chart: PromoChartData;
}

// Plans and price lists never change once stored, so a computed table can be reused by the
// table's page requests and the exports. Keyed by plan id; authorisation runs before every use.
// Per process and small (CACHE_SIZE plans, oldest dropped first): a 50,000-item list is costly
// to hold, and a table rebuilt after a restart comes out the same, since floors are recomputed
// from the plan's stored parameters, never refitted.
const CACHE_SIZE = 4;
const cache = new Map<string, Omit<PlanTable, 'plan'>>();

/** A stored plan's floor settings; plans made before the basis and tolerance existed read as point floors with no limit. */
export function planFloorSettings(plan: PromoPlanDto): FloorSettings {
  return {
    target: plan.settings.target ?? undefined, ending: plan.settings.ending,
    basis: plan.settings.basis ?? 'point', share: plan.settings.share ?? null,
    tolerance: plan.settings.tolerance ?? null, basisData: plan.fit.basis ?? null,
  };
}

/** The plan with every item's floor, recomputed from the stored fit parameters (never refit). */
export async function planTable(ctx: WorkspaceContext, planId: string): Promise<PlanTable> {
  const plan = await getPromoPlan(ctx, planId);
  const hit = cache.get(plan.id);
  if (hit) {
    cache.delete(plan.id);
    cache.set(plan.id, hit);
    return { plan, ...hit };
  }
  const items = await loadPriceListItems(ctx, plan.priceList.id);
  const settings = planFloorSettings(plan);
  const rows = computeFloorTable(plan.fit.params, settings, items);
  const computed = { rows, summary: summarisePlan(rows), chart: promoChartData(plan.fit.params, settings, rows, plan.fit.testedBasePrices) };
  cache.set(plan.id, computed);
  if (cache.size > CACHE_SIZE) cache.delete(cache.keys().next().value!);
  return { plan, ...computed };
}
