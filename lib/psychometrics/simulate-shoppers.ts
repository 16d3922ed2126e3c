// Simulated shoppers who differ: each draws an own ln-threshold shift u ~ Normal(0, σ²) and
// answers every cell `repetitions` times (and its catch trials) like the Observer of
// simulate.ts shifted by u. The planner, the mixed model's checks and the benchmarks use it;
// simulated truths are own simulation, no published source. Seeded through the Rng. Pure.
import type { Rng } from './random';
import type { Observer } from './simulate';
import type { ShopperCell } from './types';

export interface ShopperDesign {
  basePrices: number[];
  rungs: number[];
  /** Trials per base × rung for each shopper. */
  repetitions: number;
  shoppers: number;
  /** Catch trials (no discount) per base for each shopper. */
  catchPerBase?: number;
}

/** One row per shopper × base × rung (and × base for catch trials); ids `s1`, `s2`, …. */
export function simulateShoppers(o: Observer, sigma: number, design: ShopperDesign, rng: Rng, idPrefix = 's'): ShopperCell[] {
  const rows: ShopperCell[] = [];
  const alphas = design.basePrices.map((b) => o.alpha(b));
  const catchN = design.catchPerBase ?? 0;
  for (let s = 0; s < design.shoppers; s++) {
    const respondent = `${idPrefix}${s + 1}`;
    const u = sigma > 0 ? sigma * rng.normal() : 0;
    design.basePrices.forEach((basePrice, j) => {
      for (const discount of design.rungs) {
        const f = 1 / (1 + Math.exp(-o.beta * (Math.log(discount) - alphas[j] - u)));
        const p = o.guess + (1 - o.guess - o.lapse) * f;
        rows.push({ respondent, basePrice, discount, n: design.repetitions, k: rng.binomial(design.repetitions, p) });
      }
      if (catchN > 0) rows.push({ respondent, basePrice, discount: 0, n: catchN, k: rng.binomial(catchN, o.guess) });
    });
  }
  return rows;
}
