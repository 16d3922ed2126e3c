import { describe, expect, it } from 'vitest';
import { assumedObserver, planDesign, respondentsForWidth } from '@/lib/psychometrics/planner';

const design = {
  basePrices: [9.99, 99], rungs: [0.01, 0.02, 0.04, 0.08, 0.16, 0.32], repetitions: 2, task: 'pick' as const,
  weberFraction: 0.05, beta: 3, lapse: 0.02, simulations: 60, seed: 'plan',
};

describe('planner', () => {
  it('expected widths shrink as respondents grow (about 1/sqrt)', () => {
    const small = planDesign({ ...design, respondents: 10 });
    const big = planDesign({ ...design, respondents: 80 });
    small.bases.forEach((b, j) => {
      expect(big.bases[j].expectedWidth).toBeLessThan(b.expectedWidth);
      const ratio = b.expectedWidth / big.bases[j].expectedWidth;
      expect(ratio).toBeGreaterThan(1.8);
      expect(ratio).toBeLessThan(4.5);
      expect(b.threshold).toBeCloseTo(0.05, 10);
    });
    expect(big.weberSlopeWidth!).toBeLessThan(small.weberSlopeWidth!);
    expect(big.trialsPerCell).toBe(160);
  });

  it('respondentsForWidth finds a count that meets the width and one fewer that does not', () => {
    const [first] = respondentsForWidth({ ...design, simulations: 40, targetWidth: 0.02, maxRespondents: 400 });
    expect(first.respondents).not.toBeNull();
    const r = first.respondents!;
    expect(planDesign({ ...design, simulations: 40, respondents: r }).bases[0].expectedWidth).toBeLessThanOrEqual(0.02);
    expect(planDesign({ ...design, simulations: 40, respondents: r - 1 }).bases[0].expectedWidth).toBeGreaterThan(0.02);
  });

  it('rejects a design without an assumed threshold', () => {
    expect(() => planDesign({ ...design, weberFraction: undefined, respondents: 10 })).toThrow(/alpha or a weberFraction/);
  });
});

describe('the observer a plan assumes from a fit', () => {
  it('takes the middle slope (not pulled by one runaway base) and the mean lapse and guess', () => {
    const bases = [{ slope: 2, lapse: 0, guess: 0.5 }, { slope: 90, lapse: 0.04, guess: 0.5 }, { slope: 3, lapse: 0.02, guess: 0.2 }];
    const o = assumedObserver(bases);
    expect(o.beta).toBe(3);
    expect(o.lapse).toBeCloseTo(0.02, 12);
    expect(o.guess).toBeCloseTo(0.4, 12);
    expect(assumedObserver(bases.slice(0, 2)).beta).toBe(90);
  });
});
