import type { Rng } from './random';
import type { Cell, CatchCell, ShopperCell } from './types';

/** A simulated observer for planning, checks and benchmarks. */
export interface Observer {
  /** ln of the mid-point threshold fraction at a base price. */
  alpha: (basePrice: number) => number;
  beta: number;
  lapse: number;
  guess: number;
}

export function noticeProbability(o: Observer, basePrice: number, discount: number): number {
  const f = 1 / (1 + Math.exp(-o.beta * (Math.log(discount) - o.alpha(basePrice))));
  return o.guess + (1 - o.guess - o.lapse) * f;
}

/** Binomial counts for every base × rung cell (and catch cells answered at the guess rate). */
export function simulateCells(
  o: Observer, basePrices: number[], rungs: number[], trialsPerCell: number, rng: Rng, catchPerBase = 0,
): { cells: Cell[]; catchCells: CatchCell[] } {
  const cells: Cell[] = [];
  const catchCells: CatchCell[] = [];
  for (const basePrice of basePrices) {
    for (const discount of rungs) {
      cells.push({ basePrice, discount, n: trialsPerCell, k: rng.binomial(trialsPerCell, noticeProbability(o, basePrice, discount)) });
    }
    if (catchPerBase > 0) catchCells.push({ basePrice, n: catchPerBase, k: rng.binomial(catchPerBase, o.guess) });
  }
  return { cells, catchCells };
}

/** Geometric ladder of n rungs from lo to hi (as the study builder generates them). */
export function geometricLadder(lo: number, hi: number, n: number): number[] {
  if (n === 1) return [lo];
  return Array.from({ length: n }, (_, i) => lo * Math.pow(hi / lo, i / (n - 1)));
}

/**
 * Shoppers who differ: each shopper's ln threshold is the observer's α(B) plus a draw from
 * Normal(0, sigma), the same shift at every base price (one shopper is more or less attentive
 * throughout). Each shopper answers `repetitions` trials per base × rung cell and
 * `catchPerBase` catch trials per base (answered at the guess rate). Own simulation, for the
 * calibration checks and benchmarks.
 */
export function simulateShopperCells(
  o: Observer, basePrices: number[], rungs: number[],
  opts: { shoppers: number; repetitions: number; sigma: number; catchPerBase?: number; idPrefix?: string },
  rng: Rng,
): ShopperCell[] {
  const out: ShopperCell[] = [];
  for (let s = 0; s < opts.shoppers; s++) {
    const respondent = `${opts.idPrefix ?? 's'}${s}`;
    const u = opts.sigma * rng.normal();
    for (const basePrice of basePrices) {
      const a = o.alpha(basePrice) + u;
      for (const discount of rungs) {
        const f = 1 / (1 + Math.exp(-o.beta * (Math.log(discount) - a)));
        const p = o.guess + (1 - o.guess - o.lapse) * f;
        out.push({ respondent, basePrice, discount, n: opts.repetitions, k: rng.binomial(opts.repetitions, p) });
      }
      const c = opts.catchPerBase ?? 0;
      if (c > 0) out.push({ respondent, basePrice, discount: 0, n: c, k: rng.binomial(c, o.guess) });
    }
  }
  return out;
}
