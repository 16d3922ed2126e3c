// Chart layout rules the results cards rely on: x tick labels never collide, however narrow
// the chart or wide the domain, and every card of a study shares one discount axis that an
// interval far off the ladder cannot stretch.
import { describe, expect, it } from 'vitest';
import { formatNumber, labelWidth, spacedLogTicks } from '@/components/charts/chart-theme';
import { sharedDiscountDomain } from '@/components/charts/chart-domain';
import type { BaseReport } from '@/lib/psychometrics/report-types';

describe('x ticks on a log axis', () => {
  for (const [lo, hi, px] of [[0.2, 60, 260], [0.5, 40, 180], [0.05, 99, 300], [1, 30, 440]] as const) {
    it(`labels keep apart on [${lo}, ${hi}] drawn ${px} px wide`, () => {
      const toPx = (v: number) => (Math.log(v / lo) / Math.log(hi / lo)) * px;
      const ticks = spacedLogTicks(lo, hi, toPx, formatNumber, 8);
      expect(ticks.length).toBeGreaterThanOrEqual(2);
      for (let i = 1; i < ticks.length; i++) {
        const gap = toPx(ticks[i]) - toPx(ticks[i - 1]);
        expect(gap).toBeGreaterThanOrEqual((labelWidth(formatNumber(ticks[i])) + labelWidth(formatNumber(ticks[i - 1]))) / 2 + 8);
      }
      // Round values win when space is short: a power of ten in range is always kept.
      const tens = [0.1, 1, 10].filter((v) => v >= lo && v <= hi);
      for (const t of tens) expect(ticks).toContain(t);
    });
  }
});

describe('one discount axis for every card', () => {
  const base = (fraction: number, ci: [number, number] | null, bound?: BaseReport['threshold']['bound']): BaseReport => ({
    basePrice: 1, nTrials: 1, guess: 0, guessSource: '', lapse: 0, slope: 2, slopeCi: null,
    threshold: { fraction, amount: fraction, fractionCi: ci, amountCi: null, bound }, deviance: 0, devianceDf: 1, devianceP: null, overdispersed: false, verdict: 'fits well',
  });
  const cells = [0.01, 0.02, 0.05, 0.12, 0.25].map((discount) => ({ discount, n: 10, k: 5 }));
  it('covers the rungs and thresholds, ignores an interval far off the ladder', () => {
    const [lo, hi] = sharedDiscountDomain([base(0.08, [0.06, 0.1]), base(0.3, [0.2, 13.1])], cells);
    expect(lo).toBeLessThan(1);
    expect(hi).toBeGreaterThan(30);
    expect(hi).toBeLessThan(99);
  });
  it('a bound counts as its rung', () => {
    const [, hi] = sharedDiscountDomain([base(0.25, null, { kind: 'above', fraction: 0.25 })], cells.slice(0, 3));
    expect(hi).toBeGreaterThanOrEqual(25);
  });
});
