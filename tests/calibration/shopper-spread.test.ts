// Calibration of σ's 95 % interval (the profile likelihood of the mixed model, mixed.ts; the
// GLMM for psychometric functions of Moscatelli, Mezzetti & Lacquaniti 2012) and recovery of σ:
// seeded simulated studies with a known spread, own simulation, no published source.
// Prints each figure with its binomial standard error; fails when coverage drops below the
// bound. Kept small (40 shoppers × 36 pick trials, one model per study) so the tier stays fast.
import { describe, expect, it } from 'vitest';
import { prepare } from '@/lib/psychometrics/prepare';
import { createRng } from '@/lib/psychometrics/random';
import { fitSpread, fixedJointFits } from '@/lib/psychometrics/shopper-spread';
import { poolShopperCells, shopperCounts } from '@/lib/psychometrics/shoppers';
import { geometricLadder } from '@/lib/psychometrics/simulate';
import { simulateShoppers } from '@/lib/psychometrics/simulate-shoppers';

const LADDER = geometricLadder(0.02, 0.3, 6);
const observer = { alpha: () => Math.log(0.08), beta: 4, lapse: 0.02, guess: 0.5 };

function coverage(sigmaTrue: number, studies: number) {
  let covered = 0, sum = 0, missing = 0;
  for (let i = 0; i < studies; i++) {
    const rows = simulateShoppers(observer, sigmaTrue, { basePrices: [2.49, 12.9], rungs: LADDER, repetitions: 3, shoppers: 40 }, createRng(`sigma-cal-${sigmaTrue}-${i}`));
    const prep = prepare(poolShopperCells(rows).cells, [], 'pick');
    const sf = fitSpread(prep, shopperCounts(prep, rows), fixedJointFits(prep), 'weber');
    const ci = sf.profile.ci;
    if (!ci) missing++;
    else if (ci[0] <= sigmaTrue && sigmaTrue <= ci[1]) covered++;
    sum += sf.fit.params[sf.problem.iSigma];
  }
  const rate = covered / studies;
  const se = Math.sqrt((rate * (1 - rate)) / studies);
  return { rate, se, meanSigma: sum / studies, missing };
}

describe('calibration: σ of the mixed model (own simulation, no published source)', () => {
  it('true σ = 0.5: the 95 % profile interval covers about 95 % of 100 studies, σ about unbiased', () => {
    const r = coverage(0.5, 100);
    console.log(`calibration σ=0.5: coverage ${(100 * r.rate).toFixed(1)} % ± ${(100 * r.se).toFixed(1)} (binomial SE), mean σ̂ ${r.meanSigma.toFixed(3)}, intervals not found ${r.missing}`);
    expect(r.missing).toBe(0);
    expect(r.rate).toBeGreaterThanOrEqual(0.9);
    expect(Math.abs(r.meanSigma - 0.5)).toBeLessThan(0.06);
  }, 600_000);

  it('true σ = 0: σ̂ near 0 and the interval includes 0 about 95 % of the time (60 studies)', () => {
    const r = coverage(0, 60);
    console.log(`calibration σ=0: coverage ${(100 * r.rate).toFixed(1)} % ± ${(100 * r.se).toFixed(1)} (binomial SE), mean σ̂ ${r.meanSigma.toFixed(3)}, intervals not found ${r.missing}`);
    expect(r.missing).toBe(0);
    expect(r.rate).toBeGreaterThanOrEqual(0.9);
    expect(r.meanSigma).toBeLessThan(0.12);
  }, 600_000);
});
