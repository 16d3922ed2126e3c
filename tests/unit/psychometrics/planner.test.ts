import { describe, expect, it } from 'vitest';
import { fitDesign, lapseOf } from '@/lib/psychometrics/fit-core';
import { quantileSorted } from '@/lib/psychometrics/math';
import { baseDesign, packStart, startForBase } from '@/lib/psychometrics/models';
import { assumedObserver, DEFAULT_SIGMA, planDesign, respondentsForWidth } from '@/lib/psychometrics/planner';
import { prepare } from '@/lib/psychometrics/prepare';
import { createRng } from '@/lib/psychometrics/random';
import { poolShopperCells } from '@/lib/psychometrics/shoppers';
import { simulateShoppers } from '@/lib/psychometrics/simulate-shoppers';
import { targetF, thresholdFraction } from '@/lib/psychometrics/target';
import type { CatchCell, Cell, ShopperCell, Task } from '@/lib/psychometrics/types';

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
  }, 60_000);

  it('respondentsForWidth finds a count that meets the width and one fewer that does not', () => {
    const [first] = respondentsForWidth({ ...design, simulations: 40, targetWidth: 0.02, maxRespondents: 400 });
    expect(first.respondents).not.toBeNull();
    const r = first.respondents!;
    expect(planDesign({ ...design, simulations: 40, respondents: r }).bases[0].expectedWidth).toBeLessThanOrEqual(0.02);
    expect(planDesign({ ...design, simulations: 40, respondents: r - 1 }).bases[0].expectedWidth).toBeGreaterThan(0.02);
  }, 120_000);

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

// Predicted against realised: the widths the planner predicts must match what the analysis of
// such a study then reports. The realised width here comes from a respondent-level bootstrap
// (whole shoppers resampled with replacement, the guess rate re-estimated from the resampled
// catch trials, each base refitted with the engine's fitter), kept small and self-contained.
// Simulated truths: own simulation, no published source.
describe('planner: predicted widths against a simulation of the analysis', () => {
  function baseThresholds(cells: Cell[], catchCells: CatchCell[], task: Task): number[] {
    const prep = prepare(cells, catchCells, task);
    return prep.bases.map((_, j) => {
      const d = baseDesign(prep, j);
      const st = startForBase(prep, j, 0.01);
      const fit = fitDesign(d, prep.k.slice(prep.baseStart[j], prep.baseEnd[j]), packStart(d, [st.alpha], st.logBeta, 0.01), { stepTol: 1e-6 });
      return thresholdFraction(fit.params[0], Math.exp(fit.params[1]), targetF(undefined, prep.guess[j], lapseOf(d, fit.params)));
    });
  }

  /** Mean width of the 95 % percentile interval of a respondent-level bootstrap, per base. */
  function realisedWidths(plan: typeof spot, studies: number, resamples: number): number[] {
    const rng = createRng('realised');
    const o = { alpha: () => Math.log(plan.weberFraction), beta: plan.beta, lapse: plan.lapse, guess: plan.guess };
    const J = plan.basePrices.length;
    const sums = new Array(J).fill(0);
    for (let m = 0; m < studies; m++) {
      const rows = simulateShoppers(o, plan.sigma, { basePrices: plan.basePrices, rungs: plan.rungs, repetitions: plan.repetitions, shoppers: plan.respondents, catchPerBase: plan.catchPerBase }, rng);
      const byShopper = new Map<string, ShopperCell[]>();
      for (const r of rows) byShopper.set(r.respondent, [...(byShopper.get(r.respondent) ?? []), r]);
      const shoppers = [...byShopper.values()];
      const th = Array.from({ length: J }, () => new Float64Array(resamples));
      for (let b = 0; b < resamples; b++) {
        const drawn: ShopperCell[] = [];
        for (let s = 0; s < shoppers.length; s++) drawn.push(...shoppers[rng.int(shoppers.length)]);
        const { cells, catchCells } = poolShopperCells(drawn);
        baseThresholds(cells, catchCells, plan.task).forEach((t, j) => { th[j][b] = t; });
      }
      th.forEach((v, j) => {
        v.sort();
        sums[j] += quantileSorted(v, 0.975) - quantileSorted(v, 0.025);
      });
    }
    return sums.map((s) => s / studies);
  }

  const spot = {
    basePrices: [2.49, 24.9], rungs: [0.02, 0.04, 0.07, 0.12, 0.2, 0.3], repetitions: 2, respondents: 40, task: 'spot' as Task,
    weberFraction: 0.08, beta: 4, lapse: 0.02, guess: 0.1, sigma: 0.5, catchPerBase: 4,
  };

  it('spot task, shoppers who differ (σ 0.5), guess rate from catch trials: predicted within 15 % of realised', () => {
    const predicted = planDesign({ ...spot, simulations: 400, seed: 'predict' });
    expect(predicted.sigma).toBe(0.5);
    const realised = realisedWidths(spot, 40, 200);
    predicted.bases.forEach((b, j) => {
      const ratio = b.expectedWidth / realised[j];
      console.log(`planner calibration (spot, σ 0.5) base ${b.basePrice}: predicted ${b.expectedWidth.toFixed(4)}, realised ${realised[j].toFixed(4)}, ratio ${ratio.toFixed(3)}`);
      expect(ratio).toBeGreaterThan(0.85);
      expect(ratio).toBeLessThan(1.15);
    });
  }, 600_000);

  it('the spread and the catch trials are what makes the width: leaving them out predicts narrower intervals', () => {
    // one catch trial per base per shopper: γ is then known to about ±0.05, which shows in the width
    const withBoth = planDesign({ ...spot, catchPerBase: 1, simulations: 300, seed: 'parts' });
    const noSpread = planDesign({ ...spot, catchPerBase: 1, sigma: 0, simulations: 300, seed: 'parts' });
    const knownGuess = planDesign({ ...spot, catchPerBase: 0, simulations: 300, seed: 'parts' });
    withBoth.bases.forEach((b, j) => {
      expect(noSpread.bases[j].expectedWidth).toBeLessThan(b.expectedWidth);
      expect(knownGuess.bases[j].expectedWidth).toBeLessThan(b.expectedWidth);
    });
    expect(planDesign({ ...spot, simulations: 20, seed: 'x', sigma: undefined }).sigma).toBe(DEFAULT_SIGMA);
    expect(() => planDesign({ ...spot, simulations: 20, seed: 'x', sigma: -1 })).toThrow(/sigma/);
  }, 120_000);
});
