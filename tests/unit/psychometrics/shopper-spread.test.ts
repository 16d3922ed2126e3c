// How much shoppers differ (shopper-spread.ts over mixed.ts; the mixed psychometric model of
// Moscatelli, Mezzetti & Lacquaniti 2012). Simulated shoppers are own simulation, no
// published source: true σ 0.5 and 0 in ln threshold, seeded.
import { describe, expect, it } from 'vitest';
import { analyse } from '@/lib/psychometrics/analyse';
import { prepare } from '@/lib/psychometrics/prepare';
import { createRng } from '@/lib/psychometrics/random';
import { middleHalfSentence, reportShopperSpread, shareCritical } from '@/lib/psychometrics/shopper-spread';
import { poolShopperCells, shopperCounts } from '@/lib/psychometrics/shoppers';
import { geometricLadder } from '@/lib/psychometrics/simulate';
import { simulateShoppers } from '@/lib/psychometrics/simulate-shoppers';
import type { ShopperCell } from '@/lib/psychometrics/types';

const LADDER = geometricLadder(0.01, 0.25, 8);
const BASES = [2.49, 12.9, 49];
const observer = { alpha: () => Math.log(0.08), beta: 4, lapse: 0.02, guess: 0.5 };

function study(sigma: number, seed: string, shoppers = 40): ShopperCell[] {
  return simulateShoppers(observer, sigma, { basePrices: BASES, rungs: LADDER, repetitions: 3, shoppers }, createRng(seed));
}

describe('shopper spread: shoppers who differ (true σ = 0.5, 40 shoppers × 72 pick trials)', () => {
  const rows = study(0.5, 'spread-0.5');
  const report = analyse({ ...poolShopperCells(rows), task: 'pick', bootstrap: 0, shopperCells: rows });
  const sp = report.shopperSpread!;

  it('reports σ near 0.5 with a profile interval that covers it, for the preferred model', () => {
    expect(sp.model).toBe(report.preferredModel);
    expect(sp.shoppers).toBe(40);
    expect(sp.sigma).toBeGreaterThan(0.3);
    expect(sp.sigma).toBeLessThan(0.7);
    expect(sp.sigmaCi![0]).toBeLessThan(0.5);
    expect(sp.sigmaCi![1]).toBeGreaterThan(0.5);
    expect(sp.sigmaCi![0]).toBeLessThan(sp.sigma);
    expect(sp.sigmaMethod).toMatch(/profile likelihood/);
    expect(sp.sigmaMethod).toMatch(/adaptive Gauss–Hermite/);
    expect(sp.converged).toBe(true);
    // the pooled fit (σ = 0) is far worse: shoppers plainly differ
    expect(sp.sigmaTest!.p).toBeLessThan(1e-6);
  });

  it('fits the free model too, with a σ close to the preferred model’s', () => {
    const free = sp.fits!.find((f) => f.model === 'free')!;
    expect(free).toBeDefined();
    expect(Math.abs(free.sigma - sp.sigma)).toBeLessThan(0.1);
    expect(free.logLik).toBeGreaterThanOrEqual(sp.logLik - 1e-6);
  });

  it('reads out per base: typical threshold, middle half and the 50/75/90 % shares in order, with intervals', () => {
    for (const b of sp.bases) {
      const [s50, s75, s90] = b.shares;
      expect(b.shares.map((s) => s.share)).toEqual([0.5, 0.75, 0.9]);
      expect(b.typicalFraction).toBe(s50.fraction);
      expect(b.typicalCi![0]).toBeLessThan(0.08);
      expect(b.typicalCi![1]).toBeGreaterThan(0.08);
      expect(s50.fraction!).toBeLessThan(s75.fraction!);
      expect(s75.fraction!).toBeLessThan(s90.fraction!);
      // the discount a share q notices is typical · exp(σ Φ⁻¹(q))
      expect(s90.fraction! / s50.fraction!).toBeCloseTo(Math.exp(sp.sigma * 1.2815515655446004), 8);
      expect(b.middleHalf![0]).toBeCloseTo(s50.fraction! * Math.exp(-sp.sigma * 0.6744897501960817), 8);
      expect(b.middleHalf![1]).toBe(s75.fraction);
      for (const s of b.shares) {
        expect(s.bound).toBeNull();
        expect(s.fractionCi![0]).toBeLessThan(s.fraction!);
        expect(s.fractionCi![1]).toBeGreaterThan(s.fraction!);
      }
    }
  });

  it('draws the population curve flatter than the typical shopper’s on a 40-point grid over the rungs', () => {
    const { curve } = sp.bases[0];
    expect(curve).toHaveLength(40);
    expect(curve[0].discount).toBeCloseTo(LADDER[0], 12);
    expect(curve[39].discount).toBeCloseTo(LADDER[7], 12);
    const t = sp.bases[0].typicalFraction!;
    const below = curve.filter((p) => p.discount < t * 0.7), above = curve.filter((p) => p.discount > t * 1.4);
    expect(below.length).toBeGreaterThan(3);
    expect(above.length).toBeGreaterThan(3);
    // below the typical threshold some shoppers already notice, above it some still do not
    for (const p of below) if (p.typical > 0.505) expect(p.population).toBeGreaterThan(p.typical);
    for (const p of above) expect(p.population).toBeLessThan(p.typical);
    for (let i = 1; i < curve.length; i++) expect(curve[i].population).toBeGreaterThanOrEqual(curve[i - 1].population);
  });

  it('says the middle half in a sentence', () => {
    const b = sp.bases[1];
    const lo = (b.middleHalf![0] * 100).toFixed(1), hi = (b.middleHalf![1] * 100).toFixed(1);
    expect(middleHalfSentence(b, '€12.90')).toBe(`half of shoppers notice between ${lo} % and ${hi} % at €12.90`);
  });
});

