// Calibration: the model tests for data WITHOUT shopper ids (parametric bootstrap of the
// likelihood-ratio statistic under the nested model), spot task with catch trials in the
// likelihood, 3 base prices × 8 rungs × 40 trials + 30 catch trials per base, a true Weber law.
// Weber vs power and power vs free must each reject at most 7 % of the time at p < 0.05.
// Own simulation, no published source.
import { describe, it } from 'vitest';
import { analyse } from '@/lib/psychometrics/analyse';
import { createRng } from '@/lib/psychometrics/random';
import { geometricLadder, type Observer, simulateCells } from '@/lib/psychometrics/simulate';
import { count, expectFalseRejection, rate } from './support';

const STUDIES = 200;
const BASES = [2.49, 12.9, 49];
const LADDER = geometricLadder(0.01, 0.3, 8);
const observer: Observer = { alpha: () => Math.log(0.06), beta: 3, lapse: 0.02, guess: 0.1 };

describe('calibration: likelihood-ratio tests without shopper ids, spot task, Weber true', () => {
  it('true nested models are rejected at most 7 % of the time', { timeout: 600_000 }, () => {
    const rng = createRng('calibration-trial-tests');
    const weberVsPower = rate(), powerVsFree = rate();
    for (let s = 0; s < STUDIES; s++) {
      const data = simulateCells(observer, BASES, LADDER, 40, rng, 30);
      // 100 samples: the tests' own bootstrap under the nested model uses as many.
      const r = analyse({ ...data, task: 'spot', bootstrap: 100, seed: s });
      if (!/parametric bootstrap under the weber model/.test(r.tests.weberVsPower.method ?? '')) throw new Error(`unexpected method: ${r.tests.weberVsPower.method}`);
      count(weberVsPower, (r.tests.weberVsPower.p ?? 1) < 0.05);
      count(powerVsFree, (r.tests.powerVsFree.p ?? 1) < 0.05);
    }
    expectFalseRejection('no ids, Weber true: weber vs power', weberVsPower);
    expectFalseRejection('no ids, Weber true: power vs free', powerVsFree);
  });
});
