import { describe, expect, it } from 'vitest';
import { analyse, PsychometricsInputError } from '@/lib/psychometrics/analyse';
import { widen } from '@/lib/psychometrics/intervals';
import { createRng } from '@/lib/psychometrics/random';
import { geometricLadder, simulateCells } from '@/lib/psychometrics/simulate';
import type { Cell } from '@/lib/psychometrics/types';

const rungs = [0.02, 0.04, 0.08, 0.16];
const cellsFor = (basePrice: number, ks: number[], n = 20): Cell[] => rungs.map((discount, i) => ({ basePrice, discount, n, k: ks[i] }));
const good = [...cellsFor(9.99, [11, 13, 16, 19]), ...cellsFor(99, [10, 12, 15, 19])];

describe('input errors name the cell', () => {
  const cases: [string, Cell[], RegExp][] = [
    ['empty input', [], /no cells/],
    ['k > n', [{ basePrice: 9.99, discount: 0.05, n: 10, k: 11 }], /cell 1 \(base price 9.99, discount 0.05\): k \(11\) exceeds n \(10\)/],
    ['negative count', [{ basePrice: 9.99, discount: 0.05, n: 10, k: -1 }], /cell 1 .*k must be a non-negative whole number/],
    ['non-integer count', [{ basePrice: 9.99, discount: 0.05, n: 10.5, k: 1 }], /n must be a non-negative whole number/],
    ['discount 0', [{ basePrice: 9.99, discount: 0, n: 10, k: 1 }], /discount must lie strictly between 0 and 1/],
    ['discount 1', [{ basePrice: 9.99, discount: 1, n: 10, k: 1 }], /discount must lie strictly between 0 and 1/],
    ['base price 0', [{ basePrice: 0, discount: 0.1, n: 10, k: 1 }], /base price must be a number above 0/],
  ];
  for (const [name, cells, message] of cases) {
    it(name, () => {
      expect(() => analyse({ cells, task: 'pick' })).toThrow(PsychometricsInputError);
      expect(() => analyse({ cells, task: 'pick' })).toThrow(message);
    });
  }
  it('names the second cell when only it is bad', () => {
    expect(() => analyse({ cells: [good[0], { ...good[1], k: 99 }], task: 'pick' })).toThrow(/cell 2 /);
  });
  it('rejects an unreachable target with the fitted range', () => {
    // pick: γ = 0.5, so a 40 % notice rate cannot be reached
    expect(() => analyse({ cells: good, task: 'pick', target: 0.4, bootstrap: 0 })).toThrow(/unreachable at base price 9.99/);
    expect(() => analyse({ cells: good, task: 'pick', target: 1.2 })).toThrow(PsychometricsInputError);
  });
});

describe('hard cases fit without crashing', () => {
  it('all-yes and all-no cells', () => {
    const cells = [...cellsFor(9.99, [0, 0, 20, 20]), ...cellsFor(99, [0, 5, 20, 20])];
    const r = analyse({ cells, task: 'trip', bootstrap: 50 });
    for (const b of r.bases) {
      expect(Number.isFinite(b.threshold.fraction)).toBe(true);
      expect(b.slope).toBeLessThanOrEqual(100);
    }
    expect(r.warnings.some((w) => /base 9.99: slope at or near its upper bound/.test(w))).toBe(true);
  });

  it('a base where nobody notices anything gets a bounded threshold and a warning', () => {
    const cells = [...cellsFor(9.99, [0, 0, 0, 0]), ...cellsFor(99, [2, 6, 12, 18])];
    const r = analyse({ cells, task: 'trip', bootstrap: 30 });
    expect(Number.isFinite(r.bases[0].threshold.fraction)).toBe(true);
    expect(r.bases[0].threshold.fraction).toBeGreaterThan(0.16);
    expect(r.warnings.some((w) => /base 9.99: threshold .* outside the tested discounts/.test(w))).toBe(true);
  });

  it('a single base price: weber = free, no Weber slope, no tests, a warning', () => {
    const r = analyse({ cells: cellsFor(9.99, [11, 13, 16, 19]), task: 'pick', bootstrap: 50 });
    expect(r.bases).toHaveLength(1);
    expect(r.models.power.weberSlope).toBeNull();
    expect(r.models.power.weberSlopeCi).toBeNull();
    expect(r.tests.weberVsPower.p).toBeNull();
    expect(r.models.weber.logLik).toBeCloseTo(r.models.free.logLik, 6);
    expect(r.preferredModel).not.toBe('power');
    expect(r.warnings.join(' ')).toMatch(/single base price/);
  });

  it('spot: guess rate from catch trials, pooled when a base has fewer than 20', () => {
    const r = analyse({
      cells: good, task: 'spot', bootstrap: 40,
      catchCells: [{ basePrice: 9.99, n: 40, k: 4 }, { basePrice: 99, n: 10, k: 3 }],
    });
    expect(r.bases[0].guess).toBeCloseTo(0.1, 12);
    expect(r.bases[0].guessSource).toBe('own catch trials');
    expect(r.bases[1].guess).toBeCloseTo(7 / 50, 12);
    expect(r.bases[1].guessSource).toBe('pooled catch trials');
    expect(r.intervalMethod).toMatch(/guess rates redrawn/);
  });

  it('fixed guess and lapse are respected and lapse 0 reduces the free parameter count', () => {
    const r = analyse({ cells: good, task: 'spot', guess: 0.2, lapse: 0, bootstrap: 0 });
    expect(r.bases.every((b) => b.guess === 0.2 && b.lapse === 0)).toBe(true);
    expect(r.models.weber.k).toBe(2);
    expect(r.intervalMethod).toMatch(/none/);
    expect(r.bases[0].threshold.fractionCi).toBeNull();
  });
});

