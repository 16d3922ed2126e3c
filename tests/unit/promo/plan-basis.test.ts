import { describe, expect, it } from 'vitest';
import { analyse } from '@/lib/psychometrics/analyse';
import { floorParams, thresholdAt, type FloorParams } from '@/lib/psychometrics/promo-floor';
import { createRng } from '@/lib/psychometrics/random';
import { geometricLadder, simulateCells } from '@/lib/psychometrics/simulate';
import type { AnalysisReport } from '@/lib/psychometrics/report-types';
import { basisData } from '@/lib/promo/floor-basis';
import { computeFloorTable, DEFAULT_ENDING_TOLERANCE, type PlanItem } from '@/lib/promo/floor-table';
import { summarisePlan } from '@/lib/promo/summary';
import { planAboutCsv, planJson, type PlanExportHeader } from '@/lib/promo/plan-export';
import { promoPlanCreateSchema } from '@/lib/schemas/promo-plan.schema';

const item = (regularPrice: number, sku = `S-${regularPrice}`, unitCost: number | null = null): PlanItem => ({ sku, name: 'Item', regularPrice, unitCost, category: null });

// A Weber floor of exactly 12.8 % at every price (the curve's mid-point: e^α).
const weber128: FloorParams = { model: 'weber', slope: 3, lapse: 0.02, lnB: [Math.log(1.99), Math.log(19.99)], guess: [0.5, 0.5], alpha: [Math.log(0.128), Math.log(0.128)] };

describe('price endings only within the tolerance', () => {
  const items = [item(1.99, 'OATS'), item(3.29, 'RICE'), item(9.99, 'TEA'), item(10.49, 'JAM', 6)];
  const rows = computeFloorTable(weber128, { target: undefined, ending: 'ends-99', tolerance: DEFAULT_ENDING_TOLERANCE }, items);
  const by = (sku: string) => rows.find((r) => r.sku === sku)!;

  it('a .99 ending that would give 50 % off a 12.8 % floor keeps the exact floor price instead, flagged', () => {
    expect(by('OATS').floorFraction).toBeCloseTo(0.128, 12);
    expect(by('OATS').promoPrice).toBe(1.73); // 1.99 × 0.872 = 1.735 → 1.73 (13.1 %), not 0.99
    expect(by('OATS').endingSkipped).toBe(true);
    expect(by('RICE').promoPrice).toBe(2.86); // not 1.99
    expect(by('TEA').promoPrice).toBe(8.71); // 7.99 would be 20 % off: 7.2 points deeper
  });
  it('where the ending deepens the discount by at most 2 points it is used', () => {
    expect(by('JAM').promoPrice).toBe(8.99); // 14.3 % for a 12.8 % floor
    expect(by('JAM').endingSkipped).toBe(false);
    for (const r of rows) expect(r.discountAfterEnding! - r.floorFraction!).toBeLessThanOrEqual(0.02 + 1e-12);
  });
  it('the summary shows the average floor and the average discount given side by side, and the margin cost', () => {
    const s = summarisePlan(rows);
    expect(s.averageFloor).toBeCloseTo(0.128, 12);
    const given = rows.reduce((a, r) => a + r.discountAfterEnding!, 0) / rows.length;
    expect(s.averageDiscountAfterEnding).toBeCloseTo(given, 12);
    expect(s.averageDiscountAfterEnding! - s.averageFloor!).toBeLessThan(0.02);
    expect(s.totalMarginCost).toBeCloseTo((1.99 - 1.73) + (3.29 - 2.86) + (9.99 - 8.71) + (10.49 - 8.99), 10);
    expect(s.endingSkipped).toBe(3);
    expect(s.endingMarginCost).toBeGreaterThan(0);
  });
  it('a plan made before the tolerance existed is recomputed as it was made', () => {
    const [old] = computeFloorTable(weber128, { target: undefined, ending: 'ends-99' }, [item(1.99)]);
    expect(old.promoPrice).toBe(0.99);
    expect(old.endingSkipped).toBe(false);
  });
  it('the form schema defaults to the point estimate and 2 points', () => {
    const v = promoPlanCreateSchema.parse({ name: 'Plan', priceListId: crypto.randomUUID(), studyId: crypto.randomUUID(), ending: 'ends-99' });
    expect(v).toMatchObject({ basis: 'point', tolerancePoints: 2, share: null });
    expect(promoPlanCreateSchema.safeParse({ name: 'Plan', priceListId: crypto.randomUUID(), studyId: crypto.randomUUID(), ending: 'exact', basis: 'share' }).success).toBe(false);
  });
});

