import { describe, expect, it } from 'vitest';
import { chiSquareP } from '@/lib/psychometrics/chi2';
import { createRng } from '@/lib/psychometrics/random';
import { compareGroups } from '@/lib/psychometrics/segments';
import { geometricLadder, type Observer, simulateCells } from '@/lib/psychometrics/simulate';

const bases = [4.99, 29.99, 199];
const ladder = geometricLadder(0.005, 0.4, 8);
const weberish: Observer = { alpha: (b) => Math.log(0.05) - 0.1 * Math.log(b / 10), beta: 4, lapse: 0.02, guess: 0.5 };
const sqrtish: Observer = { alpha: (b) => Math.log(0.05) - 0.5 * Math.log(b / 10), beta: 4, lapse: 0.02, guess: 0.5 };

describe('compareGroups', () => {
  it('detects groups with different Weber slopes', () => {
    const rng = createRng('segments-differ');
    const r = compareGroups([
      { label: 'small households', ...simulateCells(weberish, bases, ladder, 150, rng) },
      { label: 'large households', ...simulateCells(sqrtish, bases, ladder, 150, rng) },
    ], { task: 'pick', bootstrap: 0 });
    expect(r.groups.map((g) => g.label)).toEqual(['small households', 'large households']);
    expect(Math.abs(r.groups[0].weberSlope! - 0.9)).toBeLessThan(0.12);
    expect(Math.abs(r.groups[1].weberSlope! - 0.5)).toBeLessThan(0.12);
    expect(r.test.df).toBe(4);
    expect(r.test.p!).toBeLessThan(0.001);
  });

  it('does not reject when both groups come from one observer', () => {
    const rng = createRng('segments-same');
    const r = compareGroups([
      { label: 'a', ...simulateCells(weberish, bases, ladder, 150, rng) },
      { label: 'b', ...simulateCells(weberish, bases, ladder, 150, rng) },
    ], { task: 'pick', bootstrap: 0 });
    expect(r.test.p!).toBeGreaterThan(0.01);
    // The LR statistic is twice the log-likelihood the separate curves gain over the shared one
    // (a clamped or mis-summed statistic fails here), and its p-value is that statistic's χ² tail.
    expect(r.shared.logLik).toBeLessThanOrEqual(r.groups[0].logLik + r.groups[1].logLik + 1e-6);
    expect(r.test.chi2).toBeCloseTo(2 * (r.groups[0].logLik + r.groups[1].logLik - r.shared.logLik), 8);
    expect(r.test.p).toBeCloseTo(chiSquareP(r.test.chi2, r.test.df)!, 12);
  });

  it('names the group whose data is bad', () => {
    expect(() => compareGroups([
      { label: 'ok', cells: [{ basePrice: 9.99, discount: 0.05, n: 10, k: 3 }] },
      { label: 'broken', cells: [{ basePrice: 9.99, discount: 0.05, n: 10, k: 12 }] },
    ], { task: 'pick' })).toThrow(/group "broken": cell 1/);
  });
});
