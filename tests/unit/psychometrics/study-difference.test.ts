// The difference test between two studies of the same category (lib/psychometrics/study-difference.ts)
// on simulated shoppers whose own thresholds spread (own simulation, no published source): with
// the same truth in both studies it rejects at p < 0.05 about 5 % of the time (at most 9 % with
// 120 pairs: 5 % plus two binomial SEs), and with a true 60 % difference in the threshold it
// rejects most of the time (30 shoppers per study; a 35 % difference is found about 4 times in 10).
// The same fits check that the record's 95 % interval of a threshold at a price covers the truth. Each study is fitted by the engine itself (analyse, shopper bootstrap).
import { describe, expect, it } from 'vitest';
import { analyse } from '@/lib/psychometrics/analyse';
import { createRng } from '@/lib/psychometrics/random';
import { geometricLadder, type Observer, simulateShopperCells } from '@/lib/psychometrics/simulate';
import { compareStudies, powerLineOf, thresholdAtPrice, welch } from '@/lib/psychometrics/study-difference';

const BASES = [2.49, 12.9, 49];
const LADDER = geometricLadder(0.01, 0.4, 8);
const PRICE = 12.9;

function observer(fraction: number, slope: number): Observer {
  // ln amount = ln(fraction·12.9) + slope·ln(B/12.9)  →  α(B) = ln fraction + (slope − 1)·ln(B/12.9)
  return { alpha: (b) => Math.log(fraction) + (slope - 1) * Math.log(b / 12.9), beta: 3, lapse: 0.02, guess: 0.5 };
}

function fitLine(o: Observer, seed: string, prefix: string) {
  const rng = createRng(seed);
  const shopperCells = simulateShopperCells(o, BASES, LADDER, { shoppers: 30, repetitions: 2, sigma: 0.4, idPrefix: prefix }, rng);
  const line = powerLineOf(analyse({ shopperCells, task: 'pick', bootstrap: 150, seed, spread: false }));
  if (!line) throw new Error('expected a power line with bootstrap draws');
  return line;
}

function rejectionRate(a: Observer, b: Observer, pairs: number, tag: string) {
  let threshold = 0, slope = 0, n = 0, covered = 0, lines = 0;
  const truth = (o: Observer) => Math.exp(o.alpha(PRICE)) * PRICE;
  for (let i = 0; i < pairs; i++) {
    const la = fitLine(a, `${tag}-a-${i}`, 'a'), lb = fitLine(b, `${tag}-b-${i}`, 'b');
    for (const [line, o] of [[la, a], [lb, b]] as const) {
      const ci = thresholdAtPrice(line, PRICE).amountCi;
      lines++;
      if (ci && ci[0] <= truth(o) && truth(o) <= ci[1]) covered++;
    }
    const d = compareStudies(la, lb, PRICE);
    if (d.thresholdP === null || d.slopeP === null) continue;
    n++;
    if (d.thresholdP < 0.05) threshold++;
    if (d.slopeP < 0.05) slope++;
  }
  console.log(`[study difference] ${tag}: threshold test rejects ${(threshold / n).toFixed(3)}, slope test ${(slope / n).toFixed(3)} (${n} pairs); 95 % interval of the threshold at ${PRICE} covers the truth in ${(covered / lines).toFixed(3)} of ${lines} fits (own simulation, no published source)`);
  return { threshold: threshold / n, slope: slope / n, n, coverage: covered / lines };
}

describe('difference test between two studies (shopper level)', () => {
  it('rejects a true "no difference" about 5 % of the time (false rejection ≤ 9 % over 120 pairs)', { timeout: 600_000 }, () => {
    const same = observer(0.06, 0.8);
    const r = rejectionRate(same, same, 120, 'null');
    expect(r.n).toBeGreaterThanOrEqual(115);
    expect(r.threshold).toBeLessThanOrEqual(0.09);
    expect(r.slope).toBeLessThanOrEqual(0.09);
    // the threshold-at-a-price interval the record shows covers the truth (pooled mid-point = e^α, see tests/calibration/shoppers-differ.test.ts)
    expect(r.coverage).toBeGreaterThanOrEqual(0.92);
    // not a test that never rejects: the level is used
    expect(r.threshold + r.slope).toBeGreaterThan(0);
  });

  it('finds a threshold 60 % higher in one study most of the time (power ≥ 70 % over 40 pairs)', { timeout: 600_000 }, () => {
    const r = rejectionRate(observer(0.06 * 1.6, 0.8), observer(0.06, 0.8), 40, 'shift');
    expect(r.threshold).toBeGreaterThanOrEqual(0.7);
  });

  it('reads the line at a price with an interval, and flags a price outside the tested bases', () => {
    const line = fitLine(observer(0.06, 0.8), 'read', 'r');
    const inside = thresholdAtPrice(line, 12.9);
    expect(inside.extrapolated).toBe(false);
    expect(inside.amountCi![0]).toBeLessThan(inside.amount);
    expect(inside.amountCi![1]).toBeGreaterThan(inside.amount);
    // the truth at 12.90 is 6 % of it
    expect(inside.amount).toBeGreaterThan(0.06 * 12.9 * 0.7);
    expect(inside.amount).toBeLessThan(0.06 * 12.9 * 1.4);
    expect(thresholdAtPrice(line, 500).extrapolated).toBe(true);
  });

  it('gives no test with fewer than 3 shoppers in a study', () => {
    expect(welch(0, [1, 2, 3, 4, 5, 6, 7, 8, 9, 10], 2, 0, [1, 2, 3, 4, 5, 6, 7, 8, 9, 10], 30)).toBeNull();
  });
});