describe('shopper spread: shoppers who do not differ (true σ = 0)', () => {
  it('gives σ near 0 and an interval from 0, and the pooled fit is not rejected', () => {
    const rows = study(0, 'spread-0');
    const report = analyse({ ...poolShopperCells(rows), task: 'pick', bootstrap: 0, shopperCells: rows });
    const sp = report.shopperSpread!;
    expect(sp.sigma).toBeLessThan(0.2);
    expect(sp.sigmaCi![0]).toBe(0);
    expect(sp.sigmaCi![1]).toBeLessThan(0.35);
    expect(sp.sigmaTest!.p).toBeGreaterThan(0.05);
    // with no spread the two curves coincide
    for (const p of sp.bases[0].curve) expect(Math.abs(p.population - p.typical)).toBeLessThan(0.05);
  });
});

describe('shopper spread: honest edges', () => {
  it('a base where nobody noticed any rung gives bounds, not numbers, under the free model', () => {
    const rows = simulateShoppers({ ...observer, guess: 0 }, 0.3, { basePrices: [2.49, 12.9], rungs: LADDER, repetitions: 3, shoppers: 30 }, createRng('edge'))
      .map((r) => (r.basePrice === 2.49 ? { ...r, k: 0 } : r));
    const { cells } = poolShopperCells(rows);
    const prep = prepare(cells, [], 'trip');
    const sp = reportShopperSpread(prep, shopperCounts(prep, rows), 'free')!;
    const edge = sp.bases.find((b) => b.basePrice === 2.49)!;
    expect(edge.typicalFraction).toBeNull();
    expect(edge.middleHalf).toBeNull();
    for (const s of edge.shares) {
      expect(s.fraction).toBeNull();
      expect(s.fractionCi).toBeNull();
      expect(s.bound).toEqual({ kind: 'above', fraction: LADDER[7] });
    }
    expect(middleHalfSentence(edge, '€2.49')).toMatch(/^at €2\.49 at least three quarters of shoppers notice no tested discount \(thresholds above the deepest rung, > 25\.0 %\)$/);
    const other = sp.bases.find((b) => b.basePrice === 12.9)!;
    expect(other.typicalFraction).not.toBeNull();
  });

  it('is null in the report when trials carry no shopper ids', () => {
    const rows = study(0.5, 'spread-none', 10);
    const report = analyse({ ...poolShopperCells(rows), task: 'pick', bootstrap: 0 });
    expect(report.shopperSpread).toBeNull();
  });
});

describe('shopper spread: the share intervals’ small-sample critical value', () => {
  it('is √(S/(S − 1))·t₀.₉₇₅(S − 1): wider than 1.96 with few shoppers, 1.96 in the limit, none below two', () => {
    // t₀.₉₇₅ with 39 and 9 degrees of freedom: 2.0227 and 2.2622 (standard tables, values from memory)
    expect(shareCritical(40)).toBeCloseTo(Math.sqrt(40 / 39) * 2.0227, 3);
    expect(shareCritical(10)).toBeCloseTo(Math.sqrt(10 / 9) * 2.2622, 3);
    expect(shareCritical(100000)).toBeCloseTo(1.96, 2);
    expect(shareCritical(1)).toBeNaN();
  });

  it('is named in the method, and the share intervals are symmetric on the ln scale', () => {
    const rows = study(0.5, 'spread-crit', 12);
    const sp = analyse({ ...poolShopperCells(rows), task: 'pick', bootstrap: 0, shopperCells: rows }).shopperSpread!;
    expect(sp.sigmaMethod).toMatch(/√\(S\/\(S − 1\)\)·t\(S − 1\)/);
    for (const b of sp.bases) {
      const s = b.shares[0];
      if (!s.fraction || !s.fractionCi) continue;
      expect(Math.log(s.fractionCi[1] / s.fraction)).toBeCloseTo(Math.log(s.fraction / s.fractionCi[0]), 9);
    }
  });
});
