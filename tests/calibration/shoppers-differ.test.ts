// Calibration (a): shoppers whose own thresholds spread (SD 0.5 in ln threshold), pick task,
// 40 shoppers × 72 trials (3 base prices × 8 rungs × 3 repetitions), a true Weber law at 6 %.
// The respondent-level bootstrap (200 samples) must cover the truth ~95 % of the time — per
// base and for the Weber fraction — and the shopper-level tests must reject the true Weber
// law (and the true power model against free) at most 7 % of the time at p < 0.05.
// Truth of the pooled fit: with a normal spread symmetric about α, the population curve's
// mid-point is the typical shopper's (E F(β(α − α − u)) = ½), so the mid-point threshold
// estimated from the pooled data is e^α. Own simulation, no published source.
import { describe, it } from 'vitest';
import { analyse } from '@/lib/psychometrics/analyse';
import { createRng } from '@/lib/psychometrics/random';
import { geometricLadder, type Observer, simulateShopperCells } from '@/lib/psychometrics/simulate';
import { count, covers, expectCoverage, expectFalseRejection, rate } from './support';

const STUDIES = 200;
const BASES = [2.49, 12.9, 49];
const LADDER = geometricLadder(0.01, 0.3, 8);
const TRUE_FRACTION = 0.06;
const observer: Observer = { alpha: () => Math.log(TRUE_FRACTION), beta: 3, lapse: 0.02, guess: 0.5 };

describe('calibration (a): 40 shoppers who differ (SD 0.5 in ln threshold), pick task, Weber true', () => {
  it('95 % intervals cover, true nested models are rarely rejected', { timeout: 600_000 }, () => {
    const rng = createRng('calibration-a');
    const perBase = rate(), weber = rate(), weberVsPower = rate(), powerVsFree = rate();
    for (let s = 0; s < STUDIES; s++) {
      const shopperCells = simulateShopperCells(observer, BASES, LADDER, { shoppers: 40, repetitions: 3, sigma: 0.5 }, rng);
      // the mixed model is calibrated in shopper-spread.test.ts and share-of-shoppers.test.ts; skipped here
      const r = analyse({ shopperCells, task: 'pick', bootstrap: 200, seed: s, spread: false });
      if (r.unit !== 'shopper') throw new Error('expected the shopper to be the unit');
      // one base per study (rotating) keeps the per-base figure a count of independent studies
      count(perBase, covers(r.bases[s % BASES.length].threshold.fractionCi, TRUE_FRACTION));
      count(weber, covers(r.models.weber.weberFractionCi, TRUE_FRACTION));
      count(weberVsPower, (r.tests.weberVsPower.p ?? 1) < 0.05);
      count(powerVsFree, (r.tests.powerVsFree.p ?? 1) < 0.05);
    }
    expectCoverage('shoppers differ, per base threshold', perBase);
    expectCoverage('shoppers differ, Weber fraction', weber);
    expectFalseRejection('shoppers differ, Weber true: weber vs power', weberVsPower);
    expectFalseRejection('shoppers differ, Weber true: power vs free', powerVsFree);
  });
});
