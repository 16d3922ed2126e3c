// Calibration (c): spot task with catch trials in the likelihood, 40 shoppers (SD 0.3 in ln
// threshold) × 3 base prices × 8 rungs × 3 repetitions + 4 catch trials per base, guess rate
// 10 %, a true constant-amount law (0.06 × 12.90 in money at every base). The respondent-level
// bootstrap must cover each base's threshold and the guess rate ~95 % of the time, and the
// constant-amount-vs-power test must reject the true constant amount at most 7 % of the time.
// Own simulation, no published source.
import { describe, it } from 'vitest';
import { analyse } from '@/lib/psychometrics/analyse';
import { createRng } from '@/lib/psychometrics/random';
import { geometricLadder, type Observer, simulateShopperCells } from '@/lib/psychometrics/simulate';
import { count, covers, expectCoverage, expectFalseRejection, rate } from './support';

const STUDIES = 200;
const BASES = [2.49, 12.9, 49];
const LADDER = geometricLadder(0.005, 0.6, 8);
const GUESS = 0.1;
const observer: Observer = { alpha: (b) => Math.log(0.06) - Math.log(b / 12.9), beta: 3, lapse: 0.02, guess: GUESS };

describe('calibration (c): spot task, guess rate from catch trials, constant amount true', () => {
  it('95 % intervals cover thresholds and the guess rate; constant amount is rarely rejected', { timeout: 600_000 }, () => {
    const rng = createRng('calibration-c');
    const perBase = rate(), guess = rate(), constantVsPower = rate();
    for (let s = 0; s < STUDIES; s++) {
      const shopperCells = simulateShopperCells(observer, BASES, LADDER, { shoppers: 40, repetitions: 3, sigma: 0.3, catchPerBase: 4 }, rng);
      // the mixed model is calibrated in shopper-spread.test.ts and share-of-shoppers.test.ts; skipped here
      const r = analyse({ shopperCells, task: 'spot', bootstrap: 200, seed: s, spread: false });
      const j = s % BASES.length;
      count(perBase, covers(r.bases[j].threshold.fractionCi, Math.exp(observer.alpha(BASES[j]))));
      count(guess, covers(r.bases[j].guessCi, GUESS));
      count(constantVsPower, (r.tests.constantVsPower?.p ?? 1) < 0.05);
    }
    expectCoverage('spot with catch trials, per base threshold', perBase);
    expectCoverage('spot with catch trials, guess rate', guess);
    expectFalseRejection('spot, constant amount true: constant vs power', constantVsPower);
  });
});
