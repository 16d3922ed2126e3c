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
      // a number inside the tested rungs, or a bound naming a rung — never a made-up number
      expect(b.threshold.fraction === null ? b.threshold.bound !== null : Number.isFinite(b.threshold.fraction)).toBe(true);
      expect(b.slope).toBeLessThanOrEqual(100);
    }
    expect(r.warnings.some((w) => /base 9.99: slope at or near its upper bound/.test(w))).toBe(true);
  });

  it('a base where nobody notices anything reports "above the deepest rung", no number, and a warning', () => {
    const cells = [...cellsFor(9.99, [0, 0, 0, 0]), ...cellsFor(99, [2, 6, 12, 18])];
    const r = analyse({ cells, task: 'trip', bootstrap: 30 });
    expect(r.bases[0].threshold.fraction).toBeNull();
    expect(r.bases[0].threshold.amount).toBeNull();
    expect(r.bases[0].threshold.bound).toEqual({ kind: 'above', fraction: 0.16 });
    expect(r.warnings.some((w) => /base 9.99: the threshold lies above the deepest rung tested \(> 16\.0 %/.test(w))).toBe(true);
    // the same in the free model's thresholds; the model's α stays for the promotion floors
    const free = r.models.free.thresholds[0];
    expect(free.fraction).toBeNull();
    expect(free.bound?.kind).toBe('above');
    expect(Number.isFinite(free.alpha)).toBe(true);
    // the other base is measured
    expect(r.bases[1].threshold.fraction).toBeGreaterThan(0.02);
    expect(r.bases[1].threshold.bound).toBeNull();
  });

  it('everybody noticing even the shallowest rung reports "below the shallowest rung"', () => {
    const cells = [...cellsFor(9.99, [20, 20, 20, 20]), ...cellsFor(99, [2, 6, 12, 18])];
    const r = analyse({ cells, task: 'trip', bootstrap: 0 });
    expect(r.bases[0].threshold.fraction).toBeNull();
    expect(r.bases[0].threshold.bound).toEqual({ kind: 'below', fraction: 0.02 });
  });

  it('a lapse rate on its bound names the base and points to the respondent exclusions', () => {
    // 12 % of answers at the deepest rungs are misses (true lapse above the 6 % bound)
    const cells = [...cellsFor(9.99, [1, 10, 35, 35], 40), ...cellsFor(99, [1, 9, 36, 35], 40)];
    const r = analyse({ cells, task: 'trip', bootstrap: 0 });
    expect(r.bases[0].lapse).toBeCloseTo(0.06, 6);
    expect(r.warnings.some((w) => /base 9.99: lapse rate at its upper bound .*check the respondent exclusions/.test(w))).toBe(true);
  });

  it('too few trials for a calibrated interval: no interval, and how many more are needed', () => {
    const cells = [...cellsFor(9.99, [1, 2, 5, 7], 8), ...cellsFor(99, [8, 24, 48, 72], 80)];
    const r = analyse({ cells, task: 'trip', bootstrap: 50 });
    expect(r.bases[0].nTrials).toBe(32);
    expect(r.bases[0].threshold.fractionCi).toBeNull();
    expect(r.warnings.some((w) => /base 9.99: too few trials for a reliable interval \(32; without shopper ids intervals are calibrated from about 300 trials per base price, so 268 more are needed\)/.test(w))).toBe(true);
    expect(r.bases[1].threshold.fractionCi).not.toBeNull();
    // the model tests say so too rather than give an uncalibrated p
    expect(r.tests.weberVsPower.p).toBeNull();
    expect(r.tests.weberVsPower.method).toMatch(/too few trials for a calibrated test without shopper ids \(32 at the smallest base/);
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

  it('spot: γ fitted with the catch trials in the likelihood, shared by bases with fewer than 20', () => {
    const third = cellsFor(199, [9, 12, 15, 19]);
    const r = analyse({
      cells: [...good, ...third], task: 'spot', bootstrap: 60,
      catchCells: [{ basePrice: 9.99, n: 40, k: 4 }, { basePrice: 99, n: 10, k: 3 }, { basePrice: 199, n: 12, k: 2 }],
    });
    expect(r.bases.map((b) => b.guessSource)).toEqual(['own catch trials', 'pooled catch trials', 'pooled catch trials']);
    // 99 and 199 share their catch trials (each base's own fit also sees its own test trials)
    expect(Math.abs(r.bases[1].guess - r.bases[2].guess)).toBeLessThan(0.02);
    // γ is a parameter: near the catch rate, moved by the test trials, with an interval
    expect(Math.abs(r.bases[0].guess - 0.1)).toBeLessThan(0.06);
    for (const b of r.bases) {
      expect(b.guessCi![0]).toBeLessThanOrEqual(b.guess);
      expect(b.guessCi![1]).toBeGreaterThanOrEqual(b.guess);
    }
    expect(r.intervalMethod).toMatch(/guess rates fitted with the catch trials in every refit/);
    // the joint models carry γ too: the Weber model has θ, ln β, λ and two γs
    expect(r.models.weber.k).toBe(5);
  });

  it('spot: with too few catch trials at every other base, every base shares one γ', () => {
    const r = analyse({
      cells: good, task: 'spot', bootstrap: 0,
      catchCells: [{ basePrice: 9.99, n: 40, k: 4 }, { basePrice: 99, n: 10, k: 3 }],
    });
    expect(r.bases.map((b) => b.guessSource)).toEqual(['pooled catch trials', 'pooled catch trials']);
    expect(r.warnings.join(' ')).toMatch(/fewer than 20 catch trials at base 99: guess rate shared by base 9.99, 99/);
  });

  it('spot: a base with no false alarms still shows uncertainty in γ (respondent bootstrap)', () => {
    const shopperCells = Array.from({ length: 30 }, (_, s) => [
      ...rungs.map((discount, i) => ({ respondent: `s${s}`, basePrice: 9.99, discount, n: 2, k: (s + i) % 3 === 0 ? 0 : Math.min(2, i) })),
      { respondent: `s${s}`, basePrice: 9.99, discount: 0, n: 2, k: 0 },
    ]).flat();
    const r = analyse({ shopperCells, task: 'spot', bootstrap: 200, seed: 5 });
    expect(r.unit).toBe('shopper');
    const b = r.bases[0];
    expect(b.guess).toBeGreaterThan(0);
    expect(b.guessCi![1]).toBeGreaterThan(b.guessCi![0]);
    expect(b.guessCi![1]).toBeGreaterThan(0.01);
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

  it('flags overdispersion from the Monte-Carlo deviance p-value, widens (no ids) by sqrt(deviance/df) and says so', () => {
    const r = analyse({ cells, task: 'pick', bootstrap: 200, seed: 4 });
    const b = r.bases[0];
    expect(b.deviance / b.devianceDf).toBeGreaterThan(1.5);
    expect(b.devianceMonteCarloP!).toBeLessThan(0.05);
    expect(b.overdispersed).toBe(true);
    expect(r.intervalMethod).toMatch(/quasi-binomial factor sqrt\(deviance\/df\).*Monte-Carlo deviance test.*base 9.99/);
    expect(b.verdict).toBe('poor fit');
    // the widened interval contains the estimate and matches the factor on the log scale
    const f = Math.sqrt(b.deviance / b.devianceDf);
    const ci = b.threshold.fractionCi!, est = b.threshold.fraction!;
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
    expect(asRate.bases[0].threshold.fraction!).toBeCloseTo(mid.bases[0].threshold.fraction!, 8);
    const higher = analyse({ cells: good, task: 'pick', bootstrap: 0, target: 0.9 });
    expect(higher.bases[0].threshold.fraction!).toBeGreaterThan(mid.bases[0].threshold.fraction!);
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
      expect(b.threshold.fractionCi![0]).toBeLessThan(b.threshold.fraction!);
      expect(b.threshold.fractionCi![1]).toBeGreaterThan(b.threshold.fraction!);
      expect(b.devianceMonteCarloP!).toBeGreaterThan(0);
      expect(b.devianceMonteCarloP!).toBeLessThanOrEqual(1);
    }
  });
});
