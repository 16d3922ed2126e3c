// Calibration of the share-of-shoppers intervals (issue 12, points 2 and 9): per base, the
// discounts that 50 %, 75 % and 90 % of shoppers notice (shopper-spread.ts: the mixed model's
// typical threshold × exp(σ·Φ⁻¹(q)), delta-method interval on the ln scale with the
// small-sample critical value √(S/(S − 1))·t(S − 1)). Shoppers who differ (σ = 0.5 in ln
// threshold), 40 shoppers × 3 base prices × 8 rungs × 3 repetitions, Weber true (8 % at every
// base); the pick task, and the spot task with a guess rate of 10 % measured by 10 catch
// trials per base and shopper (γ fitted in the mixed likelihood). 200 studies each, one base
// per study in turn, so the studies are independent. Own simulation, no published source.
import { describe, it } from 'vitest';
import { prepare } from '@/lib/psychometrics/prepare';
import { createRng } from '@/lib/psychometrics/random';
import { fixedJointFits, reportShopperSpread } from '@/lib/psychometrics/shopper-spread';
import { poolShopperCells, shopperCounts } from '@/lib/psychometrics/shoppers';
import { geometricLadder } from '@/lib/psychometrics/simulate';
import { simulateShoppers } from '@/lib/psychometrics/simulate-shoppers';
import type { Task } from '@/lib/psychometrics/types';
import { count, covers, expectCoverage, rate } from './support';

const STUDIES = 200;
const SHOPPERS = 40;
const SIGMA = 0.5;
const BASES = [2.49, 12.9, 49];
const LADDER = geometricLadder(0.01, 0.5, 8);
const ALPHA = Math.log(0.08);
/** Φ⁻¹(0.5), Φ⁻¹(0.75), Φ⁻¹(0.9). */
const Z = [0, 0.6744897501960817, 1.2815515655446004];

function calibrate(task: Task, guess: number, catchPerBase: number) {
  const observer = { alpha: () => ALPHA, beta: 4, lapse: 0.02, guess };
  const shares = Z.map(() => rate());
  for (let i = 0; i < STUDIES; i++) {
    const rows = simulateShoppers(observer, SIGMA, { basePrices: BASES, rungs: LADDER, repetitions: 3, shoppers: SHOPPERS, catchPerBase }, createRng(`share-${task}-${i}`));
    const { cells, catchCells } = poolShopperCells(rows);
    const prep = prepare(cells, catchCells, task);
    // the true model, its shares only (no free model, no σ interval: they do not enter these intervals)
    const sp = reportShopperSpread(prep, shopperCounts(prep, rows), 'weber', { joint: fixedJointFits(prep), free: false, sigmaInterval: false })!;
    const base = sp.bases[i % BASES.length];
    // the truth at F = 0.5 (the report's default target): exp(α + σ·Φ⁻¹(q))
    base.shares.forEach((s, q) => count(shares[q], covers(s.fractionCi, Math.exp(ALPHA + SIGMA * Z[q]))));
  }
  return shares;
}

describe('calibration: discounts that 50 / 75 / 90 % of shoppers notice (σ = 0.5, 40 shoppers)', () => {
  it('pick task: each share’s 95 % interval covers the truth in at least 92 % of 200 studies', { timeout: 600_000 }, () => {
    const [s50, s75, s90] = calibrate('pick', 0.5, 0);
    expectCoverage('pick, discount 50 % of shoppers notice', s50);
    expectCoverage('pick, discount 75 % of shoppers notice', s75);
    expectCoverage('pick, discount 90 % of shoppers notice', s90);
  });

  it('spot task with catch trials (γ fitted in the mixed model): the same', { timeout: 600_000 }, () => {
    const [s50, s75, s90] = calibrate('spot', 0.1, 10);
    expectCoverage('spot with catch trials, discount 50 % of shoppers notice', s50);
    expectCoverage('spot with catch trials, discount 75 % of shoppers notice', s75);
    expectCoverage('spot with catch trials, discount 90 % of shoppers notice', s90);
  });
});