describe('overdispersion and target conversion', () => {
  // Respondents differ: each cell's rate jitters around the curve, so deviance/df ≫ 1.
  const rng = createRng('overdispersed');
  const cells = simulateCells({ alpha: () => Math.log(0.05), beta: 4, lapse: 0.02, guess: 0.5 }, [9.99, 99], geometricLadder(0.01, 0.3, 8), 400, rng)
    .cells.map((c) => ({ ...c, k: Math.min(c.n, Math.max(0, c.k + Math.round(rng.normal() * 30))) }));

  it('flags overdispersion, widens the interval by sqrt(deviance/df) and says so', () => {
    const r = analyse({ cells, task: 'pick', bootstrap: 200, seed: 4 });
    const b = r.bases[0];
    expect(b.deviance / b.devianceDf).toBeGreaterThan(1.5);
    expect(b.overdispersed).toBe(true);
    expect(r.intervalMethod).toMatch(/quasi-binomial factor sqrt\(deviance\/df\).*base 9.99/);
    expect(b.verdict).toBe('poor fit');
    // the widened interval contains the estimate and matches the factor on the log scale
    const f = Math.sqrt(b.deviance / b.devianceDf);
    const ci = b.threshold.fractionCi!, est = b.threshold.fraction;
    expect(ci[0]).toBeLessThan(est);
    expect(ci[1]).toBeGreaterThan(est);
    expect(f).toBeGreaterThan(Math.sqrt(1.5));
  });

  it('widen() moves each end away from the estimate by the factor (log scale for thresholds)', () => {
    const w = widen([0.04, 0.0625], 0.05, 2, true)!;
    expect(w[0]).toBeCloseTo(0.05 * (0.04 / 0.05) ** 2, 12);
    expect(w[1]).toBeCloseTo(0.05 * (0.0625 / 0.05) ** 2, 12);
    const lin = widen([0.7, 0.9], 0.8, 1.5, false)!;
    expect(lin[0]).toBeCloseTo(0.65, 12);
    expect(lin[1]).toBeCloseTo(0.95, 12);
    expect(widen([0.7, 0.9], 0.8, 1, false)).toEqual([0.7, 0.9]);
  });

  it('a target notice rate p maps to F = (p − γ)/(1 − γ − λ)', () => {
    const mid = analyse({ cells: good, task: 'pick', bootstrap: 0 });
    const p = 0.5 + 0.5 * (1 - 0.5 - mid.bases[0].lapse); // the mid-point as a notice rate
    const asRate = analyse({ cells: good, task: 'pick', bootstrap: 0, target: p });
    expect(asRate.targetMeaning).toBe('notice rate');
    expect(asRate.bases[0].threshold.fraction).toBeCloseTo(mid.bases[0].threshold.fraction, 8);
    const higher = analyse({ cells: good, task: 'pick', bootstrap: 0, target: 0.9 });
    expect(higher.bases[0].threshold.fraction).toBeGreaterThan(mid.bases[0].threshold.fraction);
  });
});

describe('reproducibility', () => {
  const data = simulateCells({ alpha: () => Math.log(0.05), beta: 4, lapse: 0.02, guess: 0.1 }, [9.99, 99], geometricLadder(0.01, 0.3, 6), 60, createRng('repro'), 40);
  it('the same seed gives the same report; another seed other intervals', () => {
    const a = analyse({ ...data, task: 'spot', bootstrap: 100, seed: 'abc' });
    const b = analyse({ ...data, task: 'spot', bootstrap: 100, seed: 'abc' });
    const c = analyse({ ...data, task: 'spot', bootstrap: 100, seed: 'abd' });
    expect(JSON.stringify(a)).toBe(JSON.stringify(b));
    expect(a.seed).toBe('abc');
    expect(c.bases[0].threshold.fractionCi).not.toEqual(a.bases[0].threshold.fractionCi);
    expect(c.bases[0].threshold.fraction).toBe(a.bases[0].threshold.fraction);
  });
  it('BCa is available, named, and brackets the estimate; Monte Carlo p-values lie in (0, 1]', () => {
    const r = analyse({ ...data, task: 'spot', bootstrap: 150, intervalMethod: 'bca', monteCarloP: true });
    expect(r.intervalMethod).toMatch(/BCa/);
    for (const b of r.bases) {
      expect(b.threshold.fractionCi![0]).toBeLessThan(b.threshold.fraction);
      expect(b.threshold.fractionCi![1]).toBeGreaterThan(b.threshold.fraction);
      expect(b.devianceMonteCarloP!).toBeGreaterThan(0);
      expect(b.devianceMonteCarloP!).toBeLessThanOrEqual(1);
    }
  });
});
