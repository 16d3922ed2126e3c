import { describe, expect, it } from 'vitest';
import { createRng } from '@/lib/psychometrics/random';
import {
  initialTrack, nextStaircaseTrial, reversalEstimate, staircaseState, stepTrack, type StaircaseConfig, type StaircaseRule,
} from '@/lib/psychometrics/staircase';

const ALPHA = Math.log(0.05), BETA = 4;
const pYes = (level: number) => 1 / (1 + Math.exp(-BETA * (level - ALPHA)));

function config(rule: StaircaseRule, extra: Partial<StaircaseConfig> = {}): StaircaseConfig {
  return {
    basePrices: [9.99], rule, startDiscount: 0.2, stepLog: 0.05, minDiscount: 0.001, maxDiscount: 0.6,
    maxReversals: 60, maxTrialsPerBase: 5000, ...extra,
  };
}

/** Mean over runs of the mean ln level at the last 40 reversals, mapped back to P(yes). */
function convergedProbability(c: StaircaseConfig, runs: number, seed: string): number {
  const rng = createRng(seed);
  let sum = 0;
  for (let r = 0; r < runs; r++) {
    let t = initialTrack(c, 9.99);
    while (!t.stopped) t = stepTrack(c, t, rng.next() < pYes(t.level) ? 1 : 0);
    sum += Math.log(reversalEstimate(t, 40)!);
  }
  return pYes(sum / runs);
}

describe('transformed up-down staircases (Levitt 1971, J. Acoust. Soc. Am. 49, 467–477)', () => {
  it('1-up-2-down converges on 70.7 %', () => {
    expect(Math.abs(convergedProbability(config('1u2d'), 150, 'levitt-2') - 0.707)).toBeLessThan(0.025);
  });
  it('1-up-3-down converges on 79.4 %', () => {
    expect(Math.abs(convergedProbability(config('1u3d'), 150, 'levitt-3') - 0.794)).toBeLessThan(0.025);
  });
  it('1-up-1-down converges on 50 %', () => {
    expect(Math.abs(convergedProbability(config('1u1d'), 150, 'levitt-1') - 0.5)).toBeLessThan(0.025);
  });
});

describe('weighted up-down (Kaernbach 1991, Perception & Psychophysics 49, 227–229)', () => {
  it('steps up : down = 3 : 1 converge on 75 %', () => {
    const c = config('1u1d', { stepUpLog: 0.09, stepDownLog: 0.03 });
    expect(Math.abs(convergedProbability(c, 150, 'kaernbach') - 0.75)).toBeLessThan(0.025);
  });
});

describe('nextStaircaseTrial', () => {
  const c = config('1u2d', { basePrices: [4.99, 49], maxReversals: 4, maxTrialsPerBase: 30, stepLog: 0.2 });

  it('starts at the start discount and moves down after two hits, up after a miss', () => {
    const first = nextStaircaseTrial(c, [], createRng(1))!;
    expect(first.discount).toBe(0.2);
    const h = [{ basePrice: 4.99, discount: 0.2, response: 1 as const }, { basePrice: 4.99, discount: 0.2, response: 1 as const }];
    const [t] = staircaseState(c, h);
    expect(Math.exp(t.level)).toBeCloseTo(0.2 * Math.exp(-0.2), 10);
    const [t2] = staircaseState(c, [...h, { basePrice: 4.99, discount: 0.1637, response: 0 }]);
    expect(Math.exp(t2.level)).toBeCloseTo(0.2, 10);
    expect(t2.reversals).toHaveLength(1);
  });

  it('interleaves both bases, snaps discounts to 0.01 %, stays in bounds and ends with null', () => {
    const rng = createRng('interleave');
    const history: { basePrice: number; discount: number; response: 0 | 1 }[] = [];
    const seen = new Set<number>();
    for (let i = 0; i < 200; i++) {
      const next = nextStaircaseTrial(c, history, rng);
      if (!next) break;
      seen.add(next.basePrice);
      expect(Math.round(next.discount * 10000)).toBeCloseTo(next.discount * 10000, 9);
      expect(next.discount).toBeGreaterThanOrEqual(c.minDiscount);
      expect(next.discount).toBeLessThanOrEqual(c.maxDiscount);
      history.push({ ...next, response: rng.next() < pYes(Math.log(next.discount)) ? 1 : 0 });
    }
    expect(seen).toEqual(new Set([4.99, 49]));
    expect(nextStaircaseTrial(c, history, rng)).toBeNull();
    for (const t of staircaseState(c, history)) expect(t.reversals.length >= 4 || t.trials >= 30).toBe(true);
  });

  it('is deterministic for a seed', () => {
    const run = () => { const rng = createRng(9); return [0, 1, 2].map(() => nextStaircaseTrial(c, [], rng)!.basePrice); };
    expect(run()).toEqual(run());
  });
});