describe('floor basis: point, cautious end, share of shoppers', () => {
  const observer = { alpha: (b: number) => Math.log(0.06) - 0.3 * Math.log(b / 20), beta: 3.5, lapse: 0.02, guess: 0.5 };
  const bases = [2.49, 9.99, 49];
  const fitted = analyse({ ...simulateCells(observer, bases, geometricLadder(0.005, 0.4, 9), 200, createRng('basis')), task: 'pick', bootstrap: 0 });
  // Intervals and the shopper spread as the engine reports them (set by hand: the unit test needs no bootstrap).
  const report: AnalysisReport = JSON.parse(JSON.stringify(fitted));
  report.bases.forEach((b) => { const f = b.threshold.fraction!; b.threshold.fractionCi = [f * 0.8, f * 1.25]; });
  report.unit = 'shopper';
  report.shopperSpread = {
    model: 'free', shoppers: 40, sigma: 0.4, sigmaCi: [0.3, 0.5], sigmaMethod: 'bootstrap of shoppers', logLik: -1, converged: true,
    bases: bases.map((basePrice, i) => ({
      basePrice, typicalFraction: 0.06, middleHalf: null, curve: [],
      shares: [0.5, 0.75, 0.9].map((share) => ({ share, fraction: [0.05, 0.04, 0.03][i] * (1 + share), fractionCi: null, bound: null })),
    })),
  };
  const params = floorParams(report, 'free');
  const data = basisData(report, 'free', params);

  it('cautious: the floor at the upper end of the interval, carried to other prices by the same ratio', () => {
    const [pt] = computeFloorTable(params, { target: undefined, ending: 'exact', basis: 'point', basisData: data }, [item(20)]);
    const [ca] = computeFloorTable(params, { target: undefined, ending: 'exact', basis: 'cautious', basisData: data }, [item(20)]);
    expect(pt.floorFraction).toBeCloseTo(thresholdAt(params, 'free', 20).fraction, 12);
    expect(ca.floorFraction! / pt.floorFraction!).toBeCloseTo(1.25, 10);
  });
  it('share: the discount 75 % of shoppers notice, at a tested price and between two', () => {
    const rows = computeFloorTable(params, { target: undefined, ending: 'exact', basis: 'share', share: 0.75, basisData: data }, [item(9.99), item(Math.sqrt(9.99 * 49))]);
    expect(rows[0].floorFraction).toBeCloseTo(0.04 * 1.75, 10);
    expect(rows[1].floorFraction).toBeCloseTo(Math.sqrt(0.04 * 1.75 * 0.03 * 1.75), 10);
  });
  it('share is unavailable, with the reason, when the data carry no shopper ids', () => {
    const cells = { ...report, shopperSpread: null, unit: 'trial' as const };
    expect(basisData(cells, 'free', params).shareUnavailable).toMatch(/no shopper ids/);
    expect(data.shareUnavailable).toBeNull();
    expect(data.shares.map((s) => s.share)).toEqual([0.5, 0.75, 0.9]);
  });
  it('a tested price where nobody noticed gives no floor number to the items around it, flagged', () => {
    const bounded: AnalysisReport = JSON.parse(JSON.stringify(report));
    Object.assign(bounded.bases[0].threshold, { fraction: null, bound: { kind: 'above', fraction: 0.4 } });
    const d = basisData(bounded, 'free', params);
    const rows = computeFloorTable(params, { target: undefined, ending: 'ends-99', basis: 'point', basisData: d, tolerance: 0.02 }, [item(1.49), item(4.99), item(20)]);
    expect(rows[0]).toMatchObject({ floorFraction: null, promoPrice: null, noThreshold: true, bound: { kind: 'above', fraction: 0.4 } });
    expect(rows[1].noThreshold).toBe(true); // between 2.49 and 9.99
    expect(rows[2].noThreshold).toBe(false);
    expect(rows[2].floorFraction).toBeGreaterThan(0);
    expect(summarisePlan(rows)).toMatchObject({ noThreshold: 2, items: 3 });
  });
  it('the exports say which basis', () => {
    const h: PlanExportHeader = {
      plan: { id: 'p', name: 'P', createdAt: '2026-01-01T00:00:00Z' }, study: { id: 's', name: 'S', task: 'pick' }, segment: null, fitVersion: 1,
      exclusionRules: null, model: 'Free', target: null, ending: 'Ends in .99', priceList: { id: 'l', name: 'L', currency: 'EUR', itemCount: 1 },
      testedBasePrices: bases, poorFit: false, basis: 'share', share: 0.75, tolerance: 0.02,
    };
    expect(planAboutCsv(h, 'now')).toMatch(/Floor basis,Discount that 75 % of shoppers notice/);
    expect(planAboutCsv(h, 'now')).toMatch(/Price ending tolerance,at most 2 points deeper than the floor/);
    expect(planJson(h, summarisePlan([]), [], 'now').header).toMatchObject({ basis: 'share', share: 0.75, basisMeaning: 'Discount that 75 % of shoppers notice' });
  });
});
