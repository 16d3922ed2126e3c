import { describe, expect, it } from 'vitest';
import { studyDesignSchema, trialsPerRespondent, type StudyDesignInput } from '@/lib/schemas/study.schema';
import { generatePlan } from '@/respondent/shared/plan';
import { nextAdaptiveTrial, type AnsweredTrial } from '@/respondent/shared/adaptive';
import { expectedTrial } from '@/respondent/shared/screens';
import { shownDiscount, shownPrice, formatPrice } from '@/respondent/shared/price';
import { applyPriceEnding } from '@/lib/psychometrics/promo-floor';
import type { FixedPlan, AdaptivePlan } from '@/respondent/shared/types';

const design = (over: Partial<StudyDesignInput> = {}) => studyDesignSchema.parse({
  name: 'Plan test', itemName: 'Coffee beans', category: 'Pantry', currency: 'EUR', locale: 'de-DE', task: 'pick',
  basePrices: [2.49, 9.99, 49, 199], ladder: [0.01, 0.03, 0.08, 0.2], repetitions: 3, catchShare: 0.2, practiceTrials: 3, orderSeed: 5,
  adaptive: { enabled: false }, consentText: 'x'.repeat(60), segmentQuestions: [], attentionCheck: { enabled: true },
  targetCompletes: 10, priceEnding: 'exact', ...over,
});

describe('fixed trial plans', () => {
  const d = design();
  const plan = generatePlan(d, 1234) as FixedPlan;
  const counts = trialsPerRespondent(d);

  it('has every base × rung × repetitions once, the catch share (spot; none in pick), one attention check and practice first', () => {
    expect(plan.trials).toHaveLength(counts.total);
    const tests = plan.trials.filter((t) => t.kind === 'test');
    for (const b of d.basePrices) for (const r of d.ladder) expect(tests.filter((t) => t.basePrice === b && t.rung === r)).toHaveLength(3);
    // Pick the lower price has no catch trials (two equal tags carry no information).
    expect(counts.catch).toBe(0);
    expect(plan.trials.filter((t) => t.kind === 'catch')).toHaveLength(0);
    const spot = design({ task: 'spot' });
    const spotPlan = generatePlan(spot, 1234) as FixedPlan;
    const catches = spotPlan.trials.filter((t) => t.kind === 'catch');
    expect(catches).toHaveLength(trialsPerRespondent(spot).catch);
    expect(catches.length / (catches.length + tests.length)).toBeCloseTo(0.2, 1);
    expect(catches.every((t) => t.discount === 0 && t.price === t.basePrice)).toBe(true);
    expect(plan.trials.slice(0, 3).every((t) => t.kind === 'practice' && t.discount >= 0.3)).toBe(true);
    expect(plan.trials.slice(3).some((t) => t.kind === 'practice')).toBe(false);
    const att = plan.trials.findIndex((t) => t.kind === 'attention');
    expect(plan.trials.filter((t) => t.kind === 'attention')).toHaveLength(1);
    expect(Math.abs(att - (3 + (plan.trials.length - 3) / 2))).toBeLessThanOrEqual(1);
  });

  it('is deterministic from the seed and differs between seeds', () => {
    expect(generatePlan(d, 1234)).toEqual(plan);
    const other = generatePlan(d, 999) as FixedPlan;
    expect(other.trials.map((t) => `${t.basePrice}/${t.rung}`)).not.toEqual(plan.trials.map((t) => `${t.basePrice}/${t.rung}`));
  });

  it('balances left and right for pick the lower price', () => {
    const main = plan.trials.filter((t) => t.kind === 'test' || t.kind === 'catch');
    const left = main.filter((t) => t.lowerSide === 'left').length;
    expect(Math.abs(left - (main.length - left))).toBeLessThanOrEqual(1);
  });

  it('applies the price ending only where it fits the rung, and records the discount actually shown', () => {
    const p = generatePlan(design({ priceEnding: 'ends-99' }), 3) as FixedPlan;
    for (const t of p.trials.filter((x) => x.kind === 'test')) {
      expect(t.price).toBe(shownPrice(t.basePrice, t.rung!, 'ends-99'));
      expect(t.price).toBeLessThan(t.basePrice);
      expect(t.discount).toBeCloseTo((t.basePrice - t.price) / t.basePrice, 6);
      // within a tenth of the rung, or the nearest cent when cents are too coarse for that
      const exact = applyPriceEnding(Math.round(t.basePrice * (1 - t.rung!) * 100) / 100, 'exact');
      if (t.price !== exact) expect(Math.abs(t.discount - t.rung!)).toBeLessThanOrEqual(0.1 * t.rung! + 1e-9);
    }
    // 49 at 1 % = 48.51; .99 would show 2.06 % (or 0.02 %), so the exact cents are shown.
    expect(shownPrice(49, 0.01, 'ends-99')).toBe(48.51);
    expect(shownPrice(199, 0.2, 'ends-99')).toBe(158.99); // 20.1 %: the ending fits
    expect(shownDiscount(49, 47.99)).toBeCloseTo(0.020612, 6);
    expect(shownPrice(0.5, 0.1, 'ends-99')).toBe(0.45); // no .99 price below 0.99: exact cents
  });

  it('formats prices for the locale and currency', () => {
    expect(formatPrice(9.99, 'EUR', 'de-DE')).toMatch(/9,99\s€/);
    expect(formatPrice(1234.5, 'USD', 'en-US')).toBe('$1,234.50');
  });

  it('spot the saving: a shelf of base variants and fillers, refreshed between blocks', () => {
    const sd = design({ task: 'spot', shelfSize: 6 });
    const sp = generatePlan(sd, 77) as FixedPlan;
    expect(sp.shelf).toHaveLength(6);
    expect(sp.shelf.filter((s) => s.base !== null).map((s) => s.base).sort((a, b) => a! - b!)).toEqual(sd.basePrices);
    expect(new Set(sp.shelf.map((s) => s.label)).size).toBe(6);
    for (const t of sp.trials.filter((x) => x.kind !== 'attention')) expect(sp.shelf[t.shelfItem!].base).toBe(t.basePrice);
    expect(sp.trials.filter((t) => t.refresh).length).toBeGreaterThan(0);
  });
});

