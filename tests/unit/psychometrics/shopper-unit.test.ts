import { describe, expect, it } from 'vitest';
import { analyse } from '@/lib/psychometrics/analyse';
import { fitAll, makeEngine } from '@/lib/psychometrics/engine';
import { fitBest, fitDesign } from '@/lib/psychometrics/fit-core';
import { observedSample, packStart, repairNested } from '@/lib/psychometrics/models';
import { prepare } from '@/lib/psychometrics/prepare';
import { createRng } from '@/lib/psychometrics/random';
import { compareGroups } from '@/lib/psychometrics/segments';
import { poolShopperCells } from '@/lib/psychometrics/shoppers';
import { geometricLadder, type Observer, simulateCells, simulateShopperCells } from '@/lib/psychometrics/simulate';

// Simulated shoppers (own simulation, no published source).
const BASES = [2.49, 12.9, 49];
const LADDER = geometricLadder(0.01, 0.3, 8);
const weber: Observer = { alpha: () => Math.log(0.06), beta: 3, lapse: 0.02, guess: 0.5 };

describe('the shopper is the unit (respondent-level bootstrap)', () => {
  const shopperCells = simulateShopperCells(weber, BASES, LADDER, { shoppers: 40, repetitions: 3, sigma: 1 }, createRng('unit-shoppers'));
  const byShopper = analyse({ shopperCells, task: 'pick', bootstrap: 200, seed: 2 });
  const pooled = analyse({ ...poolShopperCells(shopperCells), task: 'pick', bootstrap: 200, seed: 2 });

  it('says so: unit, shopper count, interval and test methods', () => {
    expect(byShopper.unit).toBe('shopper');
    expect(byShopper.shoppers).toBe(40);
    expect(byShopper.intervalMethod).toMatch(/respondent-level bootstrap \(whole shoppers resampled, 40 shoppers\), 200 samples/);
    expect(byShopper.tests.weberVsPower.method).toMatch(/respondent-level bootstrap SE, t reference with 39 df/);
    expect(byShopper.tests.constantVsPower!.df).toBe(1);
    expect(pooled.unit).toBe('trial');
    expect(pooled.intervalMethod).toMatch(/intervals assume independent trials/);
  });

  it('same point estimates as the pooled cells; wider intervals when shoppers differ (SD 1 in ln threshold)', () => {
    expect(byShopper.models.weber.weberFraction).toBeCloseTo(pooled.models.weber.weberFraction, 6);
    const w = (ci: [number, number] | null) => Math.log(ci![1] / ci![0]);
    expect(w(byShopper.models.weber.weberFractionCi)).toBeGreaterThan(1.2 * w(pooled.models.weber.weberFractionCi));
  });

  it('does not depend on the order the shoppers come in', () => {
    const shuffled = createRng('order').shuffle([...shopperCells]);
    const again = analyse({ shopperCells: shuffled, task: 'pick', bootstrap: 200, seed: 2 });
    expect(again.models.weber.weberFractionCi).toEqual(byShopper.models.weber.weberFractionCi);
  });

  it('draws a pointwise band per base from the same samples, counts failures', () => {
    for (const b of byShopper.bases) {
      expect(b.band!.length).toBeGreaterThan(10);
      expect(b.band![0].discount).toBeCloseTo(LADDER[0], 12);
      expect(b.band![b.band!.length - 1].discount).toBeCloseTo(LADDER[LADDER.length - 1], 12);
      for (const p of b.band!) expect(p.lo).toBeLessThanOrEqual(p.hi);
    }
    expect(byShopper.bootstrapFailures).toEqual({ nonFinite: expect.any(Number), notConverged: expect.any(Number) });
    expect(byShopper.bases[0].band![0].lo).toBeLessThan(byShopper.bases[0].band![byShopper.bases[0].band!.length - 1].hi);
  });

  it('segments compare shoppers: a permutation test over whole shoppers', () => {
    const rng = createRng('segments-shoppers');
    const a = simulateShopperCells(weber, BASES, LADDER, { shoppers: 20, repetitions: 3, sigma: 0.5, idPrefix: 'a' }, rng);
    const b = simulateShopperCells(weber, BASES, LADDER, { shoppers: 20, repetitions: 3, sigma: 0.5, idPrefix: 'b' }, rng);
    const r = compareGroups([{ label: 'a', shopperCells: a }, { label: 'b', shopperCells: b }], { task: 'pick', bootstrap: 0, permutations: 60 });
    expect(r.test.method).toMatch(/permutation test over shoppers \(60 random reassignments/);
    expect(r.test.p!).toBeGreaterThan(0.05);
    expect(r.groups[0].shoppers).toBe(20);
  });
});

describe('an optimiser that finds the optimum and says when it did not', () => {
  const data = simulateCells(weber, BASES, LADDER, 8, createRng('optimiser'));
  const prep = prepare(data.cells, [], 'pick');
  const e = makeEngine(prep);
  const { N, K } = observedSample(prep);
  const point = fitAll(e, N, K, null);

  it('several starts keep the best; a start on the slope bound alone ends lower or equal', () => {
    const d = e.baseDesigns[0], k = e.baseK[0];
    const bad = packStart(d, [Math.log(0.3)], Math.log(100), 0.05);
    const fromBad = fitDesign(d, k, bad);
    const best = fitBest(d, k, [bad, packStart(d, [Math.log(0.06)], Math.log(3), 0.01)]);
    expect(best.logLik).toBeGreaterThanOrEqual(fromBad.logLik);
    expect(best.logLik).toBeCloseTo(point.bases[0].logLik, 6);
  });

  it('a fit stopped before the optimum is not reported as converged', () => {
    const d = e.joint.free;
    const far = packStart(d, [-1, -1, -1], Math.log(0.2), 0.05);
    expect(fitDesign(d, e.jointK, far, { maxIterations: 1 }).converged).toBe(false);
    expect(point.joint.fits.free.converged).toBe(true);
  });

  it('a larger model that fits worse than a nested one is refitted from it', () => {
    const fits = { ...point.joint.fits };
    const d = e.joint.power;
    fits.power = fitDesign(d, e.jointK, packStart(d, [Math.log(0.3), 3.5], Math.log(0.1), 0.05), { maxIterations: 1 });
    expect(fits.power.logLik).toBeLessThan(fits.weber.logLik);
    const repaired = repairNested(prep, e.joint, fits, e.jointK, e.centre);
    expect(repaired).toContain('power from weber');
    expect(fits.power.logLik).toBeGreaterThanOrEqual(fits.weber.logLik - 1e-9);
  });
});
