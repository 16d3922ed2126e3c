import { describe, expect, it } from 'vitest';
import { analyse } from '@/lib/psychometrics/analyse';
import { createRng } from '@/lib/psychometrics/random';
import { geometricLadder, type Observer, simulateCells } from '@/lib/psychometrics/simulate';

const BASES = [2.49, 9.99, 49, 199];
const LADDER = geometricLadder(0.01, 0.25, 8);

describe('recovery of a known Weber fraction', () => {
  // 5 % Weber fraction: common practice, no source (a rule of thumb for lifted weights).
  const weber: Observer = { alpha: () => Math.log(0.05), beta: 4, lapse: 0.02, guess: 0.5 };
  const data = simulateCells(weber, BASES, LADDER, 120, createRng('weber-5'));
  const report = analyse({ ...data, task: 'pick', bootstrap: 300, seed: 11 });

  it('the weber model interval covers 0.05 and the estimate is close', () => {
    const ci = report.models.weber.weberFractionCi!;
    expect(ci[0]).toBeLessThan(0.05);
    expect(ci[1]).toBeGreaterThan(0.05);
    expect(Math.abs(report.models.weber.weberFraction - 0.05)).toBeLessThan(0.005);
  });

  it('every base interval covers 0.05 and the amounts are fraction × base price', () => {
    for (const b of report.bases) {
      expect(b.threshold.fractionCi![0]).toBeLessThan(0.05);
      expect(b.threshold.fractionCi![1]).toBeGreaterThan(0.05);
      expect(b.threshold.amount!).toBeCloseTo(b.threshold.fraction! * b.basePrice, 10);
      expect(b.guess).toBe(0.5);
    }
  });

  it('model comparison prefers weber and the Weber slope interval covers 1', () => {
    expect(report.preferredModel).toBe('weber');
    const ci = report.models.power.weberSlopeCi!;
    expect(ci[0]).toBeLessThan(1);
    expect(ci[1]).toBeGreaterThan(1);
    expect(report.tests.weberVsPower.df).toBe(1);
    expect(report.tests.powerVsFree.df).toBe(BASES.length - 2);
    expect(report.tests.weberVsPower.p!).toBeGreaterThan(0.01);
  });

  it('AIC = 2k − 2 logLik and k counts the parameters of each model', () => {
    const m = report.models;
    expect(m.free.k).toBe(BASES.length + 2);
    expect(m.weber.k).toBe(3);
    expect(m.constantAmount.k).toBe(3);
    expect(m.power.k).toBe(4);
    for (const r of [m.free, m.weber, m.constantAmount, m.power]) expect(r.aic).toBeCloseTo(2 * r.k - 2 * r.logLik, 8);
    // nested models: a bigger model never fits worse
    expect(m.free.logLik).toBeGreaterThanOrEqual(m.power.logLik - 1e-6);
    expect(m.power.logLik).toBeGreaterThanOrEqual(m.weber.logLik - 1e-6);
  });
});

describe('model comparison on square-root data', () => {
  // Simulated observer whose threshold in money grows with sqrt(B): Weber slope 0.5.
  const sqrtObs: Observer = { alpha: (b) => Math.log(0.05) - 0.5 * Math.log(b / 10), beta: 4, lapse: 0.02, guess: 0 };
  const data = simulateCells(sqrtObs, [2, 10, 50, 250, 1000], geometricLadder(0.002, 0.5, 10), 150, createRng('sqrt'));
  const report = analyse({ ...data, task: 'trip', bootstrap: 200, seed: 3 });

  it('picks power with a Weber slope near 0.5 whose interval excludes 0 and 1', () => {
    expect(report.preferredModel).toBe('power');
    const b = report.models.power.weberSlope!;
    expect(Math.abs(b - 0.5)).toBeLessThan(0.08);
    const ci = report.models.power.weberSlopeCi!;
    expect(ci[0]).toBeGreaterThan(0);
    expect(ci[1]).toBeLessThan(1);
    // a parametric-bootstrap p-value with 200 samples bottoms out at 1/201
    expect(report.tests.weberVsPower.p!).toBeLessThanOrEqual(1 / 201 + 1e-12);
    expect(report.tests.weberVsPower.method).toMatch(/parametric bootstrap under the weber model/);
  });
});

describe('lapse rate 0.02 (Wichmann & Hill 2001, Perception & Psychophysics 63(8), 1293–1313 and 1314–1329)', () => {
  // Lapse bounded to [0, 0.06] (Wichmann & Hill 2001, from memory).
  const obs: Observer = { alpha: () => Math.log(0.06), beta: 3, lapse: 0.02, guess: 0.5 };
  const ladder = geometricLadder(0.01, 0.5, 7);

  it('the lapse estimate stays inside [0, 0.06] and is near 0.02 with many trials', () => {
    const data = simulateCells(obs, [9.99], ladder, 4000, createRng('lapse-big'));
    const r = analyse({ ...data, task: 'pick', bootstrap: 0 });
    expect(r.bases[0].lapse).toBeGreaterThanOrEqual(0);
    expect(r.bases[0].lapse).toBeLessThanOrEqual(0.06);
    expect(Math.abs(r.bases[0].lapse - 0.02)).toBeLessThan(0.01);
    expect(Math.abs(Math.log(r.bases[0].threshold.fraction! / 0.06))).toBeLessThan(0.05);
  });

  // 44 × 7 rungs = 308 trials: above the 300 per base that intervals without shopper ids need.
  for (const trials of [44, 160]) {
    // Every bootstrap sample now refits γ, λ, the base and all four joint models: more work per run.
    it(`95 % intervals cover the true threshold in about 95 % of runs (${trials} trials per cell)`, { timeout: 60_000 }, () => {
      const rng = createRng(`coverage-${trials}`);
      const runs = 40;
      let covered = 0;
      for (let r = 0; r < runs; r++) {
        const data = simulateCells(obs, [9.99], ladder, trials, rng);
        const ci = analyse({ ...data, task: 'pick', bootstrap: 150, seed: r }).bases[0].threshold.fractionCi!;
        if (ci[0] <= 0.06 && 0.06 <= ci[1]) covered++;
      }
      // Binomial(40, 0.95) is ≥ 33 with probability > 0.99: a broken interval falls below.
      expect(covered).toBeGreaterThanOrEqual(33);
    });
  }
});