describe('adaptive plans', () => {
  const d = design({ task: 'spot', adaptive: { enabled: true, rule: '1u2d', trialsPerBase: 10, reversals: 20 }, basePrices: [9.99, 49], catchShare: 0.1 });
  const plan = generatePlan(d, 42) as AdaptivePlan;

  function run(respond: (t: { basePrice: number; discount: number }) => 0 | 1) {
    const answered: AnsweredTrial[] = [];
    const shown: { kind: string; basePrice: number; rung: number | null }[] = [];
    for (;;) {
      const t = nextAdaptiveTrial(d, 42, plan, answered);
      if (!t) break;
      shown.push(t);
      const a = t.kind === 'test' ? respond(t) : 0;
      answered.push({ kind: t.kind, slot: t.slot!, basePrice: t.basePrice, answer: a });
    }
    return shown;
  }

  it('starts at the middle rung, steps down after two hits on a log scale, per base price', () => {
    const shown = run(() => 1).filter((t) => t.kind === 'test');
    const first = shown.find((t) => t.basePrice === 49)!;
    expect(first.rung).toBeCloseTo(0.03, 4);
    const at49 = shown.filter((t) => t.basePrice === 49).map((t) => t.rung!);
    expect(at49[2]).toBeLessThan(at49[0]);
    expect(Math.log(at49[0] / at49[2])).toBeCloseTo(Math.log(0.2 / 0.01) / 3, 2);
    expect(shown.filter((t) => t.basePrice === 9.99)).toHaveLength(10);
  });

  it('moves up after a miss, keeps catch trials and the attention check, and replays deterministically', () => {
    const all = run(() => 0);
    const at9 = all.filter((t) => t.kind === 'test' && t.basePrice === 9.99).map((t) => t.rung!);
    expect(at9[1]).toBeGreaterThan(at9[0]);
    expect(all.filter((t) => t.kind === 'catch').length).toBeGreaterThan(0);
    expect(all.filter((t) => t.kind === 'attention')).toHaveLength(1);
    expect(run(() => 0)).toEqual(all);
    expect(expectedTrial(d, 42, plan, [], 0)).toEqual(nextAdaptiveTrial(d, 42, plan, []));
  });
});
