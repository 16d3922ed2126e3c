import { describe, expect, it } from 'vitest';
import { analyse } from '@/lib/psychometrics/analyse';
import { floorParams, makeFloorCalculator, type PriceEnding } from '@/lib/psychometrics/promo-floor';
import { createRng } from '@/lib/psychometrics/random';
import { geometricLadder, simulateCells } from '@/lib/psychometrics/simulate';
import { computeFloorTable, unreachableTarget, type PlanItem } from '@/lib/promo/floor-table';
import { defaultFloorModel } from '@/lib/promo/model-choice';
import type { AnalysisReport } from '@/lib/psychometrics/report-types';

// A simulated study: Weber slope 0.7 (a smaller fraction on dearer items), 2AFC guess rate.
const observer = { alpha: (b: number) => Math.log(0.06) - 0.3 * Math.log(b / 20), beta: 3.5, lapse: 0.02, guess: 0.5 };
const bases = [2.49, 9.99, 49, 199];
const report = analyse({ ...simulateCells(observer, bases, geometricLadder(0.005, 0.4, 9), 250, createRng('promo-table')), task: 'pick', bootstrap: 0 });
const item = (regularPrice: number, unitCost: number | null = null): PlanItem => ({ sku: `S-${regularPrice}`, name: 'Item', regularPrice, unitCost, category: null });
const ENDINGS: PriceEnding[] = ['exact', 'ends-99', 'ends-49', 'whole'];

describe('plan floors from stored parameters agree with the engine', () => {
  const rng = createRng('plan-prices');
  const prices = Array.from({ length: 1500 }, () => Math.round(Math.exp(Math.log(0.5) + rng.next() * Math.log(2000)) * 100) / 100);

  for (const model of ['free', 'weber', 'power'] as const) {
    for (const target of [undefined, 0.75]) {
      it(`${model} model, target ${target ?? 'mid-point'}`, () => {
        // The plan stores floorParams as JSON; a round trip proves nothing else is needed.
        const params = JSON.parse(JSON.stringify(floorParams(report, model)));
        for (const ending of ENDINGS) {
          const engine = makeFloorCalculator(report, model, target);
          const rows = computeFloorTable(params, { target, ending }, prices.map((p) => item(p)));
          rows.forEach((r, i) => {
            const e = engine(prices[i], ending);
            expect(r.floorFraction).toBe(e.floorFraction);
            expect(r.floorAmount).toBe(e.floorAmount);
            expect(r.outsideRange).toBe(e.extrapolated);
            if (e.feasible && e.promoPrice > 0) expect(r.promoPrice).toBe(e.promoPrice);
            else expect(r.promoPrice).toBeNull();
          });
        }
      });
    }
  }
});

describe('price-ending rules round the promo price down and keep the discount at or above the floor', () => {
  const params = floorParams(report, 'power');
  const rng = createRng('endings');
  const prices = Array.from({ length: 3000 }, () => Math.round((1 + rng.next() * 900) * 100) / 100);
  const cents = (v: number) => Math.round(v * 100) % 100;

  it.each([['ends-99', [99]], ['ends-49', [49]], ['whole', [0]]] as const)('%s', (ending, allowed) => {
    const rows = computeFloorTable(params, { target: undefined, ending }, prices.map((p) => item(p)));
    for (const r of rows) {
      if (r.promoPrice === null) continue;
      expect(allowed).toContain(cents(r.promoPrice));
      expect(r.discountAfterEnding!).toBeGreaterThanOrEqual(r.floorFraction!);
      expect(r.promoPrice).toBeLessThanOrEqual(r.regularPrice * (1 - r.floorFraction!) + 1e-9);
      // Rounded DOWN to the nearest such price: the next one up (one unit more) is shallower than the floor.
      expect(1 - (r.promoPrice + 1) / r.regularPrice).toBeLessThan(r.floorFraction!);
    }
  });

  it('a worked case: 10.00 with a 6.54 % floor is 9.34 (exact), 8.99 (.99), 8.49 (.49), 9 (whole)', () => {
    const fixed = { ...floorParams(report, 'weber') };
    // Choose α so the mid-point floor at every price is 6.54 %.
    fixed.alpha = fixed.alpha.map(() => Math.log(0.0654));
    const at = (ending: PriceEnding) => computeFloorTable(fixed, { target: undefined, ending }, [item(10)])[0];
    expect(at('exact').floorFraction).toBeCloseTo(0.0654, 12);
    expect(at('exact').promoPrice).toBe(9.34);
    expect(at('ends-99').promoPrice).toBe(8.99);
    expect(at('ends-49').promoPrice).toBe(8.49);
    expect(at('whole').promoPrice).toBe(9);
    expect(at('whole').discountAfterEnding).toBeCloseTo(0.1, 12);
  });

  it('no promo price when no price with the ending is low enough (0.89 to .99 or to whole units)', () => {
    const [r99] = computeFloorTable(params, { target: undefined, ending: 'ends-99' }, [item(0.89)]);
    const [rWhole] = computeFloorTable(params, { target: undefined, ending: 'whole' }, [item(0.89)]);
    for (const r of [r99, rWhole]) {
      expect(r.promoPrice).toBeNull();
      expect(r.noPromoPrice).toBe(true);
      expect(r.discountAfterEnding).toBeNull();
    }
  });
});

describe('flags', () => {
  const params = floorParams(report, 'free');
  const rows = computeFloorTable(params, { target: undefined, ending: 'ends-99' }, [
    item(1.99, 0.8), item(2.49, 1.2), item(20, 19.5), item(199, 90), item(249, null),
  ]);

  it('outside tested range: below the lowest and above the highest tested base price only', () => {
    expect(rows.map((r) => r.outsideRange)).toEqual([true, false, false, false, true]);
  });

  it('deeper than margin: promo price below unit cost; margins per unit before and after', () => {
    const [, , thin, wide, noCost] = rows;
    expect(thin.deeperThanMargin).toBe(true);
    expect(thin.marginBefore).toBe(0.5);
    expect(thin.marginAfter).toBeCloseTo(thin.promoPrice! - 19.5, 10);
    expect(thin.marginAfter!).toBeLessThan(0);
    expect(wide.deeperThanMargin).toBe(false);
    expect(wide.marginBefore).toBe(109);
    expect(wide.marginAfter).toBeCloseTo(wide.promoPrice! - 90, 10);
    expect(noCost).toMatchObject({ marginBefore: null, marginAfter: null, deeperThanMargin: false });
  });
});

describe('targets and the default model', () => {
  it('a target at or below the guess rate, or above 1 − lapse, is refused with the reason', () => {
    const p = floorParams(report, 'weber');
    expect(unreachableTarget(p, 0.5)).toMatch(/guess rate/);
    expect(unreachableTarget(p, 0.995)).toMatch(/ever reaches/);
    expect(unreachableTarget(p, 0.75)).toBeNull();
    expect(unreachableTarget(p, undefined)).toBeNull();
  });

  it('the study’s preferred model is the default; a constant amount plans with power', () => {
    const as = (preferredModel: AnalysisReport['preferredModel']) => ({ ...report, preferredModel });
    expect(defaultFloorModel(as('constantAmount'))).toBe('power');
    expect(defaultFloorModel(as('weber'))).toBe('weber');
    expect(defaultFloorModel(as('free'))).toBe('free');
    const single = { ...as('power'), models: { ...report.models, power: { ...report.models.power, weberSlope: null } } };
    expect(defaultFloorModel(single)).toBe('free');
  });
});
