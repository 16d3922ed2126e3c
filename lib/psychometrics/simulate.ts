import type { Rng } from './random';
import type { Cell, CatchCell } from './types';

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
