import { describe, expect, it } from 'vitest';
import { alphaFromThreshold, noticeRate, rateAtF, wilson } from '@/lib/psychometrics/curve';
import { targetF, thresholdFraction } from '@/lib/psychometrics/target';

describe('Wilson interval for observed notice rates', () => {
  // Newcombe (1998), Statistics in Medicine 17:857–872, Table I: 81/263 → 0.2553 to 0.3662.
  it('matches the published worked example', () => {
    const [lo, hi] = wilson(81, 263);
    expect(lo).toBeCloseTo(0.2553, 4);
    expect(hi).toBeCloseTo(0.3662, 4);
  });
  it('stays inside [0, 1] at 0 and n of n, and spans everything with no trials', () => {
    expect(wilson(0, 10)[0]).toBe(0);
    expect(wilson(10, 10)[1]).toBeCloseTo(1, 12);
    expect(wilson(10, 10)[1]).toBeLessThanOrEqual(1);
    expect(wilson(0, 0)).toEqual([0, 1]);
  });
});

describe('the curve the results charts draw is the fitted one', () => {
  const c = { guess: 0.5, lapse: 0.02, alpha: Math.log(0.06), beta: 3 };
  it('at d = e^α the curve is half-way between the guess rate and 1 − lapse', () => {
    expect(noticeRate(0.06, c)).toBeCloseTo((0.5 + 0.98) / 2, 12);
  });
  it('rises with the discount from the guess rate towards 1 − lapse', () => {
    expect(noticeRate(0.001, c)).toBeCloseTo(0.5, 3);
    expect(noticeRate(0.9, c)).toBeGreaterThan(noticeRate(0.1, c));
    expect(noticeRate(0.999, c)).toBeLessThan(0.98);
  });
  it('alphaFromThreshold inverts the engine\'s thresholdFraction, and rateAtF inverts targetF', () => {
    const f = targetF(0.75, c.guess, c.lapse);
    const fraction = thresholdFraction(c.alpha, c.beta, f);
    expect(alphaFromThreshold(fraction, c.beta, f)).toBeCloseTo(c.alpha, 12);
    expect(rateAtF(f, c.guess, c.lapse)).toBeCloseTo(0.75, 12);
    expect(noticeRate(fraction, c)).toBeCloseTo(0.75, 12);
  });
});
