import { describe, expect, it } from 'vitest';
import { analyse } from '@/lib/psychometrics/analyse';
import { applyPriceEnding, floorParams, makeFloorCalculator, promoFloor, thresholdAt } from '@/lib/psychometrics/promo-floor';
import { createRng } from '@/lib/psychometrics/random';
import { geometricLadder, simulateCells } from '@/lib/psychometrics/simulate';

describe('applyPriceEnding rounds down to the ending', () => {
  it.each([
    [10.5, 'ends-99', 9.99], [10.99, 'ends-99', 10.99], [11.2, 'ends-99', 10.99],
    [10.5, 'ends-49', 10.49], [10.48, 'ends-49', 9.49], [10.49, 'ends-49', 10.49],
    [10.5, 'whole', 10], [10.0, 'whole', 10], [10.456, 'exact', 10.45], [0.29, 'exact', 0.29],
  ] as const)('%d with %s → %d', (price, ending, expected) => {
    expect(applyPriceEnding(price, ending)).toBeCloseTo(expected, 10);
  });
  it('gives NaN when no price with that ending is low enough', () => {
    expect(applyPriceEnding(0.3, 'ends-99')).toBeNaN();
    expect(applyPriceEnding(0.3, 'whole')).toBe(0);
  });
});

describe('promo floors from a fitted study', () => {
  const obs = { alpha: (b: number) => Math.log(0.05) - 0.3 * Math.log(b / 10), beta: 4, lapse: 0.02, guess: 0.5 };
  const bases = [4.99, 19.99, 99, 499];
  const report = analyse({ ...simulateCells(obs, bases, geometricLadder(0.005, 0.3, 8), 200, createRng('promo')), task: 'pick', bootstrap: 0 });

  it('at a tested base the floor equals the model threshold', () => {
    for (const model of ['free', 'weber', 'power'] as const) {
      const p = floorParams(report, model);
      report.models[model].thresholds.forEach((t) => {
        const r = thresholdAt(p, model, t.basePrice);
        expect(thresholdAt(report, model, t.basePrice).fraction).toBe(r.fraction);
        expect(t.fraction).not.toBeNull(); // the fixture's thresholds lie inside the tested ladder
        expect(r.fraction).toBeCloseTo(t.fraction!, 10);
        expect(r.extrapolated).toBe(false);
      });
    }
  });

  it('free interpolates ln threshold linearly in ln B and is flat and flagged outside', () => {
    const p = floorParams(report, 'free');
    const [t0, t1] = report.models.free.thresholds;
    const mid = Math.sqrt(t0.basePrice * t1.basePrice);
    expect(Math.log(thresholdAt(p, 'free', mid).fraction)).toBeCloseTo((Math.log(t0.fraction!) + Math.log(t1.fraction!)) / 2, 10);
    const below = thresholdAt(p, 'free', 1);
    expect(below.extrapolated).toBe(true);
    expect(below.fraction).toBeCloseTo(t0.fraction!, 10);
    expect(thresholdAt(report, 'power', 2000).extrapolated).toBe(true);
  });

  it('the discount after the ending is never below the floor, for many prices and every ending', () => {
    const calc = makeFloorCalculator(report, 'power', 0.8);
    const rng = createRng('prices');
    for (let i = 0; i < 2000; i++) {
      const price = Math.round((1 + rng.next() * 900) * 100) / 100;
      for (const ending of ['exact', 'ends-99', 'ends-49', 'whole'] as const) {
        const f = calc(price, ending);
        if (!f.feasible) continue;
        expect(f.discountAfterEnding).toBeGreaterThanOrEqual(f.floorFraction);
        expect(f.promoPrice).toBeLessThanOrEqual(price);
        expect(f.floorAmount).toBeCloseTo(f.floorFraction * price, 10);
      }
    }
  });

  it('a higher notice rate needs a deeper discount; promoFloor agrees with the calculator', () => {
    const low = promoFloor({ report, model: 'weber', basePrice: 49.99, target: 0.7, ending: 'ends-99' });
    const high = promoFloor({ report, model: 'weber', basePrice: 49.99, target: 0.9, ending: 'ends-99' });
    expect(high.floorFraction).toBeGreaterThan(low.floorFraction);
    expect(makeFloorCalculator(report, 'weber', 0.7)(49.99, 'ends-99')).toEqual(low);
    expect(() => promoFloor({ report, model: 'weber', basePrice: 49.99, target: 0.3, ending: 'exact' })).toThrow(/unreachable/);
  });

  it('50,000 items take well under a second', () => {
    const calc = makeFloorCalculator(report, 'free');
    const t = performance.now();
    let s = 0;
    for (let i = 0; i < 50000; i++) s += calc(1 + (i % 997), 'ends-99').floorFraction;
    expect(performance.now() - t).toBeLessThan(1000);
    expect(s).toBeGreaterThan(0);
  });
});
